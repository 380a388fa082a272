import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import CircularProgress from '@mui/material/CircularProgress';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import Stack from '@mui/material/Stack';
import { useTheme } from '@mui/material/styles';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useRef, useState } from 'react';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { MarkdownText } from '../../../components/ui/markdown-text';
import { isStaleAcknowledgement, useAcknowledgeJobSafety } from '../api/acknowledge-job-safety';
import { useJobSafety } from '../api/get-job-safety';
import { familyLabel, kindLabel } from '../../../config/trade-labels';
import { formatDateTime } from '../../../lib/dates';

const SEVERITY = { danger: 'error', warning: 'warning', caution: 'info' } as const;

/**
 * The notices that apply to this job's material and machine kind and the workshop's local rules. The operator
 * acknowledges exactly these versions; the job's files are offered only after that.
 */
export function SafetyDialog({
  jobId,
  open,
  onClose,
  canAcknowledge = true,
}: {
  jobId: string;
  open: boolean;
  onClose: () => void;
  /** Operators and supervisors acknowledge (and then download); others read the notices only. */
  canAcknowledge?: boolean;
}) {
  const safety = useJobSafety(jobId, open);
  const acknowledge = useAcknowledgeJobSafety(jobId);
  const [read, setRead] = useState(false);
  // Acknowledged, the button goes: the keyboard moves on to Close instead of falling to the dialog.
  const closeRef = useRef<HTMLButtonElement>(null);
  const view = safety.data;
  const preparationId = view?.preparationId ?? null;
  // On a phone the notices (tables included) get the whole screen.
  const phone = useMediaQuery(useTheme().breakpoints.down('sm'));
  return (
    <Dialog
      open={open}
      onClose={onClose}
      fullWidth
      fullScreen={phone}
      maxWidth="md"
      aria-labelledby="safety-title"
    >
      <DialogTitle id="safety-title">Safety before cutting</DialogTitle>
      <DialogContent dividers>
        {safety.isPending ? <CircularProgress aria-label="Loading the notices" /> : null}
        {safety.isError ? <FormErrorAlert error={safety.error} /> : null}
        {view ? (
          <Stack spacing={2} data-testid="safety-notices">
            <Typography variant="body2" color="text.secondary">
              {`For ${view.materialFamily ? familyLabel(view.materialFamily).toLowerCase() : 'this material'} on a ${view.machineKind ? kindLabel(view.machineKind) : 'machine'}. These notices do not replace local codes, the machine maker's manual or the workshop's own rules.`}
            </Typography>
            {/* Notices are the dialog's content, not news: a note each, not an alert (WAI-ARIA 1.2: alert is for
                important, time-sensitive messages, and screen readers announce every one at once). */}
            {view.notices.map((n) => (
              <Alert
                key={`${n.id}@${n.version}`}
                severity={SEVERITY[n.severity]}
                variant="outlined"
                role="note"
              >
                <Typography component="h3" sx={{ fontWeight: 500, mb: 0.5 }}>
                  {n.title}
                </Typography>
                <MarkdownText title={n.title} topLevel={4}>
                  {n.body}
                </MarkdownText>
              </Alert>
            ))}
            <Typography variant="h3">Local rules</Typography>
            <Box data-testid="local-rules">
              {view.localRules?.body ? (
                <MarkdownText title="Local rules" topLevel={4}>
                  {view.localRules.body}
                </MarkdownText>
              ) : (
                <Typography variant="body2">
                  The workshop has not written local rules yet; ask a supervisor.
                </Typography>
              )}
            </Box>
            {view.acknowledged ? (
              <Alert severity="success" role="status" data-testid="safety-acknowledged">
                {`You acknowledged these notices${view.acknowledgedAt ? ` on ${formatDateTime(view.acknowledgedAt)}` : ''}.`}
              </Alert>
            ) : !canAcknowledge ? (
              <Alert severity="info" role="note" data-testid="safety-read-only">
                An operator or a supervisor acknowledges these notices before downloading the files and
                cutting.
              </Alert>
            ) : view.preparationId === null ? (
              <Alert severity="info" role="note" data-testid="safety-not-prepared">
                This job is not prepared yet: its notices are acknowledged once its material and machine are
                chosen.
              </Alert>
            ) : (
              <FormControlLabel
                control={<Checkbox checked={read} onChange={(e) => setRead(e.target.checked)} />}
                label="I have read these notices and the local rules and will follow them"
              />
            )}
          </Stack>
        ) : null}
      </DialogContent>
      <DialogActions>
        {/* Also here, beside the button: at the top of a long dialog a refusal would go unseen. */}
        {acknowledge.error ? (
          <Box sx={{ flex: 1 }}>
            <FormErrorAlert error={acknowledge.error} />
          </Box>
        ) : null}
        <Button ref={closeRef} onClick={onClose}>
          Close
        </Button>
        {view && !view.acknowledged && canAcknowledge && preparationId !== null ? (
          <Button
            variant="contained"
            disabled={!read || acknowledge.isPending}
            onClick={() =>
              acknowledge.mutate(
                {
                  notices: view.notices.map((n) => ({ id: n.id, version: n.version })),
                  localRulesVersion: view.localRules?.version ?? null,
                  // The preparation these notices were read for: the job prepared again since is refused (409).
                  preparationId,
                },
                {
                  onSuccess: () => closeRef.current?.focus(),
                  // What was read is out of date: the current notices are read again, and ticked again.
                  onError: (error) => {
                    if (isStaleAcknowledgement(error)) setRead(false);
                  },
                },
              )
            }
          >
            Acknowledge
          </Button>
        ) : null}
      </DialogActions>
    </Dialog>
  );
}
