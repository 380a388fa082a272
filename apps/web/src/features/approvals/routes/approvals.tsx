import { type JobView, type MachineProfileSummaryView, transitionFor } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Checkbox from '@mui/material/Checkbox';
import Chip from '@mui/material/Chip';
import FormControlLabel from '@mui/material/FormControlLabel';
import Typography from '@mui/material/Typography';
import { useEffect, useRef, useState } from 'react';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { ConfirmJobActionDialog } from '../../jobs/components/confirm-job-action-dialog';
import { approveBlockedReason } from '../../jobs/lib/approve-blocked';
import { KIND_LABELS } from '../../machine-profiles/components/profile-labels';
import { versionChanges } from '../../machine-profiles/utils/version-rows';
import { useDecideJob } from '../api/decide-job';
import { useDecideProfileVersion } from '../api/decide-profile-version';
import { useWaitingJobs } from '../api/get-waiting-jobs';
import { useWaitingVersions } from '../api/get-waiting-versions';
import { DecisionActions } from '../components/decision-actions';
import { SendBackDialog } from '../components/send-back-dialog';
import { LaserConditions, laserConditionsOf } from '../components/laser-conditions';
import { VersionChanges } from '../components/version-changes';
import { WaitingSection } from '../components/waiting-section';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';
import { countOf } from '../../../lib/plural';
import { formatMinutes, formatMoney, formatPercent, formatSheetSize } from '../../../lib/units';
import { useLengthUnit } from '../../../lib/use-length-unit';
import { formatDateTime } from '../../../lib/dates';

/**
 * Whether the waiting version's notes are among its listed changes (new, or changed since the approved
 * version). Listed notes are not repeated; only unchanged notes get a line of their own.
 */
const notesAmongChanges = (p: MachineProfileSummaryView) =>
  // Notes have no unit: any unit tells whether they changed.
  versionChanges(p.currentApproved, p.latest, 'mm').some((c) => c.key === 'machine.notes');

/** What a dialog is open for: a version or a job, to approve or to send back. */
type Deciding =
  { kind: 'version'; profile: MachineProfileSummaryView } | { kind: 'job'; job: JobView } | null;

/** The waiting version a decision is about, and the lockVersion it was read at. */
const decidingOn = (p: MachineProfileSummaryView) => ({
  profileId: p.id,
  versionId: p.latest.id,
  lockVersion: p.latest.lockVersion,
});

/** Supervisors: machine profile versions and jobs waiting for a decision, each approved or sent back. */
export function ApprovalsRoute() {
  // Sheet sizes and machine values in the unit this browser shows lengths in (chosen on the studio, job,
  // desk or machine profile pages).
  const [unit] = useLengthUnit();
  const versions = useWaitingVersions();
  const jobs = useWaitingJobs();
  const decideVersion = useDecideProfileVersion();
  const decideJob = useDecideJob();
  const [sendingBack, setSendingBack] = useState<Deciding>(null);
  // Approving asks first, as the job page does: a dialog says what follows, its button approves.
  const [confirming, setConfirming] = useState<Deciding>(null);
  const [notice, setNotice] = useState<string | null>(null);
  // A version with materials a laser cuts only on a condition is approved with the box ticked.
  const [conditionsChecked, setConditionsChecked] = useState(false);
  // A decided card leaves its list (and the button that opened the dialog with it): the keyboard focus goes
  // to its section's heading then, instead of falling to the page.
  const versionsHeading = useRef<HTMLHeadingElement>(null);
  const jobsHeading = useRef<HTMLHeadingElement>(null);
  const [decided, setDecided] = useState<{ section: 'versions' | 'jobs'; id: string } | null>(null);
  useEffect(() => {
    if (!decided) return;
    const ids =
      decided.section === 'versions'
        ? versions.data?.items.map((p) => p.latest.id)
        : jobs.data?.items.map((j) => j.id);
    if (!ids || ids.includes(decided.id)) return;
    (decided.section === 'versions' ? versionsHeading : jobsHeading).current?.focus();
    setDecided(null);
  }, [decided, versions.data, jobs.data]);

  const confirmApproval = (what: NonNullable<Deciding>) => {
    decideVersion.reset();
    decideJob.reset();
    setConditionsChecked(false);
    setConfirming(what);
  };
  const approveVersion = (p: MachineProfileSummaryView) =>
    decideVersion.mutate(
      { ...decidingOn(p), decision: 'approve', conditionsChecked },
      {
        onSuccess: (v) => {
          setConfirming(null);
          setDecided({ section: 'versions', id: p.latest.id });
          setNotice(`Version ${v.number} of ${p.name} is approved; jobs use it from now on.`);
        },
      },
    );
  const approveJob = (j: JobView) =>
    decideJob.mutate(
      { jobId: j.id, version: j.version, decision: 'approve' },
      {
        onSuccess: () => {
          setConfirming(null);
          setDecided({ section: 'jobs', id: j.id });
          setNotice(`${j.designName} is approved for release.`);
        },
      },
    );
  const sendBack = (reason: string) => {
    if (!sendingBack) return;
    if (sendingBack.kind === 'version') {
      const p = sendingBack.profile;
      decideVersion.mutate(
        { ...decidingOn(p), decision: 'return', reason },
        {
          onSuccess: () => {
            setSendingBack(null);
            setDecided({ section: 'versions', id: p.latest.id });
            setNotice(`Version ${p.latest.number} of ${p.name} is back with its author.`);
          },
        },
      );
    } else {
      const j = sendingBack.job;
      decideJob.mutate(
        { jobId: j.id, version: j.version, decision: 'return', reason },
        {
          onSuccess: () => {
            setSendingBack(null);
            setDecided({ section: 'jobs', id: j.id });
            setNotice(`${j.designName} is returned, with your reason.`);
          },
        },
      );
    }
  };

  // The laser conditions the approver of the version being confirmed must have checked.
  const confirmingConditions = confirming?.kind === 'version' ? laserConditionsOf(confirming.profile) : [];

  // A refusal is said in the dialog while it is open, else above the lists.
  const pendingError = sendingBack || confirming ? null : (decideVersion.error ?? decideJob.error);
  const dialogMutation = sendingBack?.kind === 'job' ? decideJob : decideVersion;

  return (
    <Box sx={{ maxWidth: 1100 }} data-testid="approvals-page">
      <title>Approvals · Kerfwright</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        Approvals
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        What waits for a supervisor: machine profile versions a fabricator submitted, and jobs a fabricator
        prepared. Approve, or send back with a reason the author will see.
      </Typography>
      {pendingError ? (
        <Alert severity="error" role="alert" sx={{ mb: 2 }}>
          {errorMessage(pendingError)}
        </Alert>
      ) : null}

      <WaitingSection
        heading="Machine profile versions"
        headingRef={versionsHeading}
        query={versions}
        errorTitle="The waiting versions could not be loaded"
        emptyText="No machine profile version is waiting."
        spacing={3}
      >
        {(p) => (
          <Card key={p.latest.id} variant="outlined" data-testid={`waiting-version-${p.name}`}>
            <CardContent>
              <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap', mb: 1 }}>
                <Typography variant="h3" sx={{ fontSize: '1.1rem', fontWeight: 600 }}>
                  <RouterLink to={paths.machineProfile.getHref(p.id)}>{p.name}</RouterLink>, version{' '}
                  {p.latest.number}
                </Typography>
                <Chip size="small" variant="outlined" label={KIND_LABELS[p.kind]} />
              </Box>
              <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
                Submitted {p.latest.submittedAt ? formatDateTime(p.latest.submittedAt) : ''}.{' '}
                {p.currentApproved
                  ? `Compared with the approved version ${p.currentApproved.number}; only changed values are listed.`
                  : 'No version is approved yet: every value is new.'}
              </Typography>
              <VersionChanges approved={p.currentApproved} waiting={p.latest} unit={unit} />
              <LaserConditions conditions={laserConditionsOf(p)} />
              {p.latest.notes && !notesAmongChanges(p) ? (
                <Typography variant="body2" sx={{ mt: 2 }} data-testid="version-notes">
                  Notes (unchanged): {p.latest.notes}
                </Typography>
              ) : null}
            </CardContent>
            <DecisionActions
              approveLabel={`Approve version ${p.latest.number}`}
              subject={p.name}
              approving={decideVersion.isPending && decideVersion.variables.versionId === p.latest.id}
              onApprove={() => confirmApproval({ kind: 'version', profile: p })}
              onSendBack={() => {
                decideVersion.reset();
                setSendingBack({ kind: 'version', profile: p });
              }}
            />
          </Card>
        )}
      </WaitingSection>

      <WaitingSection
        heading="Jobs"
        headingRef={jobsHeading}
        query={jobs}
        errorTitle="The waiting jobs could not be loaded"
        emptyText="No prepared job is waiting."
      >
        {(j) => {
          const prep = j.preparation;
          return (
            <Card key={j.id} variant="outlined" data-testid="waiting-job">
              <CardContent>
                <Typography variant="h3" sx={{ fontSize: '1.1rem', fontWeight: 600, mb: 1 }}>
                  <RouterLink to={paths.job.getHref(j.id)}>{j.designName}</RouterLink> × {j.quantity}
                </Typography>
                <Typography variant="body2">
                  For {j.requesterName}. {j.materialName ?? 'No material'} (
                  {j.colours.join(', ') || 'no colour'}) on {j.profileName ?? 'no machine'}
                  {j.profileVersionNumber !== null ? `, version ${j.profileVersionNumber}` : ''}.
                </Typography>
                {prep ? (
                  <Typography variant="body2" color="text.secondary">
                    {countOf(prep.pieceCount, 'piece')} on {countOf(prep.sheetCount, 'sheet')} of{' '}
                    {formatSheetSize(prep.sheet, unit)}, {formatPercent(prep.utilisation)} used
                    {prep.estimate
                      ? `; about ${formatMinutes(prep.estimate.minutes)}, ${formatMoney(prep.estimate.machineCost + (prep.estimate.materialCost ?? 0), prep.estimate.currency)}${prep.estimate.materialCost === null ? ` of machine time (no sheet price in ${prep.estimate.currency})` : ''}`
                      : ''}
                    .
                  </Typography>
                ) : null}
                {prep?.warnings.length ? (
                  <Alert severity="warning" sx={{ mt: 1 }}>
                    {prep.warnings.join(' ')}
                  </Alert>
                ) : null}
              </CardContent>
              <DecisionActions
                approveLabel="Approve the job"
                subject={j.designName}
                approveBlocked={approveBlockedReason(j, 'supervisor')}
                sendBackLabel={transitionFor('return').label}
                approving={decideJob.isPending && decideJob.variables.jobId === j.id}
                onApprove={() => confirmApproval({ kind: 'job', job: j })}
                onSendBack={() => {
                  decideJob.reset();
                  setSendingBack({ kind: 'job', job: j });
                }}
              />
            </Card>
          );
        }}
      </WaitingSection>

      {confirming?.kind === 'job' ? (
        <ConfirmJobActionDialog
          action="approve"
          from={confirming.job.state}
          busy={decideJob.isPending}
          error={decideJob.error}
          onConfirm={() => approveJob(confirming.job)}
          onClose={() => setConfirming(null)}
        />
      ) : null}
      {confirming?.kind === 'version' ? (
        <ConfirmDialog
          open
          titleId="approve-version-title"
          title={`Approve version ${confirming.profile.latest.number} of ${confirming.profile.name}?`}
          confirmLabel={`Approve version ${confirming.profile.latest.number}`}
          busy={decideVersion.isPending}
          error={decideVersion.error}
          extra={
            confirmingConditions.length > 0 ? (
              <FormControlLabel
                sx={{ mt: 1 }}
                control={
                  <Checkbox
                    checked={conditionsChecked}
                    onChange={(e) => setConditionsChecked(e.target.checked)}
                  />
                }
                label={`I have checked the laser condition of ${confirmingConditions.map((c) => c.material).join(', ')}`}
              />
            ) : null
          }
          confirmDisabled={confirmingConditions.length > 0 && !conditionsChecked}
          onConfirm={() => approveVersion(confirming.profile)}
          onClose={() => setConfirming(null)}
        >
          {confirming.profile.currentApproved
            ? `Jobs use it from now on; version ${confirming.profile.currentApproved.number} is retired. Jobs ` +
              `already released on version ${confirming.profile.currentApproved.number} stay released, marked as on a ` +
              'retired version: return any that must not be cut on it.'
            : 'Jobs may use this machine from now on.'}
        </ConfirmDialog>
      ) : null}
      <SendBackDialog
        open={sendingBack !== null}
        subject={
          sendingBack?.kind === 'version'
            ? `version ${sendingBack.profile.latest.number} of ${sendingBack.profile.name}`
            : sendingBack?.kind === 'job'
              ? `the job ${sendingBack.job.designName}`
              : ''
        }
        verb={sendingBack?.kind === 'job' ? 'Return' : 'Send back'}
        busy={dialogMutation.isPending}
        error={dialogMutation.error}
        onSubmit={(v) => sendBack(v.reason)}
        onClose={() => setSendingBack(null)}
      />
      <NoticeSnackbar notice={notice} onClose={() => setNotice(null)} />
    </Box>
  );
}
