import { type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { ReasonDialog, type ReasonValues } from '../../../components/ui/reason-dialog';

/** Sends a job back to its requester; the reason is required and shown on the job. */
export function ReturnJobDialog(props: FormDialogBaseProps<ReasonValues>) {
  return (
    <ReasonDialog
      {...props}
      titleId="return-title"
      title="Return the job"
      submitLabel="Return with this reason"
      tooShort="Say why the job goes back (at least 3 characters)"
    />
  );
}
