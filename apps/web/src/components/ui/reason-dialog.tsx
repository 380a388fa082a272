import { zodResolver } from '@hookform/resolvers/zod';
import { type ReactNode, useEffect, useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { resetUnlessSame } from '../../lib/reset-unless-same';
import { FormDialog, type FormDialogBaseProps } from './form-dialog';
import { FormTextField } from './form-text-field';

/** What a reason dialog hands on: the reason, trimmed. */
export interface ReasonValues {
  reason: string;
}

/** The API keeps reasons of 3 to 2000 characters once trimmed (jobs returned, versions sent back or retired). */
const REASON_MAX = 2000;

/** A reason of 3–2000 characters once trimmed; `tooShort` says what the reason is for. */
export function reasonSchema(tooShort: string) {
  return z.object({
    reason: z.string().trim().min(3, tooShort).max(REASON_MAX, `At most ${REASON_MAX} characters`),
  });
}

/**
 * A decision that needs a reason (a job returned, a version sent back, a machine taken out of use): title, what
 * follows from it, one Reason field, and a red submit button. The field empties each time the dialog opens.
 */
export function ReasonDialog(
  props: FormDialogBaseProps<ReasonValues> & {
    titleId: string;
    title: string;
    intro?: ReactNode;
    submitLabel: string;
    /** The message when the reason is missing or under 3 characters ("Say why the job goes back…"). */
    tooShort: string;
  },
) {
  const schema = useMemo(() => reasonSchema(props.tooShort), [props.tooShort]);
  const {
    register,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<ReasonValues>({ resolver: zodResolver(schema), defaultValues: { reason: '' } });
  useEffect(() => {
    if (props.open) resetUnlessSame({ getValues, reset }, { reason: '' });
  }, [props.open, reset, getValues]);
  return (
    <FormDialog
      open={props.open}
      titleId={props.titleId}
      title={props.title}
      intro={props.intro}
      error={props.error}
      busy={props.busy}
      submitLabel={props.submitLabel}
      submitColor="error"
      onSubmit={handleSubmit((v) => props.onSubmit(v))}
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
