import { Injectable } from '@nestjs/common';
import { type EntityManager } from 'typeorm';
import { type Role } from '@kerfwright/contracts';

export interface OutgoingMail {
  kind: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/**
 * Queues mail in the same transaction as the state change that causes it (a transactional outbox):
 * the change never waits for the mail server, and a rolled-back change sends nothing. Each recipient gets a
 * message of their own, so nobody learns the others' addresses (a member's request mail goes to every
 * operator, and a job's mail to its requester and the operators).
 */
@Injectable()
export class MailOutboxService {
  async enqueue(manager: EntityManager, mail: OutgoingMail): Promise<void> {
    const to = [...new Set(mail.to.map((a) => a.trim()).filter(Boolean))];
    if (to.length === 0) return;
    await manager.query(
      `INSERT INTO mail_outbox (recipients, subject, text_body, html_body, kind)
       SELECT jsonb_build_array(address), $2, $3, $4, $5 FROM unnest($1::text[]) WITH ORDINALITY AS t(address, n)
       ORDER BY n`,
      [to, mail.subject.slice(0, 200), mail.text, mail.html, mail.kind],
    );
  }

  /** E-mail addresses of the active users holding any of the roles, but for the users `except` names. */
  async addressesOfRoles(manager: EntityManager, roles: Role[], except: string[] = []): Promise<string[]> {
    const rows: { email: string }[] = await manager.query(
      `SELECT email FROM users WHERE active AND role = ANY($1::user_role[]) AND NOT (id = ANY($2::uuid[]))
        ORDER BY email`,
      [roles, except],
    );
    return rows.map((r) => r.email);
  }

  async addressOfUser(manager: EntityManager, userId: string): Promise<string[]> {
    const rows: { email: string }[] = await manager.query(
      `SELECT email FROM users WHERE id = $1 AND active`,
      [userId],
    );
    return rows.map((r) => r.email);
  }
}
