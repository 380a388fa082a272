import { type ExecutionContext, Injectable } from '@nestjs/common';
import { ThrottlerGuard, type ThrottlerLimitDetail } from '@nestjs/throttler';
import { type Response } from 'express';

/**
 * Counts sign-in attempts per client address and e-mail, so one noisy user cannot lock out others (the
 * "login" throttler); the "login-address" throttler (auth.module) also caps one address over all e-mails.
 * The client address is the connection's unless KW_TRUST_PROXY names the reverse proxies in front.
 */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const body = (req.body ?? {}) as { email?: unknown };
    const email = typeof body.email === 'string' ? body.email.trim().toLowerCase() : '';
    const ip = typeof req.ip === 'string' ? req.ip : 'unknown';
    return `${ip}|${email}`;
  }

  /**
   * The 429 says when to try again in the standard header (RFC 9110 §10.2.3: Retry-After, delay in seconds)
   * instead of the throttler's own `Retry-After-<name>` (its headers are switched off in auth.module).
   */
  protected override async throwThrottlingException(
    context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    const res = context.switchToHttp().getResponse<Response>();
    res.setHeader('Retry-After', String(Math.max(1, Math.ceil(detail.timeToBlockExpire))));
    return super.throwThrottlingException(context, detail);
  }
}
