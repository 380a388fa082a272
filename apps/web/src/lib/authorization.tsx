import { type Role } from '@kerfwright/contracts';
import { type ReactNode } from 'react';
import { ForbiddenPanel } from '../components/errors/forbidden-panel';
import { useUser } from './auth';

/** A supervisor may do everything; anyone else needs one of the listed roles. */
export function canAccess(role: Role, allowed: readonly Role[]): boolean {
  return role === 'supervisor' || allowed.includes(role);
}

/** Renders its children only for the allowed roles. The API checks the same on every request. */
export function RequireRole({ allowed, children }: { allowed: readonly Role[]; children: ReactNode }) {
  const user = useUser();
  if (!canAccess(user.role, allowed)) return <ForbiddenPanel />;
  return <>{children}</>;
}
