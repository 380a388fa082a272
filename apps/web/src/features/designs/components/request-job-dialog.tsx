import { zodResolver } from '@hookform/resolvers/zod';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FormTextField } from '../../../components/ui/form-text-field';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';

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
}: FormDialogBaseProps<RequestJobValues>) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<RequestJobValues>({
    resolver: zodResolver(requestJobSchema),
    defaultValues: { quantity: 1, notes: '' },
  });
  return (
    <FormDialog
      open={open}
      titleId="request-job-title"
      title="Request a cut job"
      intro="A fabricator picks the material and machine settings and lays the pieces out; a supervisor approves the job before it is cut."
      error={error}
      busy={busy}
      submitLabel="Request the cut"
      onSubmit={handleSubmit(onSubmit)}
      onClose={onClose}
    >
      <Stack spacing={2}>
        <FormTextField
          label="Copies"
          type="number"
          // The one field most requests change: focused (and selected, so typing replaces the 1) on opening.
          autoFocus
          onFocus={(event) => event.target.select()}
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
    </FormDialog>
  );
}
