import { randomUUID } from 'node:crypto';
import { type NextFunction, type Request, type Response } from 'express';

const SAFE_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** Gives every request an id (the caller's X-Request-Id when it is safe, else a new UUID) and echoes it. */
export function requestIdMiddleware(req: Request, res: Response, next: NextFunction): void {
  const incoming = req.header('x-request-id');
  const id = incoming && SAFE_ID.test(incoming) ? incoming : randomUUID();
  (req as Request & { requestId: string }).requestId = id;
  res.setHeader('X-Request-Id', id);
  next();
}

export function requestIdOf(req: unknown): string {
  const id = (req as { requestId?: unknown }).requestId;
  return typeof id === 'string' ? id : 'unknown';
}
