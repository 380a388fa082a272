import { type JobAction, type JobState, transitionFor } from '@kerfwright/contracts';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';

interface ConfirmJobActionDialogProps {
  /** An action that needs no more than a yes (approve, release, close…). */
  action: JobAction;
  /** The job's state now. */
  from: JobState;
  busy: boolean;
  error: unknown;
  onConfirm: () => void;
  onClose: () => void;
}

/**
 * Asks before a job action is taken, wherever it is offered (the job page, Approvals): the action's own
 * words as the question, where the job moves, and a button that says what it does.
 */
export function ConfirmJobActionDialog({
  action,
  from,
  busy,
  error,
  onConfirm,
  onClose,
}: ConfirmJobActionDialogProps) {
  const { label, to } = transitionFor(action);
  return (
    <ConfirmDialog
      open
      titleId="confirm-title"
      title={`${label}?`}
      confirmLabel={label}
      busy={busy}
      error={error}
      onConfirm={onConfirm}
      onClose={onClose}
    >
      {`The job moves from ${from} to ${to}.`}
    </ConfirmDialog>
  );
}
