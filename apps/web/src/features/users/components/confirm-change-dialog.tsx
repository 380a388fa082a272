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
  /** Cancel has the keyboard at first, so that Enter twice does not make the change (as for destructive). */
  cancelFirst?: boolean;
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
  const cancelFirst = Boolean(change?.destructive || change?.cancelFirst);
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
        {/* For a destructive or far-reaching change the safe choice has the focus, so Enter does not lock
            someone out or hand them every right. */}
        <Button onClick={onCancel} disabled={busy} autoFocus={cancelFirst}>
          Cancel
        </Button>
        <Button
          variant="contained"
          color={change?.destructive ? 'error' : 'primary'}
          onClick={onConfirm}
          loading={busy}
          autoFocus={!cancelFirst}
        >
          {change?.confirmLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
