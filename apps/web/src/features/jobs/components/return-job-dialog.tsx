import { type JobState } from '@kerfwright/contracts';
import { type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { ReasonDialog, type ReasonValues } from '../../../components/ui/reason-dialog';

/**
 * What a return does, said before it is confirmed (as Approvals says it): a released job is also taken back
 * from the machines, its files withdrawn and the operators told by mail not to cut it.
 */
export function returnJobIntro(from: JobState | undefined): string {
  const back =
    'It goes back to its requester with your reason; they can reopen it as a draft, change the copies and ' +
    'the notes, and request the cut again.';
  return from === 'released'
    ? `The job is taken back from the machines: its files are no longer offered, and the operators are told not to cut it. ${back}`
    : back;
}

/** Sends a job back to its requester; the reason is required and shown on the job. */
export function ReturnJobDialog(props: FormDialogBaseProps<ReasonValues> & { from?: JobState }) {
  const { from, ...dialog } = props;
  return (
    <ReasonDialog
      {...dialog}
      titleId="return-title"
      title="Return the job"
      intro={returnJobIntro(from)}
      submitLabel="Return with this reason"
      tooShort="Say why the job goes back (at least 3 characters)"
    />
  );
}
