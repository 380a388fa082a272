import { zodResolver } from '@hookform/resolvers/zod';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FormTextField } from '../../../components/ui/form-text-field';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';

export const requestJobSchema = z.object({
  quantity: z
    .number({ error: 'Enter how many copies' })
    .int('A whole number of copies')
    .min(1, 'At least 1 copy')
    .max(100, 'At most 100 copies'),
  notes: z.string().max(2000, 'At most 2000 characters'),
});
export type RequestJobValues = z.infer<typeof requestJobSchema>;

/** Asks for copies and a note for the workshop, then requests the cut. */
export function RequestJobDialog({
  open,
  busy,
  error,
  onSubmit,
  onClose,
}: {
  open: boolean;
  busy: boolean;
  error: unknown;
  onSubmit: (values: RequestJobValues) => void;
  onClose: () => void;
}) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<RequestJobValues>({
    resolver: zodResolver(requestJobSchema),
    defaultValues: { quantity: 1, notes: '' },
  });
  return (
    <Dialog open={open} onClose={onClose} aria-labelledby="request-job-title" fullWidth maxWidth="sm">
      <form noValidate onSubmit={handleSubmit(onSubmit)}>
        <DialogTitle id="request-job-title">Request a cut job</DialogTitle>
        <DialogContent>
          <DialogContentText sx={{ mb: 2 }}>
            A fabricator picks the material and machine settings and lays the pieces out; a supervisor
            approves the job before it is cut.
          </DialogContentText>
          <Stack spacing={2}>
            {error ? <FormErrorAlert error={error} /> : null}
            <FormTextField
              label="Copies"
              type="number"
              registration={register('quantity', { valueAsNumber: true })}
              error={errors.quantity}
            />
            <FormTextField
              label="Notes for the workshop"
              registration={register('notes')}
              error={errors.notes}
              multiline
              minRows={2}
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained" disabled={busy}>
            Request the cut
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
