import { Body, Controller, Get, Param, Patch, Query, Req } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import { type Page, type UserView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { ListUsersQuery } from './dto/list-users.query';
import { UpdateUserDto } from './dto/update-user.dto';
import { UserPageResponse, UserResponse } from './dto/user.response';
import { UsersService } from './users.service';

/** Users and their roles; supervisors only (every change is audited). */
@ApiTags('users')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: supervisors only' })
@Controller('users')
@Roles('supervisor')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @ApiOperation({ summary: 'List users: page, pageSize, sort, role, active, q' })
  @ApiOkResponse({ type: UserPageResponse })
  list(@Query() query: ListUsersQuery): Promise<Page<UserView>> {
    return this.users.list(query);
  }

  @Patch(':id')
  @ApiOperation({ summary: 'Change a user’s role or deactivate them (not yourself)' })
  @ApiOkResponse({ type: UserResponse })
  @ApiConflictResponse({ description: 'A change that would leave the caller without their own access' })
  update(
    @CurrentUser() actor: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Body() dto: UpdateUserDto,
    @Req() req: unknown,
  ): Promise<UserView> {
    return this.users.update(actor.id, id, dto, requestIdOf(req));
  }
}
