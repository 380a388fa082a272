import { zodResolver } from '@hookform/resolvers/zod';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import { useForm } from 'react-hook-form';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type ReturnJobValues, returnJobSchema } from './job-action-schemas';

/** Sends a job back to its requester; the reason is required and shown on the job. */
export function ReturnJobDialog(props: {
  open: boolean;
  busy: boolean;
  error: unknown;
  onSubmit: (v: ReturnJobValues) => void;
  onClose: () => void;
}) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<ReturnJobValues>({ resolver: zodResolver(returnJobSchema), defaultValues: { reason: '' } });
  return (
    <Dialog open={props.open} onClose={props.onClose} fullWidth maxWidth="sm" aria-labelledby="return-title">
      <form noValidate onSubmit={handleSubmit(props.onSubmit)}>
        <DialogTitle id="return-title">Return the job</DialogTitle>
        <DialogContent>
          {props.error ? <FormErrorAlert error={props.error} /> : null}
          <FormTextField
            sx={{ mt: 1 }}
            label="Reason"
            registration={register('reason')}
            error={errors.reason}
            multiline
            minRows={3}
          />
        </DialogContent>
        <DialogActions>
          <Button onClick={props.onClose}>Cancel</Button>
          <Button type="submit" color="error" variant="contained" disabled={props.busy}>
            Return with this reason
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
