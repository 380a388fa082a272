import {
  type Role,
  type CutPackFileRole,
  type ExportView,
  type JobTransitionView,
  type JobView,
} from '@kerfwright/contracts';

/** What each file of a cut pack is, in the words the job page and the desk use. */
export const PACK_FILE_ROLE_LABELS: Record<CutPackFileRole, string> = {
  'sheet-dxf': 'Sheet drawing (DXF)',
  'sheet-svg': 'Sheet drawing (SVG)',
  'setup-sheet': 'Setup sheet (PDF)',
  'assembly-guide': 'Assembly guide (PDF)',
  'coupon-dxf': 'Test coupon (DXF)',
  'coupon-svg': 'Test coupon (SVG)',
  manifest: 'List of files with checksums',
  archive: 'All files (ZIP)',
};

/** How a pack's build is going, in words: waiting for a worker, or being built. */
export function packProgressText(view: Pick<ExportView, 'state' | 'progress'>): string {
  return view.state === 'queued' ? 'waiting for a worker' : `building, ${view.progress} %`;
}

/**
 * Why a pack failed. A failure the job itself explains (its design, material or profile) carries the server's
 * own sentence; a failed attempt of the machinery (storage, a worker) gets a plain explanation, with the
 * storage's or worker's words quoted for whoever runs the server.
 */
export function packFailureText(view: Pick<ExportView, 'errorCode' | 'errorMessage' | 'attempts'>): string {
  if (view.errorCode === 'EXPORT.ATTEMPT_FAILED') {
    const tries = view.attempts === 1 ? 'one attempt' : `${view.attempts} attempts`;
    // The API words the cause for the job's people (the storage client's own text stays in its log).
    const times = view.attempts === 1 ? 'once' : `${view.attempts} times`;
    const said = view.errorMessage?.replace(/[.\s]+$/u, '');
    const cause = said
      ? `Tried ${times}: ${said.charAt(0).toLowerCase()}${said.slice(1)}.`
      : `The files could not be built and stored after ${tries}. Prepare the cut pack again.`;
    return `${cause} If it fails again, whoever runs the server finds the details in its log.`;
  }
  return view.errorMessage ?? 'The cut pack could not be prepared.';
}

/**
 * Why no cut pack is offered to prepare for this job, or null: an approved job whose machine profile version
 * has been retired since. The API refuses its pack (409), and the job cannot go back to preparation but by
 * being returned. (A released job's pack is rebuilt on the version it was released on, so it stays offered.)
 */
export function packPrepareBlockedReason(job: RetiredVersionJob): string | null {
  return retiredVersionSentence(job, 'no cut pack can be prepared for it');
}

/** Why an approved job is not offered for release: the same retired version (the release builds the pack). */
export function releaseBlockedReason(job: RetiredVersionJob): string | null {
  return retiredVersionSentence(job, 'it cannot be released to the machines');
}

/**
 * Why a released job should wait for a supervisor, or null: the machine profile version it was released on has
 * been retired since (a setting found wrong, say). Its files stay offered; returning it stops it.
 */
export function retiredSinceReleaseText(job: RetiredVersionJob, role: Role): string | null {
  if (job.state !== 'released' || !job.profileVersionRetired) return null;
  const what =
    role === 'supervisor' || role === 'fabricator'
      ? 'If it must not be cut on that version, return it with a reason: it is then prepared again on the current one.'
      : 'Check with a supervisor before cutting it: a job that must not be cut on that version is returned with a ' +
        'reason, and prepared again on the current one.';
  return (
    `${job.profileName ?? 'The machine profile'} version ${job.profileVersionNumber ?? '?'}, which this job was ` +
    `released on, has been retired since${retiredBecause(job)}. ${what}`
  );
}

/** The supervisor's reason for taking the version out of use, as a clause (none when a newer one replaced it). */
const retiredBecause = (job: RetiredVersionJob): string =>
  job.profileRetireReason ? `, taken out of use: “${job.profileRetireReason}”` : '';

type RetiredVersionJob = Pick<
  JobView,
  'state' | 'profileVersionRetired' | 'profileName' | 'profileVersionNumber' | 'profileRetireReason'
>;

function retiredVersionSentence(job: RetiredVersionJob, consequence: string): string | null {
  if (job.state !== 'approved' || !job.profileVersionRetired) return null;
  return (
    `${job.profileName ?? 'The machine profile'} version ${job.profileVersionNumber ?? '?'}, which this job was ` +
    `prepared on, has been retired since${retiredBecause(job)}, so ${consequence}. Return the job with a reason: ` +
    'once it is requested again, it is prepared on the current version.'
  );
}

/**
 * Whether the job's preparation in effect came after a return: a pack is built only for an approved or released
 * job, so the packs of any earlier preparation are for another material, kerf or layout, and the API neither lists
 * them nor serves their files. The job's history is not always at hand (a row of a list): then false.
 */
export function preparedAgainAfterReturn(
  job: JobView | { transitions: readonly JobTransitionView[] },
): boolean {
  if (!('transitions' in job)) return false;
  const lastPrepare = job.transitions.findLastIndex((t) => t.action === 'prepare');
  return lastPrepare > 0 && job.transitions.slice(0, lastPrepare).some((t) => t.action === 'return');
}

/** What the cut-pack panel says of a job prepared again whose current preparation has no pack built yet. */
export const NO_PACK_FOR_NEW_PREPARATION =
  'The job was returned and prepared again: no cut pack has been built for its current preparation yet. The ' +
  'files built before are for the earlier preparation and are not offered.';
