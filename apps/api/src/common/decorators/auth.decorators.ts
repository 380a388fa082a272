import { createParamDecorator, type ExecutionContext, SetMetadata } from '@nestjs/common';
import { type Role } from '@kerfwright/contracts';

export const IS_PUBLIC = 'kw:public';
export const ROLES_KEY = 'kw:roles';

/** The route answers without a signed-in user. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** Roles allowed on a route (a supervisor is always allowed). Without it any signed-in role may call. */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES_KEY, roles);

/** The signed-in user as JwtAuthGuard loaded it for this request. */
export interface AuthUser {
  id: string;
  email: string;
  role: Role;
  displayName: string;
  /** The bearer token's id and expiry (seconds since the epoch), for signing it out; absent on older tokens. */
  token?: { jti: string; exp: number };
}

export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): AuthUser => {
  return ctx.switchToHttp().getRequest<{ user: AuthUser }>().user;
});
