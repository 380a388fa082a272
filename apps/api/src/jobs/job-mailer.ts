import { Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { type EntityManager } from 'typeorm';
import { type JobAction, type JobState } from '@kerfwright/contracts';
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
    const requester = () => this.outbox.addressOfUser(m, job.requesterId);
    switch (action) {
      case 'request': {
        const mail = composeMail(
          `Cut requested: ${title}`,
          [
            `A new cut job for "${title}" (quantity ${job.quantity}) is waiting to be prepared.`,
            'Pick the material, the machine profile and the colours, then check the layout and estimates.',
          ],
          link,
        );
        await this.outbox.enqueue(m, {
          kind: 'job.requested',
          to: await this.outbox.addressesOfRoles(m, ['fabricator']),
          ...mail,
        });
        return;
      }
      case 'prepare': {
        // Four eyes: a prepared job waits for a supervisor, who should hear of it as fabricators hear of
        // requests; not the supervisor who prepared it, whom approval refuses (JOB.SELF_APPROVAL).
        const mail = composeMail(
          `Job prepared, waiting for approval: ${title}`,
          [
            `The cut job for "${title}" (quantity ${job.quantity}) has been prepared and is waiting for approval.`,
            'Check the material, the machine profile, the layout and the estimates, then approve it or send it back.',
          ],
          link,
        );
        await this.outbox.enqueue(m, {
          kind: 'job.prepared',
          to: await this.outbox.addressesOfRoles(m, ['supervisor'], actorId ? [actorId] : []),
          ...mail,
        });
        return;
      }
      case 'approve':
      case 'release': {
        const verb = action === 'approve' ? 'approved' : 'released to the machines';
        // The operators hear what they do next; the requester, what happens to their job. A requester who
        // is an operator gets the operators' mail.
        const operators = await this.outbox.addressesOfRoles(m, ['operator']);
        const operatorMail = composeMail(
          `Job ${verb}: ${title}`,
          [
            `The cut job for "${title}" has been ${verb}.`,
            action === 'release'
              ? 'Acknowledge the safety notices for this job before downloading its files.'
              : 'Its files are prepared next; it comes to the release desk once it is released.',
          ],
          link,
        );
        await this.outbox.enqueue(m, {
          kind: action === 'approve' ? 'job.approved' : 'job.released',
          to: operators,
          ...operatorMail,
        });
        const owner = (await requester()).filter((a) => !operators.includes(a));
        if (owner.length > 0) {
          const ownerMail = composeMail(
            `Your job is ${verb}: ${title}`,
            [
              `Your cut job for "${title}" has been ${verb}.`,
              action === 'release'
                ? 'Its files are on the machines’ desk: the workshop cuts it next, and you hear when it is cut.'
                : 'The workshop releases it to the machines next.',
            ],
            link,
          );
          await this.outbox.enqueue(m, {
            kind: action === 'approve' ? 'job.approved' : 'job.released',
            to: owner,
            ...ownerMail,
          });
        }
        return;
      }
      case 'cut': {
        const mail = composeMail(
          `Your job is cut: ${title}`,
          [
            `The workshop has recorded the cut of your job for "${title}" (quantity ${job.quantity}).`,
            'The assembly guide on the job page shows which piece goes into which slot, and an order to put ' +
              'them together in.',
          ],
          link,
        );
        await this.outbox.enqueue(m, { kind: 'job.cut', to: await requester(), ...mail });
        return;
      }
      case 'return': {
        const mail = composeMail(
          `Job returned: ${title}`,
          [
            `Your cut job for "${title}" was returned to you.`,
            `Reason given: ${job.returnReason ?? '(none)'}`,
            'You can reopen it as a draft, change the design, and request it again.',
          ],
          link,
        );
        const owner = await requester();
        await this.outbox.enqueue(m, { kind: 'job.returned', to: owner, ...mail });
        // Whoever prepared it hears why their preparation went back (unless they returned it themselves).
        if (from === 'prepared' || from === 'approved' || from === 'released') {
          const prepared = await m.findOne(JobTransition, {
            where: { jobId: job.id, action: 'prepare' },
            order: { id: 'DESC' },
          });
          const preparer = prepared?.actorId && prepared.actorId !== actorId ? prepared.actorId : null;
          const to = preparer
            ? (await this.outbox.addressOfUser(m, preparer)).filter((a) => !owner.includes(a))
            : [];
          if (to.length > 0) {
            const back = composeMail(
              `A job you prepared was returned: ${title}`,
              [
                `The cut job for "${title}", which you prepared, was returned to its requester while ${from}.`,
                `Reason given: ${job.returnReason ?? '(none)'}`,
                'Once it is requested again, it waits to be prepared anew.',
              ],
              link,
            );
            await this.outbox.enqueue(m, { kind: 'job.preparation-returned', to, ...back });
          }
        }
        if (from === 'released') {
          // The operators were told to cut it: they hear, as plainly, that it is not to be cut.
          const stop = composeMail(
            `Do not cut: ${title} was returned`,
            [
              `The cut job for "${title}" was taken back from the machines before its cut. Do not cut it; ` +
                'its files are no longer offered. Sheets already laid out for it go back to stock.',
              `Reason given: ${job.returnReason ?? '(none)'}`,
            ],
            link,
          );
          await this.outbox.enqueue(m, {
            kind: 'job.recalled',
            to: await this.outbox.addressesOfRoles(m, ['operator']),
            ...stop,
          });
        }
        return;
      }
      case 'withdraw': {
        // The fabricators heard of the request: they hear that it is no longer waiting for them.
        const mail = composeMail(
          `Request withdrawn: ${title}`,
          [
            `The cut job for "${title}" was withdrawn by its requester before it was prepared; nothing to do.`,
          ],
          link,
        );
        await this.outbox.enqueue(m, {
          kind: 'job.withdrawn',
          to: await this.outbox.addressesOfRoles(m, ['fabricator']),
          ...mail,
        });
        return;
      }
      default:
        return;
    }
  }
}
