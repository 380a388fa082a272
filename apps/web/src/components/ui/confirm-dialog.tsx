import Button, { type ButtonProps } from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Typography from '@mui/material/Typography';
import { type ReactNode } from 'react';
import { FormErrorAlert } from './form-error-alert';

interface ConfirmDialogProps {
  open: boolean;
  /** The title's element id, which names the dialog. */
  titleId: string;
  /** The question: "Approve the job?". */
  title: ReactNode;
  /** What confirming does. */
  children: ReactNode;
  /** Says what the button does, in the words of the button that opened the dialog ("Approve the job"). */
  confirmLabel: ReactNode;
  confirmColor?: ButtonProps['color'];
  /** More than a sentence below it (a list, a box to tick), outside the sentence's paragraph. */
  extra?: ReactNode;
  /** Confirming waits for something the dialog asks (a box ticked). */
  confirmDisabled?: boolean;
  /** The request is under way: the button spins and the dialog cannot be closed. */
  busy: boolean;
  /** The API's refusal, if there is one. */
  error: unknown;
  onConfirm: () => void;
  onClose: () => void;
}

/** Asks before a step that needs nothing more than a yes: what it does, then Cancel and the step itself. */
export function ConfirmDialog({
  open,
  titleId,
  title,
  children,
  confirmLabel,
  confirmColor,
  extra,
  confirmDisabled = false,
  busy,
  error,
  onConfirm,
  onClose,
}: ConfirmDialogProps) {
  return (
    <Dialog open={open} onClose={busy ? undefined : onClose} aria-labelledby={titleId}>
      <DialogTitle id={titleId}>{title}</DialogTitle>
      <DialogContent>
        <FormErrorAlert error={error} />
        <Typography>{children}</Typography>
        {extra}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose} disabled={busy}>
          Cancel
        </Button>
        <Button
          variant="contained"
          color={confirmColor}
          loading={busy}
          disabled={confirmDisabled}
          onClick={onConfirm}
        >
          {confirmLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
