import {
  CUT_PACK_DOWNLOADABLE_STATES,
  type JobAction,
  type JobDetailView,
  mayEditJobRequest,
  transitionFor,
} from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, useRef, useState } from 'react';
import { useParams } from 'react-router-dom';
import { RouterLink } from '../../../components/ui/router-link';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { NotFoundPage } from '../../../components/errors/not-found-page';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { useUser } from '../../../lib/auth';
import { useLengthUnit } from '../../../lib/use-length-unit';
import {
  formatKerf,
  formatLength,
  formatMinutes,
  formatMoney,
  formatPercent,
  formatRunLength,
  formatSheetSize,
  formatStockThickness,
} from '../../../lib/units';
import { isJobId, useJob } from '../api/get-job';
import { useJobSafety } from '../api/get-job-safety';
import { approveBlockedReason, materialStopText } from '../lib/approve-blocked';
import {
  packPrepareBlockedReason,
  preparedAgainAfterReturn,
  releaseBlockedReason,
  retiredSinceReleaseText,
} from '../lib/pack-text';
import { isJobChangedSince, useTakeJobAction } from '../api/take-job-action';
import { AssemblyGuidePanel } from '../components/assembly-guide-panel';
import { ConfirmJobActionDialog } from '../components/confirm-job-action-dialog';
import { CutPackPanel } from '../components/cut-pack-panel';
import { JobSheetsPanel } from '../components/job-sheets-panel';
import { JobHistory } from '../components/job-history';
import { JobStateChip } from '../components/job-state-chip';
import { PrepareJobDialog } from '../components/prepare-job-dialog';
import { RecordCutDialog } from '../components/record-cut-dialog';
import { RequestJobDialog } from '../components/request-job-dialog';
import { ReturnJobDialog } from '../components/return-job-dialog';
import { useChangeJobRequest } from '../api/change-job-request';
import { SafetyDialog } from '../components/safety-dialog';
import { countOf } from '../../../lib/plural';
import { isBlankNumber } from '../../../lib/form-numbers';
import { withFullStop } from '../../../lib/sentences';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';

/** Actions that need more than a confirmation open their own dialog; so do the notices and a draft's request. */
type Open = JobAction | 'safety' | 'change' | null;

export function JobDetailRoute() {
  const { jobId = '' } = useParams();
  const job = useJob(jobId);
  if (!isJobId(jobId) || (isApiError(job.error) && job.error.status === 404)) return <NoSuchJob />;
  if (job.isPending) {
    return (
      <Box sx={{ display: 'grid', placeItems: 'center', minHeight: 240 }}>
        <CircularProgress aria-label="Loading the job" />
      </Box>
    );
  }
  if (job.isError) {
    return (
      <ErrorPanel title="The job could not be loaded" error={job.error} onRetry={() => void job.refetch()} />
    );
  }
  return <JobDetail job={job.data} />;
}

/** What each action does to a job, as the end of "a returned job cannot be …". */
const DONE_TO_JOB: Record<JobAction, string> = {
  request: 'requested',
  prepare: 'prepared',
  approve: 'approved',
  release: 'released',
  cut: 'recorded as cut',
  close: 'closed',
  return: 'returned',
  reopen: 'reopened',
  withdraw: 'withdrawn',
};

/**
 * What the page says once a step is taken, after the job's name ("Hexagon star is approved for release."), in
 * the words the Approvals page uses for the same decisions: the heading that gets the keyboard names the job
 * only, so without it nobody reading with a screen reader hears that the step was taken.
 */
const TAKEN_NOTICE: Record<JobAction, string> = {
  request: 'is requested',
  prepare: 'is prepared',
  approve: 'is approved for release',
  release: 'is released',
  cut: 'is recorded as cut',
  close: 'is closed',
  return: 'is returned, with your reason',
  reopen: 'is a draft again',
  withdraw: 'is a draft again: the request is withdrawn',
};

/**
 * Why the server refused an action the job's state does not allow, in the page's words ("a returned job
 * cannot be prepared"), from the refusal's details, else from the action taken and the job as read again.
 */
function refusedActionSentence(details: unknown, taken: JobAction | undefined, state: string): string {
  const d = typeof details === 'object' && details !== null ? (details as Record<string, unknown>) : {};
  const now = typeof d.state === 'string' ? d.state : state;
  const a = typeof d.action === 'string' && d.action in DONE_TO_JOB ? (d.action as JobAction) : taken;
  const article = /^[aeiou]/i.test(now) ? 'an' : 'a';
  return a ? `${article} ${now} job cannot be ${DONE_TO_JOB[a]}` : `the job is ${now} now`;
}

/** A change of copies and notes refused because the job is not as read: a newer version, or not a draft now. */
function isChangeOvertaken(error: unknown): boolean {
  return isJobChangedSince(error) || (isApiError(error) && error.code === 'JOB.NOT_EDITABLE');
}

/** An address that names no job (mistyped, or the job is not there): say so, and offer the way back. */
function NoSuchJob() {
  return (
    <NotFoundPage
      title="No such job"
      backTo={paths.jobs.getHref()}
      backLabel="Back to the jobs"
      testId="no-such-job"
    >
      There is no job at this address. The link may be mistyped or incomplete; the jobs board lists every job
      you can open.
    </NotFoundPage>
  );
}

function JobDetail({ job }: { job: JobDetailView }) {
  const user = useUser();
  const action = useTakeJobAction();
  const change = useChangeJobRequest();
  const canChange = mayEditJobRequest(job.state, user.role, job.requesterId === user.id);
  const [opened, setOpen] = useState<Open>(null);
  // A dialog whose action the job no longer offers (someone acted on the job meanwhile) gives way to the
  // page, which shows the job as it is now and the server's answer.
  const offered = (o: Exclude<Open, null>) =>
    o === 'safety' || (o === 'change' ? canChange : job.actions.includes(o));
  const open: Open = opened !== null && !offered(opened) ? null : opened;
  if (open !== opened) setOpen(open);
  const [unit, setUnit] = useLengthUnit();
  const fmt = (mm: number) => formatLength(mm, unit);
  const prep = job.preparation;

  // A step taken moves the job on and the button that opened its dialog goes: once the dialog has closed,
  // the keyboard focus goes to the job's name (the state beside it), instead of falling to the page.
  const heading = useRef<HTMLHeadingElement>(null);
  const [stepTaken, setStepTaken] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  useEffect(() => {
    if (!stepTaken || open !== null) return;
    heading.current?.focus();
    setStepTaken(false);
  }, [stepTaken, open]);
  const take = (a: JobAction, extra: Record<string, unknown> = {}) =>
    action.mutate(
      { id: job.id, action: a, body: { version: job.version, ...extra } },
      {
        onSuccess: () => {
          setStepTaken(true);
          setOpen(null);
          setNotice(`${job.designName} ${TAKEN_NOTICE[a]}.`);
        },
        // Someone acted on the job meanwhile: the dialog closes, so that nobody confirms a job they have not
        // seen as it is now (a new preparation, another state); the page shows it and says so.
        onError: (error) => {
          if (isJobChangedSince(error)) setOpen(null);
        },
      },
    );
  const start = (a: JobAction) => {
    action.reset();
    setOpen(a);
  };
  const canAcknowledge = job.state === 'released' && (user.role === 'operator' || user.role === 'supervisor');
  // The cut is recorded only by someone who acknowledged the job's current notices (the server refuses it
  // otherwise): until then the button waits, and says why.
  const safety = useJobSafety(job.id, canAcknowledge);
  const cutWaits = job.actions.includes('cut') && safety.data?.acknowledged !== true;
  const approveBlocked = approveBlockedReason(job, user.role);
  const retiredSince = retiredSinceReleaseText(job, user.role);
  // Staff see the cut pack once the job is approved; downloads still need the safety acknowledgement.
  const canSeePack =
    user.role !== 'hobbyist' && ['approved', 'released', 'cut', 'closed'].includes(job.state);
  // A hobbyist downloads one file: their own job's assembly guide, once the job is released.
  const canGetGuide =
    user.role === 'hobbyist' &&
    job.requesterId === user.id &&
    CUT_PACK_DOWNLOADABLE_STATES.includes(job.state);

  return (
    <Box sx={{ maxWidth: 1200 }} data-testid="job-detail">
      <title>{`${job.designName} · Job · Kerfwright`}</title>
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center', mb: 1 }}>
        <Typography variant="h1" ref={heading} tabIndex={-1} sx={{ '&:focus': { outline: 'none' } }}>
          {job.designName}
        </Typography>
        <JobStateChip state={job.state} />
        <Box sx={{ flex: 1 }} />
        <UnitToggle unit={unit} onUnit={setUnit} />
      </Stack>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        {/* A draft is requested by nobody (not sent yet, or the request was withdrawn): its maker owns it. */}
        {`${job.state === 'draft' ? 'Owner:' : 'Requested by'} ${job.requesterName} · ${countOf(job.quantity, 'copy', 'copies')} · `}
        <RouterLink to={paths.design.getHref(job.designId)}>open the design</RouterLink>
      </Typography>
      {job.returnReason && job.state === 'returned' ? (
        <Alert severity="error" sx={{ mb: 2 }} data-testid="return-reason">
          {`Returned: ${job.returnReason}`}
        </Alert>
      ) : null}
      {/* Reopened after a return, the draft is being put right for the reason given: it stays in view until the
          cut is requested again (the API clears it then), rather than only in the history further down. */}
      {job.returnReason && job.state === 'draft' ? (
        <Alert severity="info" sx={{ mb: 2 }} data-testid="return-reason">
          {`Returned earlier: ${withFullStop(job.returnReason)} Put that right, then request the cut again.`}
        </Alert>
      ) : null}
      {retiredSince ? (
        <Alert severity="warning" sx={{ mb: 2 }} data-testid="retired-since-release">
          {retiredSince}
        </Alert>
      ) : null}
      {action.error && open === null && !isJobChangedSince(action.error) ? (
        <FormErrorAlert error={action.error} />
      ) : null}
      {change.error && isChangeOvertaken(change.error) ? (
        <Alert severity="info" sx={{ mb: 2 }} data-testid="job-read-again">
          The job was changed elsewhere (by someone else, or in another tab) while you had it open, so your
          changes were not saved. The page now shows it as it is: check it before you change it again.
        </Alert>
      ) : null}
      {action.error && isJobChangedSince(action.error) ? (
        <Alert severity="info" sx={{ mb: 2 }} data-testid="job-read-again">
          {`Someone else acted on this job while you had it open, so nothing was done. The page now shows it as it is${
            isApiError(action.error) && action.error.code === 'JOB.ILLEGAL_TRANSITION'
              ? ` (${refusedActionSentence(action.error.details, action.variables?.action, job.state)})`
              : ''
          }: check it before you act again.`}
        </Alert>
      ) : null}

      <Stack
        direction="row"
        spacing={1}
        sx={{ mb: 3, flexWrap: 'wrap' }}
        useFlexGap
        data-testid="job-actions"
      >
        {job.actions.map((a) => (
          <Button
            key={a}
            variant={a === 'return' ? 'outlined' : 'contained'}
            color={a === 'return' ? 'error' : 'primary'}
            disabled={a === 'cut' && cutWaits}
            onClick={() => start(a)}
          >
            {transitionFor(a).label}
          </Button>
        ))}
        {canChange ? (
          <Button
            variant="outlined"
            onClick={() => {
              change.reset();
              setOpen('change');
            }}
          >
            Change copies and notes
          </Button>
        ) : null}
        {canAcknowledge ? (
          <Button variant="outlined" color="warning" onClick={() => setOpen('safety')}>
            Safety notices
          </Button>
        ) : null}
        {[
          ['material-stopped', materialStopText(job, user.role)],
          ['approve-blocked', approveBlocked],
          ['cut-waits', cutWaits ? 'Acknowledge the safety notices before recording the cut.' : null],
          // Release is not offered for a job prepared on a version retired since: said here, by the actions.
          [
            'release-blocked',
            user.role === 'fabricator' || user.role === 'supervisor' ? releaseBlockedReason(job) : null,
          ],
        ].map(([testId, note]) =>
          note ? (
            <Typography
              key={testId}
              variant="body2"
              color="text.secondary"
              sx={{ alignSelf: 'center' }}
              data-testid={testId}
            >
              {note}
            </Typography>
          ) : null,
        )}
        {job.actions.length === 0 && !canAcknowledge && !canChange ? (
          <Typography color="text.secondary">Nothing for you to do on this job now.</Typography>
        ) : null}
      </Stack>

      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', md: '1fr 1fr' } }}>
        <Paper variant="outlined" sx={{ p: 2 }}>
          <Typography variant="h2" sx={{ mb: 1 }}>
            Material and machine
          </Typography>
          <Facts
            rows={[
              ['Material', job.materialName ?? 'not chosen yet'],
              ['Colours', job.colours.length ? job.colours.join(', ') : '—'],
              [
                'Machine profile',
                job.profileName
                  ? `${job.profileName} v${job.profileVersionNumber ?? '?'}${job.profileVersionRetired ? ' (retired since)' : ''}`
                  : 'not chosen yet',
              ],
              ['Notes', job.notes || '—'],
            ]}
          />
          {job.actualMinutes !== null ? (
            <Facts
              rows={[
                ['Machine time (recorded)', formatMinutes(job.actualMinutes)],
                ['Sheets used', String(job.sheetsUsed ?? '—')],
                [
                  prep?.machineKind === 'router' ? 'Measured cut width' : 'Measured kerf',
                  job.measuredKerfMm === null ? '—' : formatKerf(job.measuredKerfMm, unit),
                ],
              ]}
            />
          ) : null}
        </Paper>
        <Paper variant="outlined" sx={{ p: 2 }} data-testid="job-layout">
          <Typography variant="h2" sx={{ mb: 1 }}>
            Layout and estimates
          </Typography>
          {prep ? (
            <>
              <Facts
                rows={[
                  // The pieces of every copy; the crossings and the diameter are those of one model.
                  [
                    'Pieces',
                    job.quantity > 1
                      ? `${prep.pieceCount} (${job.quantity} copies of ${prep.pieceCount / job.quantity})`
                      : String(prep.pieceCount),
                  ],
                  [
                    'Crossings',
                    job.quantity > 1 ? `${prep.crossingCount} per copy` : String(prep.crossingCount),
                  ],
                  ['Diameter', fmt(prep.diameterMm)],
                  ['Sheets', `${countOf(prep.sheetCount, 'sheet')} of ${formatSheetSize(prep.sheet, unit)}`],
                  ['Utilisation', formatPercent(prep.utilisation)],
                  [
                    'Stock',
                    `${formatStockThickness(prep.thicknessMm, unit)} thick, cut on a ${prep.machineKind}`,
                  ],
                  ...(prep.estimate
                    ? ([
                        ['Cut length', formatRunLength(prep.estimate.cutLengthMm, unit)],
                        ['Pierces', String(prep.estimate.pierces)],
                        ['Machine time (estimated)', formatMinutes(prep.estimate.minutes)],
                        [
                          'Cost',
                          prep.estimate.materialCost === null
                            ? `${formatMoney(prep.estimate.machineCost, prep.estimate.currency)} machine time; material not counted (the stock list has no price for this sheet in ${prep.estimate.currency})`
                            : `${formatMoney(prep.estimate.machineCost + prep.estimate.materialCost, prep.estimate.currency)} (machine ${formatMoney(prep.estimate.machineCost, prep.estimate.currency)}, material ${formatMoney(prep.estimate.materialCost, prep.estimate.currency)})`,
                        ],
                      ] as [string, string][])
                    : []),
                ]}
              />
              {prep.warnings.map((w, i) => (
                <Alert key={i} severity="warning" sx={{ mt: 1 }}>
                  {w}
                </Alert>
              ))}
            </>
          ) : (
            <Typography color="text.secondary">A fabricator lays the job out when preparing it.</Typography>
          )}
        </Paper>
      </Box>

      {prep && ['prepared', 'approved', 'released'].includes(job.state) ? (
        <JobSheetsPanel job={job} unit={unit} />
      ) : null}

      {canSeePack ? (
        <CutPackPanel
          jobId={job.id}
          jobVersion={job.version}
          canPrepare={
            (user.role === 'fabricator' || user.role === 'supervisor') &&
            (job.state === 'approved' || job.state === 'released')
          }
          canDownload={user.role === 'operator' || user.role === 'supervisor'}
          jobDone={job.state === 'cut' || job.state === 'closed'}
          prepareBlocked={packPrepareBlockedReason(job)}
          preparedAgain={preparedAgainAfterReturn(job)}
          onOpenSafety={() => setOpen('safety')}
        />
      ) : null}
      {canGetGuide ? <AssemblyGuidePanel jobId={job.id} /> : null}

      <Paper variant="outlined" sx={{ p: 2, mt: 2 }}>
        <Typography variant="h2" sx={{ mb: 1 }}>
          History
        </Typography>
        <JobHistory transitions={job.transitions} />
      </Paper>

      {open === 'prepare' ? (
        <PrepareJobDialog
          open
          unit={unit}
          designId={job.designId}
          jobColours={job.colours}
          prepared={
            job.materialId
              ? {
                  materialId: job.materialId,
                  profileVersionId: job.profileVersionId,
                  profileName: job.profileName,
                  // The last preparation's choices outlive its figures (a change of copies drops those).
                  sheet: job.layoutChoice?.sheet ?? prep?.sheet,
                  colourRule: job.layoutChoice?.colourRule ?? prep?.colourRule,
                }
              : undefined
          }
          busy={action.isPending}
          error={action.error}
          onSubmit={(body) => take('prepare', { ...body })}
          onClose={() => setOpen(null)}
        />
      ) : null}
      {open === 'change' ? (
        <RequestJobDialog
          open
          current={{ quantity: job.quantity, notes: job.notes }}
          busy={change.isPending}
          error={change.error}
          onSubmit={(v) =>
            change.mutate(
              { id: job.id, version: job.version, ...v },
              {
                onSuccess: () => setOpen(null),
                onError: (error) => {
                  if (isChangeOvertaken(error)) setOpen(null);
                },
              },
            )
          }
          onClose={() => setOpen(null)}
        />
      ) : null}
      {open === 'return' ? (
        <ReturnJobDialog
          open
          from={job.state}
          busy={action.isPending}
          error={action.error}
          onSubmit={(v) => take('return', { reason: v.reason.trim() })}
          onClose={() => setOpen(null)}
        />
      ) : null}
      {open === 'cut' ? (
        <RecordCutDialog
          open
          busy={action.isPending}
          error={action.error}
          preparedSheets={prep?.sheetCount ?? null}
          machineKind={prep?.machineKind ?? 'laser'}
          unit={unit}
          onSubmit={(v) =>
            take('cut', {
              actualMinutes: v.actualMinutes,
              sheetsUsed: v.sheetsUsed,
              ...(isBlankNumber(v.measuredKerfMm) ? {} : { measuredKerfMm: v.measuredKerfMm }),
            })
          }
          onClose={() => setOpen(null)}
        />
      ) : null}
      {open === 'safety' ? (
        <SafetyDialog
          jobId={job.id}
          open
          onClose={() => setOpen(null)}
          canAcknowledge={user.role === 'operator' || user.role === 'supervisor'}
        />
      ) : null}
      {open && !['prepare', 'return', 'cut', 'safety', 'change'].includes(open) ? (
        <ConfirmJobActionDialog
          action={open as JobAction}
          from={job.state}
          busy={action.isPending}
          error={action.error}
          onConfirm={() => take(open as JobAction)}
          onClose={() => setOpen(null)}
        />
      ) : null}
      <NoticeSnackbar notice={notice} onClose={() => setNotice(null)} />
    </Box>
  );
}

function Facts({ rows }: { rows: [string, string][] }) {
  return (
    <Box component="dl" sx={{ display: 'grid', gridTemplateColumns: '160px 1fr', rowGap: 0.5, m: 0, mb: 1 }}>
      {rows.map(([k, v]) => (
        <Box key={k} sx={{ display: 'contents' }}>
          <Typography component="dt" color="text.secondary" variant="body2">
            {k}
          </Typography>
          <Typography component="dd" variant="body2" sx={{ m: 0 }}>
            {v}
          </Typography>
        </Box>
      ))}
    </Box>
  );
}
