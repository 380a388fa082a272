import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { resetUnlessSame } from '../../../lib/reset-unless-same';
import { useForm } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type SendBackValues, sendBackSchema } from './send-back-schema';

/** Sends a profile version or a job back; the reason is required and shown to whoever submitted it. */
export function SendBackDialog(
  props: FormDialogBaseProps<SendBackValues> & {
    /** What goes back, e.g. "version 2 of CO2 laser". */
    subject: string;
    /** The verb on the title and button: "Send back" (a version) or "Return" (a job, as the job page says). */
    verb?: string;
  },
) {
  const {
    register,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<SendBackValues>({ resolver: zodResolver(sendBackSchema), defaultValues: { reason: '' } });
  useEffect(() => {
    if (props.open) resetUnlessSame({ getValues, reset }, { reason: '' });
  }, [props.open, reset, getValues]);
  const submit = handleSubmit((v) => props.onSubmit(v));
  return (
    <FormDialog
      open={props.open}
      titleId="send-back-title"
      title={`${props.verb ?? 'Send back'} ${props.subject}`}
      intro={
        // "Return" is said of a job (as the job page says), "Send back" of a profile version. A returned job is
        // reopened as a draft, whose copies and notes its requester can change (PATCH /api/jobs/:id);
        // requesting it again takes the design as saved then (the API's request copies the design's spec).
        props.verb === 'Return'
          ? 'The job goes back to its requester with your reason. They can reopen it, change the number of ' +
            'copies and the notes, and request the cut again, which takes their design as saved by then (so ' +
            'they can change the design first).'
          : 'The version goes back to its author as a draft with your reason; they can change it and submit it again.'
      }
      error={props.error}
      busy={props.busy}
      submitLabel={`${props.verb ?? 'Send back'} with this reason`}
      submitColor="error"
      onSubmit={submit}
      onClose={props.onClose}
    >
      <FormTextField
        label="Reason"
        registration={register('reason')}
        error={errors.reason}
        multiline
        minRows={3}
      />
    </FormDialog>
  );
}
