import { Body, Controller, Get, HttpCode, Post, Req, UseGuards } from '@nestjs/common';
import { type AuthResponse, type UserView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Public } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { AuthService } from './auth.service';
import { LoginDto } from './dto/login.dto';
import { RegisterDto } from './dto/register.dto';
import { LoginThrottlerGuard } from './login-throttler.guard';

@Controller('auth')
export class AuthController {
  constructor(private readonly auth: AuthService) {}

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('register')
  register(@Body() dto: RegisterDto, @Req() req: unknown): Promise<AuthResponse> {
    return this.auth.register(dto, requestIdOf(req));
  }

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('login')
  @HttpCode(200)
  login(@Body() dto: LoginDto): Promise<AuthResponse> {
    return this.auth.login(dto);
  }

  @Get('me')
  me(@CurrentUser() user: AuthUser): Promise<UserView> {
    return this.auth.me(user.id);
  }
}
