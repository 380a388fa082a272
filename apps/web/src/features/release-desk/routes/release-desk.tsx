import { CUT_PACK_DOWNLOADABLE_STATES, JOB_PACK_STATES, type JobView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useTheme } from '@mui/material/styles';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { Link, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { SCREEN_READER_ONLY } from '../../../components/ui/screen-reader-only';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { paths } from '../../../config/paths';
import { useUser } from '../../../lib/auth';
import { useLengthUnit } from '../../../lib/use-length-unit';
import { jobQueryOptions } from '../../jobs/api/get-job';
import { useJobSafety } from '../../jobs/api/get-job-safety';
import { useTakeJobAction } from '../../jobs/api/take-job-action';
import { CutPackPanel } from '../../jobs/components/cut-pack-panel';
import {
  packPrepareBlockedReason,
  preparedAgainAfterReturn,
  retiredSinceReleaseText,
} from '../../jobs/lib/pack-text';
import { JobStateChip } from '../../jobs/components/job-state-chip';
import { RecordCutDialog } from '../../jobs/components/record-cut-dialog';
import { materialStopText } from '../../jobs/lib/approve-blocked';
import { SafetyDialog } from '../../jobs/components/safety-dialog';
import { type DeskRow, useReleaseDeskJobs } from '../api/get-release-desk-jobs';
import { PackProgress } from '../components/pack-progress';
import { countOf } from '../../../lib/plural';
import { useScrollFocus } from '../../../lib/use-scroll-focus';
import { withFullStop } from '../../../lib/sentences';

/**
 * The release desk (operators, supervisors): the jobs ready for the machines and those whose cut pack is
 * being prepared. Open one to read and acknowledge its safety notices, download its files and record the cut.
 */
export function ReleaseDeskRoute() {
  const scrollFocus = useScrollFocus('Jobs at the release desk');
  const desk = useReleaseDeskJobs();
  const [unit, setUnit] = useLengthUnit();
  // The opened job is in the address (?job=…): the browser's Back closes it, and a link to it opens it.
  const [params, setParams] = useSearchParams();
  const selectedId = params.get('job');
  const navigate = useNavigate();
  const openedHere = (useLocation().state as { openedAtDesk?: boolean } | null)?.openedAtDesk === true;
  // Opening a job adds one step to the history (another job opened instead replaces it); closing one goes
  // back that step, so the browser's Back then leaves the desk instead of reopening the job.
  const setSelectedId = (id: string | null) => {
    if (id === null) {
      if (openedHere) void navigate(-1);
      else setParams({}, { replace: true });
    } else {
      setParams({ job: id }, { replace: selectedId !== null && openedHere, state: { openedAtDesk: true } });
    }
  };
  // The opened job is read on its own, so it stays on screen after the cut (when it leaves the queue).
  const detail = useQuery({ ...jobQueryOptions(selectedId ?? ''), enabled: selectedId !== null });
  const selected = detail.data ?? desk.rows.find((r) => r.job.id === selectedId)?.job ?? null;
  // On a phone the seven columns do not fit: each job is a card of its own, its Open button in reach.
  const phone = useMediaQuery(useTheme().breakpoints.down('sm'));
  // Back from a job (the page's button on a phone, or the browser's), the focus goes to the button that
  // opened it, its card back in view on a phone.
  const previousId = useRef<string | null>(selectedId);
  useEffect(() => {
    const left = previousId.current;
    previousId.current = selectedId;
    if (selectedId !== null || left === null) return;
    document.querySelector<HTMLElement>(`[data-open-job="${left}"]`)?.focus();
  }, [selectedId]);
  return (
    <Box data-testid="release-desk">
      <title>Release desk · Kerfwright</title>
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center' }}>
        <Typography variant="h1" sx={{ flex: 1 }}>
          Release desk
        </Typography>
        {/* The measured kerf is recorded here: in the unit the workshop's gauges read. */}
        <UnitToggle unit={unit} onUnit={setUnit} />
      </Stack>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        Jobs released to the machines, and those whose cut pack is being prepared. Read the safety notices
        before downloading; the workshop&apos;s rules and the machine maker&apos;s manual come first.
      </Typography>
      {desk.error ? (
        <ErrorPanel
          title="The jobs could not be loaded"
          error={desk.error}
          onRetry={() => void desk.refetch()}
        />
      ) : null}
      {desk.isPending ? <CircularProgress aria-label="Loading the jobs" /> : null}
      {selectedId !== null && detail.isError && !selected ? (
        // A link to a job that is not there (or not for this role): said, not silently dropped.
        <Alert severity="warning" sx={{ mb: 2 }} data-testid="desk-job-missing">
          The job this link opens could not be found at the desk; it may have been closed, or the link is
          incomplete. Choose a job from the list.
        </Alert>
      ) : null}
      {!desk.isPending && !desk.error && desk.rows.length === 0 ? (
        <Alert severity="info">No job is waiting for the machines.</Alert>
      ) : null}
      {/* On a phone an opened job takes the list's place (a job opened under a long list of cards would start
          off screen, and grows as its notices and files load); a button leads back to the list. */}
      {desk.rows.length > 0 && phone && !selected ? (
        <DeskCards rows={desk.rows} selectedId={selectedId} onOpen={setSelectedId} />
      ) : null}
      {phone && selected ? (
        <Button variant="outlined" fullWidth onClick={() => setSelectedId(null)} sx={{ mb: 1 }}>
          {`Back to the jobs at the desk (${desk.rows.length})`}
        </Button>
      ) : null}
      {desk.rows.length > 0 && !phone ? (
        // A tablet-width page keeps its width: the table scrolls inside its card.
        <TableContainer
          {...scrollFocus}
          component={Paper}
          variant="outlined"
          sx={{ mb: 2, overflowX: 'auto' }}
        >
          <Table size="small" aria-label="Jobs at the release desk">
            <TableHead>
              <TableRow>
                <TableCell>Design</TableCell>
                <TableCell>State</TableCell>
                <TableCell>Material</TableCell>
                <TableCell>Machine</TableCell>
                <TableCell>Sheets</TableCell>
                <TableCell>Cut pack</TableCell>
                {/* Named for screen readers, which read a column's header with each of its cells. */}
                <TableCell align="right">
                  <Box component="span" sx={SCREEN_READER_ONLY}>
                    Open
                  </Box>
                </TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {desk.rows.map(({ job, newest, lastBuiltFiles }) => (
                <TableRow key={job.id} selected={job.id === selectedId}>
                  <TableCell>
                    {job.designName}
                    <JobWhose job={job} />
                  </TableCell>
                  <TableCell>
                    <JobStateChip state={job.state} />
                  </TableCell>
                  <TableCell>{`${job.materialName ?? '—'}${job.colours.length ? ` (${job.colours.join(', ')})` : ''}`}</TableCell>
                  <TableCell>
                    {job.profileName
                      ? `${job.profileName} v${job.profileVersionNumber ?? '?'}${job.profileVersionRetired ? ' (retired since)' : ''}`
                      : '—'}
                  </TableCell>
                  <TableCell>{job.preparation?.sheetCount ?? '—'}</TableCell>
                  <TableCell>
                    <PackProgress jobId={job.id} newest={newest} lastBuiltFiles={lastBuiltFiles} />
                  </TableCell>
                  <TableCell align="right">
                    <Button size="small" onClick={() => setSelectedId(job.id)} data-open-job={job.id}>
                      {`Open ${job.designName}`}
                    </Button>
                  </TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableContainer>
      ) : null}
      {selected ? <DeskJob key={selected.id} job={selected} phone={phone} /> : null}
    </Box>
  );
}

/** Whose job it is and how many copies: two jobs of one design (a popular one) are told apart by it. */
function JobWhose({ job }: { job: JobView }) {
  return (
    <Typography component="span" variant="body2" color="text.secondary" sx={{ display: 'block' }}>
      {`for ${job.requesterName}${job.quantity > 1 ? ` · ${countOf(job.quantity, 'copy', 'copies')}` : ''}`}
    </Typography>
  );
}

/** The desk's jobs at phone width: one card per job, its facts stacked and its Open button full width. */
function DeskCards({
  rows,
  selectedId,
  onOpen,
}: {
  rows: readonly DeskRow[];
  selectedId: string | null;
  onOpen: (id: string) => void;
}) {
  return (
    <Stack
      spacing={1}
      sx={{ mb: 2, pl: 0, mt: 0 }}
      component="ul"
      aria-label="Jobs at the release desk"
      data-testid="desk-cards"
    >
      {rows.map(({ job, newest, lastBuiltFiles }) => (
        <Paper
          key={job.id}
          component="li"
          variant="outlined"
          sx={{ p: 1.5, listStyle: 'none', borderColor: job.id === selectedId ? 'primary.main' : undefined }}
        >
          <Stack direction="row" spacing={1} sx={{ alignItems: 'center', mb: 0.5 }}>
            <Typography component="h2" sx={{ flex: 1, fontWeight: 500, overflowWrap: 'anywhere' }}>
              {job.designName}
              <JobWhose job={job} />
            </Typography>
            <JobStateChip state={job.state} />
          </Stack>
          <Typography variant="body2" color="text.secondary" sx={{ overflowWrap: 'anywhere' }}>
            {`${job.materialName ?? '—'}${job.colours.length ? ` (${job.colours.join(', ')})` : ''} · ${
              job.profileName
                ? `${job.profileName} v${job.profileVersionNumber ?? '?'}${job.profileVersionRetired ? ' (retired since)' : ''}`
                : '—'
            } · ${job.preparation ? countOf(job.preparation.sheetCount, 'sheet') : 'not laid out yet'}`}
          </Typography>
          <Box sx={{ my: 1 }}>
            <PackProgress jobId={job.id} newest={newest} lastBuiltFiles={lastBuiltFiles} />
          </Box>
          <Button variant="outlined" fullWidth onClick={() => onOpen(job.id)} data-open-job={job.id}>
            {`Open ${job.designName}`}
          </Button>
        </Paper>
      ))}
    </Stack>
  );
}

/** One job at the desk: the safety acknowledgement, the cut pack's files and recording the cut. */
function DeskJob({ job, phone }: { job: JobView; phone: boolean }) {
  const user = useUser();
  // Opened from the table, the job below it comes into view; on a phone it replaced the list, so the page
  // starts at its top.
  const ref = useRef<HTMLDivElement>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    // A block body: the effect must return nothing, and Chromium's scrollIntoView returns a promise, which
    // React would otherwise call as the effect's clean-up when the job is closed.
    if (phone) window.scrollTo?.({ top: 0 });
    else void ref.current?.scrollIntoView?.({ block: 'start', behavior: 'smooth' });
    // The keyboard follows: the job's name takes the focus (on a phone the button used is gone).
    heading.current?.focus({ preventScroll: true });
    // On opening only: turning the phone does not scroll the page again.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  // A cut recorded or a job closed takes away the button used: the keyboard goes back to the job's name.
  const shownState = useRef(job.state);
  useEffect(() => {
    if (shownState.current === job.state) return;
    shownState.current = job.state;
    heading.current?.focus({ preventScroll: true });
  }, [job.state]);
  const safety = useJobSafety(job.id, true);
  const action = useTakeJobAction();
  const [open, setOpen] = useState<'safety' | 'cut' | 'close' | null>(null);
  const [unit] = useLengthUnit();
  const acknowledged = safety.data?.acknowledged === true;
  const retiredSince = retiredSinceReleaseText(job, user.role);
  const materialStop = materialStopText(job, user.role);
  // Approved (its pack being built), released, or cut and closed since: the desk's states for a job.
  const atMachines = JOB_PACK_STATES.includes(job.state) || CUT_PACK_DOWNLOADABLE_STATES.includes(job.state);
  const canCut = job.actions.includes('cut');
  return (
    <Paper variant="outlined" sx={{ p: 2 }} data-testid="desk-job" ref={ref}>
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center', mb: 1, flexWrap: 'wrap' }} useFlexGap>
        <Typography variant="h2" sx={{ flex: 1, '&:focus': { outline: 'none' } }} tabIndex={-1} ref={heading}>
          {job.designName}
        </Typography>
        <JobStateChip state={job.state} />
        <Button component={Link} to={paths.job.getHref(job.id)}>
          Job details
        </Button>
        {job.state === 'released' ? (
          <Button
            variant={acknowledged ? 'outlined' : 'contained'}
            color="warning"
            onClick={() => setOpen('safety')}
          >
            Safety notices
          </Button>
        ) : null}
        {canCut ? (
          <Button
            variant="contained"
            disabled={!acknowledged}
            title={acknowledged ? undefined : 'Acknowledge the safety notices first'}
            onClick={() => {
              action.reset();
              setOpen('cut');
            }}
          >
            Record the cut
          </Button>
        ) : null}
        {job.actions.includes('close') ? (
          // Once the cut is recorded, the operator finishes the job here rather than on its page.
          <Button
            variant="contained"
            onClick={() => {
              action.reset();
              setOpen('close');
            }}
          >
            Close the job
          </Button>
        ) : null}
      </Stack>
      {job.state === 'released' && safety.isSuccess && !acknowledged ? (
        // Also why "Record the cut" is disabled: a disabled button takes no focus, so its title reaches no
        // keyboard or screen reader.
        <Alert severity="warning" data-testid="desk-needs-acknowledgement">
          {canCut
            ? 'Read and acknowledge the safety notices for this job before its files are offered and its cut can be recorded.'
            : 'Read and acknowledge the safety notices for this job before its files are offered.'}
        </Alert>
      ) : null}
      {atMachines ? null : (
        // Returned (or reopened since) while open here: said, and nothing offered to cut.
        <Alert severity="error" data-testid="desk-job-gone">
          {job.state === 'returned'
            ? `${job.returnReason ? `This job was returned: “${withFullStop(job.returnReason)}”` : 'This job was returned.'} Its files are no longer offered, and it is not to be cut.`
            : `This job is ${job.state} now: it is no longer at the machines, and its files are not offered.`}
        </Alert>
      )}
      {materialStop ? (
        <Alert severity="error" data-testid="desk-material-stopped">
          {materialStop}
        </Alert>
      ) : null}
      {retiredSince ? (
        <Alert severity="warning" data-testid="desk-retired-since-release">
          {retiredSince}
        </Alert>
      ) : null}
      {action.error && open === null ? <FormErrorAlert error={action.error} /> : null}
      {atMachines ? (
        <CutPackPanel
          jobId={job.id}
          jobVersion={job.version}
          canPrepare={user.role === 'supervisor' && JOB_PACK_STATES.includes(job.state)}
          canDownload={user.role === 'operator' || user.role === 'supervisor'}
          jobDone={job.state === 'cut' || job.state === 'closed'}
          prepareBlocked={packPrepareBlockedReason(job)}
          preparedAgain={preparedAgainAfterReturn(job)}
          onOpenSafety={() => setOpen('safety')}
        />
      ) : null}
      {open === 'safety' ? <SafetyDialog jobId={job.id} open onClose={() => setOpen(null)} /> : null}
      {open === 'cut' ? (
        <RecordCutDialog
          open
          busy={action.isPending}
          error={action.error}
          preparedSheets={job.preparation?.sheetCount ?? null}
          machineKind={job.preparation?.machineKind ?? 'laser'}
          unit={unit}
          onSubmit={(v) =>
            action.mutate(
              {
                id: job.id,
                action: 'cut',
                body: {
                  version: job.version,
                  actualMinutes: v.actualMinutes,
                  sheetsUsed: v.sheetsUsed,
                  ...(v.measuredKerfMm === undefined || Number.isNaN(v.measuredKerfMm)
                    ? {}
                    : { measuredKerfMm: v.measuredKerfMm }),
                },
              },
              { onSuccess: () => setOpen(null) },
            )
          }
          onClose={() => setOpen(null)}
        />
      ) : null}
      {open === 'close' ? (
        <Dialog open onClose={() => setOpen(null)} aria-labelledby="desk-close-title">
          <DialogTitle id="desk-close-title">Close the job?</DialogTitle>
          <DialogContent>
            {action.error ? <FormErrorAlert error={action.error} /> : null}
            <Typography>
              {`The cut of ${job.designName} is recorded; closing it takes it off the desk. Its files stay downloadable.`}
            </Typography>
          </DialogContent>
          <DialogActions>
            <Button onClick={() => setOpen(null)}>Cancel</Button>
            <Button
              variant="contained"
              disabled={action.isPending}
              onClick={() =>
                action.mutate(
                  { id: job.id, action: 'close', body: { version: job.version } },
                  { onSuccess: () => setOpen(null) },
                )
              }
            >
              Close the job
            </Button>
          </DialogActions>
        </Dialog>
      ) : null}
    </Paper>
  );
}
