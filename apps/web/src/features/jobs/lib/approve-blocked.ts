import { type JobView } from '@kerfwright/contracts';

/**
 * Why a prepared job is not offered to this supervisor for approval (the server would refuse it), or null when
 * it is offered or the caller is no approver: the four-eyes rule, or a profile version retired since.
 */
export function approveBlockedReason(
  job: Pick<
    JobView,
    | 'state'
    | 'actions'
    | 'preparedByCaller'
    | 'profileVersionRetired'
    | 'profileName'
    | 'profileVersionNumber'
    | 'materialRefusal'
  >,
  role: string,
): string | null {
  if (job.state !== 'prepared' || role !== 'supervisor' || job.actions.includes('approve')) return null;
  // Said by the job page to everyone on the staff (materialStopText), not once more here.
  if (job.materialRefusal) return null;
  if (job.preparedByCaller) return 'You prepared this job: another supervisor approves it (four-eyes rule).';
  if (job.profileVersionRetired)
    return `${job.profileName ?? 'The machine profile'} version ${job.profileVersionNumber ?? '?'} is no longer the approved one: the job must be prepared again before it can be approved.`;
  return 'You cannot approve this job.';
}

/**
 * Why a laser job waiting to be cut is stopped by its material (taken off the laser since it was prepared:
 * the server's refusal, word for word), and what follows, for the workshop's staff; null otherwise.
 */
export function materialStopText(job: Pick<JobView, 'materialRefusal'>, role: string): string | null {
  if (!job.materialRefusal || role === 'hobbyist') return null;
  const refusal = job.materialRefusal.replace(/\.?\s*$/, '.');
  const next =
    role === 'supervisor' || role === 'fabricator'
      ? 'Return it with a reason, to be prepared again on another material.'
      : 'A supervisor or fabricator returns it, to be prepared again on another material.';
  return `${refusal} Since it was prepared, this job's material may not be cut on its laser: it cannot be approved, released or cut. ${next}`;
}
