import Button, { type ButtonProps } from '@mui/material/Button';
import Dialog, { type DialogProps } from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import { type FormEvent, type ReactNode } from 'react';
import { FormErrorAlert } from './form-error-alert';
import { FOCUS_FIRST_FIELD_ON_OPEN } from './focus-first-field';

interface FormDialogProps {
  open: boolean;
  /** The title's element id, which names the dialog. */
  titleId: string;
  title: ReactNode;
  /** A sentence under the title: what the form does. */
  intro?: ReactNode;
  /** The API's answer about the whole form, shown above the fields. */
  error: unknown;
  /** The request is under way: the submit button spins and the dialog cannot be closed. */
  busy: boolean;
  submitLabel: ReactNode;
  submitColor?: ButtonProps['color'];
  /** The form's submit handler (e.g. react-hook-form's handleSubmit(...)). */
  onSubmit: (event: FormEvent<HTMLFormElement>) => unknown;
  onClose: () => void;
  maxWidth?: DialogProps['maxWidth'];
  /** The fields. */
  children: ReactNode;
}

/**
 * A form in a dialog: title, an optional intro, the form's error, the fields, then Cancel and submit. Once
 * open, the keyboard is in the first field (focusFirstField).
 */
export function FormDialog({
  open,
  titleId,
  title,
  intro,
  error,
  busy,
  submitLabel,
  submitColor,
  onSubmit,
  onClose,
  maxWidth = 'sm',
  children,
}: FormDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={busy ? undefined : onClose}
      fullWidth
      maxWidth={maxWidth}
      aria-labelledby={titleId}
      slotProps={{ transition: FOCUS_FIRST_FIELD_ON_OPEN }}
    >
      <form noValidate onSubmit={(event) => void onSubmit(event)}>
        <DialogTitle id={titleId}>{title}</DialogTitle>
        <DialogContent>
          {intro ? <DialogContentText sx={{ mb: 2 }}>{intro}</DialogContentText> : null}
          <FormErrorAlert error={error} />
          {children}
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" color={submitColor} loading={busy}>
            {submitLabel}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}

/** What every form dialog takes from its page: whether it is open, the request's state, and where values go. */
export interface FormDialogBaseProps<V> {
  open: boolean;
  busy: boolean;
  error: unknown;
  onSubmit: (values: V) => void;
  onClose: () => void;
}
