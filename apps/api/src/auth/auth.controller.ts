import { Body, Controller, Get, HttpCode, Post, Req, UseGuards } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import { type AuthResponse, type UserView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Public } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { UserResponse } from '../users/dto/user.response';
import { AuthService } from './auth.service';
import { AuthTokenResponse } from './dto/auth.response';
import { LoginDto } from './dto/login.dto';
import { RegisterDto } from './dto/register.dto';
import { LoginThrottlerGuard } from './login-throttler.guard';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(private readonly auth: AuthService) {}

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('register')
  @ApiCreatedResponse({ type: AuthTokenResponse, description: 'The new hobbyist account, signed in' })
  register(@Body() dto: RegisterDto, @Req() req: unknown): Promise<AuthResponse> {
    return this.auth.register(dto, requestIdOf(req));
  }

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('login')
  @HttpCode(200)
  @ApiOkResponse({ type: AuthTokenResponse, description: 'A bearer token and the signed-in user' })
  login(@Body() dto: LoginDto): Promise<AuthResponse> {
    return this.auth.login(dto);
  }

  @Post('sign-out')
  @HttpCode(204)
  @ApiBearerAuth()
  @ApiNoContentResponse({
    description:
      'The bearer token is ended: refused from now on (the account’s other sessions stay signed in)',
  })
  signOut(@CurrentUser() user: AuthUser, @Req() req: unknown): Promise<void> {
    return this.auth.signOut(user, requestIdOf(req));
  }

  @Get('me')
  @ApiBearerAuth()
  @ApiOkResponse({ type: UserResponse, description: 'The signed-in user' })
  me(@CurrentUser() user: AuthUser): Promise<UserView> {
    return this.auth.me(user.id);
  }
}
