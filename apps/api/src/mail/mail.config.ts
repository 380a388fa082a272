import { registerAs } from '@nestjs/config';

export const mailConfig = registerAs('mail', () => ({
  host: process.env.KW_SMTP_HOST ?? '127.0.0.1',
  port: Number(process.env.KW_SMTP_PORT ?? 2525),
  from: process.env.KW_MAIL_FROM ?? 'Kerfwright <kerfwright@localhost>',
  /** How often the dispatcher looks for due mail, ms. */
  pollMs: Number(process.env.KW_MAIL_POLL_MS ?? 2000),
  maxAttempts: Number(process.env.KW_MAIL_MAX_ATTEMPTS ?? 12),
  /** The public address of the app, for links in mails. */
  appUrl: process.env.KW_APP_URL ?? `http://127.0.0.1:${process.env.KW_PORT ?? 3000}`,
}));
