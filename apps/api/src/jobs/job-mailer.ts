import { Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { type EntityManager } from 'typeorm';
import { type JobAction, type JobState, type Role } from '@kerfwright/contracts';
import { mailConfig } from '../mail/mail.config';
import { MailOutboxService } from '../mail/mail-outbox.service';
import { appLink, composeMail } from '../mail/mail-templates';
import { Design } from '../designs/design.entity';
import { type Job, JobTransition } from './job.entity';

/** Who hears about a job's state change, and what they are told. */
@Injectable()
export class JobMailer {
  constructor(
    private readonly outbox: MailOutboxService,
    @Inject(mailConfig.KEY) private readonly config: ConfigType<typeof mailConfig>,
  ) {}

  async onTransition(
    m: EntityManager,
    job: Job,
    action: JobAction,
    from?: JobState,
    /** Who took the action (null: the export queue): not asked to do what the rules forbid them next. */
    actorId: string | null = null,
  ): Promise<void> {
    const design = await m.findOne(Design, { where: { id: job.designId } });
    const title = design?.name ?? 'a design';
    const link = { label: 'Open the job', url: appLink(this.config.appUrl, `jobs/${job.id}`) };
    // Nobody is mailed about what they just did themselves (a fabricator requesting a job of their own, a
    // supervisor approving theirs): the actor is left out of every list, but for a release, which the cut-pack
    // queue finishes after the request has been answered.
    const skipped = action === 'release' ? null : actorId;
    const requester = () =>
      job.requesterId === skipped ? Promise.resolve([]) : this.outbox.addressOfUser(m, job.requesterId);
    const ofRoles = (roles: Role[]) => this.outbox.addressesOfRoles(m, roles, skipped ? [skipped] : []);
    /** Queues one mail with the job's link, or another (the outbox skips an empty list of recipients). */
    const send = (kind: string, to: string[], subject: string, paragraphs: string[], main = link) =>
      this.outbox.enqueue(m, { kind, to, ...composeMail(subject, paragraphs, main) });
    const reason = `Reason given: ${job.returnReason ?? '(none)'}`;
    switch (action) {
      case 'request':
        await send('job.requested', await ofRoles(['fabricator']), `Cut requested: ${title}`, [
          `A new cut job for "${title}" (quantity ${job.quantity}) is waiting to be prepared.`,
          'Pick the material, the machine profile and the colours, then check the layout and estimates.',
        ]);
        return;
      case 'prepare':
        // Four eyes: a prepared job waits for a supervisor, who should hear of it as fabricators hear of
        // requests; not the supervisor who prepared it, whom approval refuses (JOB.SELF_APPROVAL).
        await send(
          'job.prepared',
          await ofRoles(['supervisor']),
          `Job prepared, waiting for approval: ${title}`,
          [
            `The cut job for "${title}" (quantity ${job.quantity}) has been prepared and is waiting for approval.`,
            'Check the material, the machine profile, the layout and the estimates, then approve it or send it back.',
          ],
        );
        return;
      case 'approve':
      case 'release': {
        const kind = action === 'approve' ? 'job.approved' : 'job.released';
        const verb = action === 'approve' ? 'approved' : 'released to the machines';
        // The operators hear what they do next; the requester, what happens to their job. A requester who
        // is an operator gets the operators' mail.
        const operators = await ofRoles(['operator']);
        await send(kind, operators, `Job ${verb}: ${title}`, [
          `The cut job for "${title}" has been ${verb}.`,
          action === 'release'
            ? 'Acknowledge the safety notices for this job before downloading its files.'
            : 'Its files are prepared next; it comes to the release desk once it is released.',
        ]);
        const owner = (await requester()).filter((a) => !operators.includes(a));
        await send(kind, owner, `Your job is ${verb}: ${title}`, [
          `Your cut job for "${title}" has been ${verb}.`,
          action === 'release'
            ? 'Its files are on the machines’ desk: the workshop cuts it next, and you hear when it is cut.'
            : 'The workshop releases it to the machines next.',
        ]);
        return;
      }
      case 'cut':
        await send('job.cut', await requester(), `Your job is cut: ${title}`, [
          `The workshop has recorded the cut of your job for "${title}" (quantity ${job.quantity}).`,
          'The assembly guide on the job page shows which piece goes into which slot, and an order to put ' +
            'them together in.',
        ]);
        return;
      case 'return': {
        const owner = await requester();
        await send('job.returned', owner, `Job returned: ${title}`, [
          `Your cut job for "${title}" was returned to you.`,
          reason,
          'You can reopen it as a draft, change the design, and request it again.',
        ]);
        // Whoever prepared it hears why their preparation went back (unless they returned it themselves).
        if (from === 'prepared' || from === 'approved' || from === 'released') {
          const prepared = await m.findOne(JobTransition, {
            where: { jobId: job.id, action: 'prepare' },
            order: { id: 'DESC' },
          });
          if (prepared?.actorId && prepared.actorId !== actorId) {
            const preparer = (await this.outbox.addressOfUser(m, prepared.actorId)).filter(
              (a) => !owner.includes(a),
            );
            await send('job.preparation-returned', preparer, `A job you prepared was returned: ${title}`, [
              `The cut job for "${title}", which you prepared, was returned to its requester while ${from}.`,
              reason,
              'Once it is requested again, it waits to be prepared anew.',
            ]);
          }
        }
        if (from === 'released') {
          // The operators were told to cut it: they hear, as plainly, that it is not to be cut.
          await send('job.recalled', await ofRoles(['operator']), `Do not cut: ${title} was returned`, [
            `The cut job for "${title}" was taken back from the machines before its cut. Do not cut it; ` +
              'its files are no longer offered. Sheets already laid out for it go back to stock.',
            reason,
          ]);
        }
        return;
      }
      case 'withdraw': {
        // The fabricators heard of the request: they hear that it is no longer waiting for them. The job is a
        // draft again, which only its requester (and supervisors) can open: their link is the jobs board.
        const byRequester = actorId === null || actorId === job.requesterId;
        // Only a supervisor may withdraw another person's request.
        const name = byRequester ? null : await this.nameOf(m, actorId, null);
        const by = byRequester ? 'its requester' : name ? `a supervisor, ${name},` : 'a supervisor';
        await send(
          'job.withdrawn',
          await ofRoles(['fabricator']),
          `Request withdrawn: ${title}`,
          [`The cut job for "${title}" was withdrawn by ${by} before it was prepared; nothing to do.`],
          { label: 'Open the jobs board', url: appLink(this.config.appUrl, 'jobs') },
        );
        // A request withdrawn by someone else (a supervisor) is news to its requester.
        if (!byRequester) {
          await send('job.withdrawn', await requester(), `Your request was withdrawn: ${title}`, [
            `${name ? `${name}, a supervisor,` : 'A supervisor'} withdrew your request for "${title}" before it ` +
              'was prepared; the job is a draft again.',
            'Change it if need be, and request it again when it is ready.',
          ]);
        }
        return;
      }
      default:
        return;
    }
  }

  /** A user's name as mails give it, or `fallback` when the account is gone. */
  private async nameOf<T>(m: EntityManager, userId: string, fallback: T): Promise<string | T> {
    const rows: { display_name: string }[] = await m.query(`SELECT display_name FROM users WHERE id = $1`, [
      userId,
    ]);
    return rows[0]?.display_name ?? fallback;
  }
}
