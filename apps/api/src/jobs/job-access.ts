import { HttpStatus } from '@nestjs/common';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { AppError } from '../common/errors';
import { type Job } from './job.entity';

/** Staff see every job that has left the draft stage; everyone sees their own. */
export function canReadJob(user: AuthUser, job: Pick<Job, 'requesterId' | 'state'>): boolean {
  if (job.requesterId === user.id) return true;
  if (user.role === 'hobbyist') return false;
  return job.state !== 'draft' || user.role === 'supervisor';
}

/** 409 JOB.STALE_VERSION when the job is no longer at the version the caller read. */
export function assertVersion(job: Pick<Job, 'version'>, version: number): void {
  if (job.version !== version) {
    throw new AppError(
      HttpStatus.CONFLICT,
      'JOB.STALE_VERSION',
      'The job changed since you read it; reload it and try again',
      { current: job.version },
    );
  }
}
