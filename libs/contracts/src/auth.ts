import type { Role } from './roles';

/** Password rules shared by the register form and the API. */
export const PASSWORD_MIN_LENGTH = 10;
/** Whether a password is long enough counting only what lies between its first and last non-space. */
export function passwordLongEnough(password: string): boolean {
  return password.trim().length >= PASSWORD_MIN_LENGTH;
}
export const PASSWORD_MAX_LENGTH = 128;
export const DISPLAY_NAME_MAX_LENGTH = 80;

export interface RegisterRequest {
  email: string;
  displayName: string;
  password: string;
}

export interface LoginRequest {
  email: string;
  password: string;
}

export interface UserView {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  active: boolean;
  createdAt: string;
}

export interface AuthResponse {
  accessToken: string;
  user: UserView;
}

/** Body of PATCH /api/users/:id (supervisor only). */
export interface UpdateUserRequest {
  role?: Role;
  active?: boolean;
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface HealthView {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
  redis: 'up' | 'down';
  version: string;
}

/** One row of the audit trail (GET /api/audit, supervisors). */
export interface AuditEventView {
  id: string;
  actorId: string | null;
  actorName: string | null;
  action: string;
  entityType: string;
  entityId: string;
  before: unknown;
  after: unknown;
  requestId: string | null;
  createdAt: string;
}
