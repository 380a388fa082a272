import { zodResolver } from '@hookform/resolvers/zod';
import Stack from '@mui/material/Stack';
import { useEffect } from 'react';
import { resetUnlessSame } from '../../../lib/reset-unless-same';
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

const NEW_REQUEST: RequestJobValues = { quantity: 1, notes: '' };

/**
 * Copies and a note for the workshop: for a new job, which it then requests, or (given `current`) for a
 * draft whose request its requester changes. Each opening starts from `current` or a fresh request, never
 * from what was typed and abandoned last time.
 */
export function RequestJobDialog({
  open,
  busy,
  error,
  onSubmit,
  onClose,
  current,
}: FormDialogBaseProps<RequestJobValues> & { current?: RequestJobValues }) {
  const start = current ?? NEW_REQUEST;
  const {
    register,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<RequestJobValues>({ resolver: zodResolver(requestJobSchema), defaultValues: start });
  useEffect(() => {
    if (open) resetUnlessSame({ getValues, reset }, start);
    // Only on opening: a job read again while the dialog is open does not wipe what is being typed.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open, reset]);
  const changing = current !== undefined;
  return (
    <FormDialog
      open={open}
      titleId="request-job-title"
      title={changing ? 'Change copies and notes' : 'Request a cut job'}
      intro={
        changing
          ? 'The job stays a draft until you request the cut again. A new number of copies is laid out anew when a fabricator prepares the job.'
          : 'A fabricator picks the material and machine settings and lays the pieces out; a supervisor approves the job before it is cut.'
      }
      error={error}
      busy={busy}
      submitLabel={changing ? 'Save the changes' : 'Request the cut'}
      onSubmit={handleSubmit(onSubmit)}
      onClose={onClose}
    >
      <Stack spacing={2}>
        <FormTextField
          label="Copies"
          type="number"
          // The first field: focused and selected once the dialog is open, so typing replaces the 1 (FormDialog).
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
