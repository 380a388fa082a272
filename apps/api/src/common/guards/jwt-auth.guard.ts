import { type CanActivate, type ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthService } from '../../auth/auth.service';
import { type AuthUser, IS_PUBLIC } from '../decorators/auth.decorators';
import { AppError } from '../errors';

/**
 * Global guard: every route needs a valid bearer token unless marked @Public(). The user behind the token is
 * read on every request (AuthService.userForAuthorization), so a deactivation or a role change applies at once.
 * A database failure while reading it propagates (503 from the exception filter), it is not a 401.
 */
@Injectable()
export class JwtAuthGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    private readonly auth: AuthService,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (isPublic) return true;
    const req = context.switchToHttp().getRequest<{ headers: Record<string, unknown>; user?: AuthUser }>();
    const user = await this.auth.userForAuthorization(req.headers.authorization);
    if (!user)
      throw new AppError(
        401,
        'AUTH.UNAUTHENTICATED',
        'Sign in first: the token is missing, expired or invalid',
      );
    req.user = user;
    return true;
  }
}
