import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import nodemailer, { type Transporter } from 'nodemailer';
import { DataSource } from 'typeorm';
import { mailConfig } from './mail.config';

interface DueMail {
  id: string;
  recipients: string[];
  subject: string;
  text_body: string;
  html_body: string;
  attempts: number;
}

/** Seconds to wait before attempt n+1: 5, 20, 45 … capped at 15 minutes. */
export function retryDelaySeconds(attempts: number): number {
  return Math.min(5 * attempts * attempts, 900);
}

/**
 * Sends queued mail through SMTP. Claims due rows with SKIP LOCKED so several API or worker processes can
 * run it side by side; a failed send is retried with growing delays and never affects the state change.
 */
@Injectable()
export class MailDispatcherService implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('Mail');
  private readonly transport: Transporter;
  private timer: NodeJS.Timeout | null = null;
  private chain: Promise<number> = Promise.resolve(0);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(mailConfig.KEY) private readonly config: ConfigType<typeof mailConfig>,
  ) {
    // A pooled transport keeps its SMTP connection open between messages: one message per recipient means a
    // busy hour sends hundreds, and a fresh connection (greeting, EHLO, QUIT) for each costs more than the mail.
    this.transport = nodemailer.createTransport({
      pool: true,
      maxConnections: 1,
      maxMessages: 200,
      host: config.host,
      port: config.port,
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 3000,
      greetingTimeout: 3000,
      socketTimeout: 5000,
    });
  }

  onApplicationBootstrap(): void {
    this.timer = setInterval(() => void this.dispatchDue(), this.config.pollMs);
    this.timer.unref();
  }

  async onApplicationShutdown(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    await this.chain;
    this.transport.close();
  }

  /**
   * Sends every message due now; returns how many were sent. Calls queue behind each other, so a call
   * always makes a full pass that starts after it was made (mail queued before the call is considered).
   */
  dispatchDue(): Promise<number> {
    const pass = this.chain.then(() => this.dispatch());
    this.chain = pass.catch(() => 0);
    return pass;
  }

  private async dispatch(): Promise<number> {
    let sent = 0;
    try {
      for (;;) {
        const done = await this.dataSource.transaction(async (m) => {
          const rows: DueMail[] = await m.query(
            `SELECT id, recipients, subject, text_body, html_body, attempts FROM mail_outbox
             WHERE status = 'pending' AND next_attempt_at <= now()
             ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
          );
          const mail = rows[0];
          if (!mail) return null;
          try {
            await this.transport.sendMail({
              from: this.config.from,
              to: mail.recipients,
              subject: mail.subject,
              text: mail.text_body,
              html: mail.html_body,
            });
            await m.query(
              `UPDATE mail_outbox SET status = 'sent', sent_at = now(), attempts = attempts + 1 WHERE id = $1`,
              [mail.id],
            );
            return true;
          } catch (err) {
            const attempts = mail.attempts + 1;
            const failed = attempts >= this.config.maxAttempts;
            await m.query(
              `UPDATE mail_outbox SET attempts = $2, last_error = $3, status = $4,
                 next_attempt_at = now() + make_interval(secs => $5) WHERE id = $1`,
              [
                mail.id,
                attempts,
                String((err as Error).message).slice(0, 500),
                failed ? 'failed' : 'pending',
                retryDelaySeconds(attempts),
              ],
            );
            this.logger.warn(`mail ${mail.id} not sent (attempt ${attempts}): ${(err as Error).message}`);
            return false;
          }
        });
        if (done === null || done === false) break;
        sent++;
      }
    } catch (err) {
      this.logger.warn(`mail dispatch paused: ${(err as Error).message}`);
    }
    return sent;
  }
}
