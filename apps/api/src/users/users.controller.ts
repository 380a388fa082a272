import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Query, Req } from '@nestjs/common';
import { type Page, type UserView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ListUsersQuery } from './dto/list-users.query';
import { UpdateUserDto } from './dto/update-user.dto';
import { UsersService } from './users.service';

@Controller('users')
@Roles('supervisor')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  list(@Query() query: ListUsersQuery): Promise<Page<UserView>> {
    return this.users.list(query);
  }

  @Patch(':id')
  update(
    @CurrentUser() actor: AuthUser,
    @Param('id', new ParseUUIDPipe()) id: string,
    @Body() dto: UpdateUserDto,
    @Req() req: unknown,
  ): Promise<UserView> {
    return this.users.update(actor.id, id, dto, requestIdOf(req));
  }
}
