import { zodResolver } from '@hookform/resolvers/zod';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type RecordCutValues, recordCutSchema } from './job-action-schemas';

/** The operator records what the cut took: machine time, sheets and (optionally) the kerf measured on it. */
export function RecordCutDialog(props: {
  open: boolean;
  busy: boolean;
  error: unknown;
  defaultSheets: number;
  onSubmit: (v: RecordCutValues) => void;
  onClose: () => void;
}) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<RecordCutValues>({
    resolver: zodResolver(recordCutSchema),
    // The empty fields start undefined: NaN would be written into the number inputs as the text "NaN".
    defaultValues: { sheetsUsed: props.defaultSheets },
  });
  const n = { valueAsNumber: true } as const;
  return (
    <Dialog open={props.open} onClose={props.onClose} fullWidth maxWidth="sm" aria-labelledby="cut-title">
      <form noValidate onSubmit={handleSubmit(props.onSubmit)}>
        <DialogTitle id="cut-title">Record the cut</DialogTitle>
        <DialogContent>
          {props.error ? <FormErrorAlert error={props.error} /> : null}
          <Stack spacing={2} sx={{ mt: 1 }}>
            <FormTextField
              label="Machine time (minutes)"
              type="number"
              registration={register('actualMinutes', n)}
              error={errors.actualMinutes}
              slotProps={{ htmlInput: { step: 'any' } }}
            />
            <FormTextField
              label="Sheets used"
              type="number"
              registration={register('sheetsUsed', n)}
              error={errors.sheetsUsed}
            />
            <FormTextField
              label="Measured kerf (mm, optional)"
              type="number"
              registration={register('measuredKerfMm', n)}
              error={errors.measuredKerfMm}
              slotProps={{ htmlInput: { step: 'any' } }}
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={props.onClose}>Cancel</Button>
          <Button type="submit" variant="contained" disabled={props.busy}>
            Record the cut
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
