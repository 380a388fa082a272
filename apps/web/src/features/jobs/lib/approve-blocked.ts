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
  >,
  role: string,
): string | null {
  if (job.state !== 'prepared' || role !== 'supervisor' || job.actions.includes('approve')) return null;
  if (job.preparedByCaller) return 'You prepared this job: another supervisor approves it (four-eyes rule).';
  if (job.profileVersionRetired)
    return `${job.profileName ?? 'The machine profile'} version ${job.profileVersionNumber ?? '?'} is no longer the approved one: the job must be prepared again before it can be approved.`;
  return 'You cannot approve this job.';
}
