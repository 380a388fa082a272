import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { NotFoundPage } from '../../../components/errors/not-found-page';
import { FullPageProgress } from '../../../components/ui/full-page-progress';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { errorMessage, isApiError } from '../../../lib/api-client';
import { useUser } from '../../../lib/auth';
import { formatDateTime } from '../../../lib/dates';
import { isRecordId } from '../../../lib/record-id';
import { useLengthUnit } from '../../../lib/use-length-unit';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { useCreateProfileVersion } from '../api/create-profile-version';
import { useMachineProfile } from '../api/get-machine-profile';
import { useMaterialChoices } from '../api/get-material-choices';
import { useRetireProfileVersion } from '../api/retire-profile-version';
import { useSubmitProfileVersion } from '../api/submit-profile-version';
import { useUpdateProfileVersion } from '../api/update-profile-version';
import { KerfHistoryPanel } from '../components/kerf-history-panel';
import { ProfileFormDialog, type ProfileFormMode } from '../components/profile-form-dialog';
import {
  type ProfileFormValues,
  toVersionContent,
  versionToFormValues,
} from '../components/profile-form-schema';
import { KIND_LABELS, STATE_LABELS } from '../components/profile-labels';
import { RetireVersionDialog } from '../components/retire-version-dialog';
import { VersionComparison } from '../components/version-comparison';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';

/**
 * An address that names no machine profile (mistyped, or the profile is not there): say so, and offer the
 * way back, as the job page does for a job. Trying again would only ask the same question.
 */
function NoSuchProfile() {
  return (
    <NotFoundPage
      title="No such machine profile"
      backTo={paths.machineProfiles.getHref()}
      backLabel="Back to the machine profiles"
      testId="no-such-profile"
    >
      There is no machine profile at this address. The link may be mistyped or incomplete; the machine
      profiles page lists every profile.
    </NotFoundPage>
  );
}

/**
 * One machine profile: its versions side by side, drafting and submitting, and the kerf history. A supervisor
 * may take the machine out of use (its approved version retired, with a reason).
 */
export function MachineProfileRoute() {
  const { profileId = '' } = useParams();
  const user = useUser();
  const profile = useMachineProfile(profileId);
  const [mode, setMode] = useState<ProfileFormMode | null>(null);
  const [confirmSubmit, setConfirmSubmit] = useState(false);
  const [confirmRetire, setConfirmRetire] = useState(false);
  // Taken out of use here: the button that opened the dialog is gone, so the keyboard goes to what is said
  // instead (WCAG 2.1, 2.4.3), once the page shows it.
  const [focusOutOfUse, setFocusOutOfUse] = useState(false);
  const outOfUseBox = useRef<HTMLDivElement>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const materials = useMaterialChoices(mode !== null);
  const createVersion = useCreateProfileVersion(profileId);
  const updateVersion = useUpdateProfileVersion(profileId);
  const submitVersion = useSubmitProfileVersion(profileId);
  const retireVersion = useRetireProfileVersion(profileId);
  // Lengths and speeds in the unit this browser shows them in, as on the studio and job pages.
  const [unit, setUnit] = useLengthUnit();
  const data = profile.data;
  const initial = useMemo(() => (data ? versionToFormValues(data, data.latest) : null), [data]);

  useEffect(() => {
    if (!focusOutOfUse || !outOfUseBox.current) return;
    outOfUseBox.current.focus();
    setFocusOutOfUse(false);
  }, [focusOutOfUse, profile.data]);

  if (!isRecordId(profileId) || (isApiError(profile.error) && profile.error.status === 404)) {
    return <NoSuchProfile />;
  }
  if (profile.isPending) return <FullPageProgress label="Loading the machine profile…" />;
  if (profile.isError || !data || !initial) {
    return (
      <ErrorPanel
        title="The machine profile could not be loaded"
        error={profile.error}
        onRetry={() => void profile.refetch()}
      />
    );
  }

  const latest = data.latest;
  const approved = data.currentApproved;
  // Out of use: no approved version, and the last one in use was taken out of use with a reason (not replaced
  // by a newer approval). A draft closed since says nothing of the machine.
  const outOfUse = approved
    ? null
    : (data.versions
        .filter((v) => v.state === 'retired' && v.retiredAt && v.approvedAt)
        .sort((a, b) => (b.retiredAt ?? '').localeCompare(a.retiredAt ?? ''))[0] ?? null);
  const saving = mode === 'edit-draft' ? updateVersion : createVersion;

  const openForm = (m: ProfileFormMode) => {
    createVersion.reset();
    updateVersion.reset();
    setMode(m);
  };

  const save = (v: ProfileFormValues) => {
    const content = toVersionContent(v);
    if (mode === 'edit-draft') {
      updateVersion.mutate(
        { versionId: latest.id, body: { ...content, lockVersion: latest.lockVersion } },
        {
          onSuccess: (saved) => {
            setNotice(`Draft version ${saved.number} is saved.`);
            setMode(null);
          },
        },
      );
    } else {
      createVersion.mutate(content, {
        onSuccess: (saved) => {
          setNotice(`Draft version ${saved.number} is saved. Submit it when it is ready.`);
          setMode(null);
        },
      });
    }
  };

  return (
    <Box sx={{ maxWidth: 1280 }} data-testid="machine-profile-page">
      <title>{`${data.name} · Machine profiles · Kerfwright`}</title>
      <Typography variant="body2" sx={{ mb: 1 }}>
        <RouterLink to={paths.machineProfiles.getHref()}>Machine profiles</RouterLink>
      </Typography>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, flexWrap: 'wrap', mb: 1 }}>
        <Typography variant="h1">{data.name}</Typography>
        <Chip label={KIND_LABELS[data.kind]} variant="outlined" />
        <Box sx={{ flex: 1 }} />
        <UnitToggle unit={unit} onUnit={setUnit} />
      </Box>
      <Typography color="text.secondary" sx={{ mb: 2 }} data-testid="profile-status">
        {approved
          ? `Jobs use version ${approved.number} (approved).`
          : outOfUse
            ? 'No version is approved, so no job can use this machine.'
            : 'No version is approved yet, so no job can use this machine.'}{' '}
        Newest: version {latest.number}, {STATE_LABELS[latest.state].toLowerCase()}.
      </Typography>

      {outOfUse?.retireReason ? (
        <Alert severity="error" sx={{ mb: 2 }} data-testid="out-of-use" ref={outOfUseBox} tabIndex={-1}>
          <AlertTitle>Out of use since {formatDateTime(outOfUse.retiredAt as string)}</AlertTitle>
          Version {outOfUse.number} was taken out of use: “{outOfUse.retireReason}”. A newer version must be
          approved before jobs can use this machine again.
        </Alert>
      ) : null}

      {latest.state === 'draft' && latest.returnReason ? (
        <Alert severity="warning" sx={{ mb: 2 }} data-testid="return-reason">
          <AlertTitle>Version {latest.number} was sent back</AlertTitle>
          {latest.returnReason}
        </Alert>
      ) : null}

      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', mb: 3 }} data-testid="profile-actions">
        {latest.state === 'draft' ? (
          <>
            <Button variant="outlined" onClick={() => openForm('edit-draft')}>
              Change the draft
            </Button>
            <Button
              variant="contained"
              onClick={() => {
                submitVersion.reset();
                setConfirmSubmit(true);
              }}
            >
              Submit version {latest.number} for approval
            </Button>
          </>
        ) : latest.state === 'submitted' ? (
          <Alert severity="info" sx={{ flexGrow: 1 }}>
            Version {latest.number} waits for a supervisor’s decision. It cannot be changed meanwhile.
          </Alert>
        ) : (
          <Button variant="contained" onClick={() => openForm('new-version')}>
            Draft a new version
          </Button>
        )}
        {approved && user.role === 'supervisor' ? (
          <Button
            variant="outlined"
            color="error"
            onClick={() => {
              retireVersion.reset();
              setConfirmRetire(true);
            }}
          >
            Take out of use
          </Button>
        ) : null}
      </Box>

      <Paper variant="outlined" sx={{ mb: 3 }}>
        <Typography variant="h2" sx={{ px: 2, pt: 2, fontSize: '1.25rem' }}>
          Versions
        </Typography>
        <VersionComparison versions={data.versions} unit={unit} />
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, mb: 3 }}>
        <Typography variant="h2" sx={{ mb: 2, fontSize: '1.25rem' }}>
          Kerf history
        </Typography>
        <KerfHistoryPanel profile={data} unit={unit} onAdopted={setNotice} />
      </Paper>

      <Alert severity="warning" sx={{ mb: 2 }}>
        Settings are starting values. Check every new value on an offcut with the machine attended, and follow
        the machine maker’s manual, local codes and the workshop’s own rules.
      </Alert>

      <ProfileFormDialog
        open={mode !== null}
        mode={mode ?? 'new-version'}
        unit={unit}
        initial={initial}
        materials={materials.data?.items}
        materialsError={materials.error}
        busy={saving.isPending}
        error={saving.error}
        onSubmit={save}
        onClose={() => setMode(null)}
      />

      <Dialog open={confirmSubmit} onClose={() => setConfirmSubmit(false)} aria-labelledby="submit-title">
        <DialogTitle id="submit-title">Submit version {latest.number} for approval?</DialogTitle>
        <DialogContent>
          <DialogContentText>
            Supervisors are told and decide whether jobs may use it. A submitted version cannot be changed
            unless a supervisor sends it back.
          </DialogContentText>
          {submitVersion.error ? (
            <Alert severity="error" role="alert" sx={{ mt: 2 }}>
              {errorMessage(submitVersion.error)}
            </Alert>
          ) : null}
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={() => setConfirmSubmit(false)}>Cancel</Button>
          <Button
            variant="contained"
            loading={submitVersion.isPending}
            onClick={() =>
              submitVersion.mutate(latest, {
                onSuccess: (v) => {
                  setConfirmSubmit(false);
                  setNotice(`Version ${v.number} is submitted for approval.`);
                },
              })
            }
          >
            Submit
          </Button>
        </DialogActions>
      </Dialog>

      {approved ? (
        <RetireVersionDialog
          open={confirmRetire}
          profileName={data.name}
          versionNumber={approved.number}
          busy={retireVersion.isPending}
          error={retireVersion.error}
          onClose={() => setConfirmRetire(false)}
          onSubmit={({ reason }) =>
            retireVersion.mutate(
              { version: approved, reason },
              {
                onSuccess: (v) => {
                  setConfirmRetire(false);
                  setFocusOutOfUse(true);
                  setNotice(
                    `${data.name} is out of use: version ${v.number} is retired, and the workshop is told.`,
                  );
                },
              },
            )
          }
        />
      ) : null}

      <NoticeSnackbar notice={notice} onClose={() => setNotice(null)} />
    </Box>
  );
}
