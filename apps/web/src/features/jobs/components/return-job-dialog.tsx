import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type ReturnJobValues, returnJobSchema } from './job-action-schemas';

/** Sends a job back to its requester; the reason is required and shown on the job. */
export function ReturnJobDialog(props: FormDialogBaseProps<ReturnJobValues>) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<ReturnJobValues>({ resolver: zodResolver(returnJobSchema), defaultValues: { reason: '' } });
  return (
    <FormDialog
      open={props.open}
      titleId="return-title"
      title="Return the job"
      error={props.error}
      busy={props.busy}
      submitLabel="Return with this reason"
      submitColor="error"
      onSubmit={handleSubmit(props.onSubmit)}
      onClose={props.onClose}
    >
      <FormTextField
        sx={{ mt: 1 }}
        label="Reason"
        registration={register('reason')}
        error={errors.reason}
        multiline
        minRows={3}
      />
    </FormDialog>
  );
}
