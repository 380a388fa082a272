import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import { errorMessage } from '../../../lib/api-client';

export interface PendingChange {
  title: string;
  explanation: string;
  confirmLabel: string;
  /** Deactivation locks a person out: its button is coloured as a warning. */
  destructive: boolean;
}

interface ConfirmChangeDialogProps {
  change: PendingChange | null;
  busy: boolean;
  error: unknown;
  onConfirm: () => void;
  onCancel: () => void;
}

/** Asks before a change to someone's account takes effect; shows the API's refusal if there is one. */
export function ConfirmChangeDialog({ change, busy, error, onConfirm, onCancel }: ConfirmChangeDialogProps) {
  return (
    <Dialog
      open={change !== null}
      onClose={busy ? undefined : onCancel}
      aria-labelledby="confirm-change-title"
      aria-describedby="confirm-change-text"
      maxWidth="xs"
      fullWidth
    >
      <DialogTitle id="confirm-change-title">{change?.title}</DialogTitle>
      <DialogContent>
        <DialogContentText id="confirm-change-text">{change?.explanation}</DialogContentText>
        {error ? (
          <Alert severity="error" role="alert" sx={{ mt: 2 }}>
            {errorMessage(error)}
          </Alert>
        ) : null}
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        {/* For a destructive change the safe choice has the focus, so Enter does not lock someone out. */}
        <Button onClick={onCancel} disabled={busy} autoFocus={Boolean(change?.destructive)}>
          Cancel
        </Button>
        <Button
          variant="contained"
          color={change?.destructive ? 'error' : 'primary'}
          onClick={onConfirm}
          loading={busy}
          autoFocus={!change?.destructive}
        >
          {change?.confirmLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
