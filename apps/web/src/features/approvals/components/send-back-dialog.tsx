import { type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { ReasonDialog, type ReasonValues } from '../../../components/ui/reason-dialog';

/** Sends a profile version or a job back; the reason is required and shown to whoever submitted it. */
export function SendBackDialog(
  props: FormDialogBaseProps<ReasonValues> & {
    /** What goes back, e.g. "version 2 of CO2 laser". */
    subject: string;
    /** The verb on the title and button: "Send back" (a version) or "Return" (a job, as the job page says). */
    verb?: string;
  },
) {
  const { subject, verb = 'Send back', ...dialog } = props;
  return (
    <ReasonDialog
      {...dialog}
      titleId="send-back-title"
      title={`${verb} ${subject}`}
      intro={
        // "Return" is said of a job (as the job page says), "Send back" of a profile version. A returned job is
        // reopened as a draft, whose copies and notes its requester can change (PATCH /api/jobs/:id);
        // requesting it again takes the design as saved then (the API's request copies the design's spec).
        verb === 'Return'
          ? 'The job goes back to its requester with your reason. They can reopen it, change the number of ' +
            'copies and the notes, and request the cut again, which takes their design as saved by then (so ' +
            'they can change the design first).'
          : 'The version goes back to its author as a draft with your reason; they can change it and submit it again.'
      }
      submitLabel={`${verb} with this reason`}
      tooShort="Say what must change (at least 3 characters)"
    />
  );
}
