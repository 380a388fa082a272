import { type CanActivate, type ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { type Role } from '@kerfwright/contracts';
import { type AuthUser, IS_PUBLIC, ROLES_KEY } from '../decorators/auth.decorators';
import { AppError } from '../errors';

/** Global guard after authentication: the user's role must be listed by @Roles (supervisors pass). */
@Injectable()
export class RolesGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, targets);
    const user = context.switchToHttp().getRequest<{ user?: AuthUser }>().user;
    if (!user) throw new AppError(401, 'AUTH.UNAUTHENTICATED', 'Sign in first');
    if (!roles || roles.length === 0 || user.role === 'supervisor' || roles.includes(user.role)) return true;
    throw new AppError(403, 'AUTH.FORBIDDEN', `This action needs the role ${roles.join(' or ')}`);
  }
}
