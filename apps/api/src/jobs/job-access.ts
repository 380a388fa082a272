import { type AuthUser } from '../common/decorators/auth.decorators';
import { type Job } from './job.entity';

/** Staff see every job that has left the draft stage; everyone sees their own. */
export function canReadJob(user: AuthUser, job: Pick<Job, 'requesterId' | 'state'>): boolean {
  if (job.requesterId === user.id) return true;
  if (user.role === 'hobbyist') return false;
  return job.state !== 'draft' || user.role === 'supervisor';
}
