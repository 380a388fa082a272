import { Injectable } from '@nestjs/common';
import { ThrottlerGuard } from '@nestjs/throttler';

/**
 * Counts sign-in attempts per client address and e-mail, so one noisy user cannot lock out others (the
 * "login" throttler); the "login-address" throttler (auth.module) also caps one address over all e-mails.
 */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const body = (req.body ?? {}) as { email?: unknown };
    const email = typeof body.email === 'string' ? body.email.trim().toLowerCase() : '';
    const ip = typeof req.ip === 'string' ? req.ip : 'unknown';
    return `${ip}|${email}`;
  }
}
