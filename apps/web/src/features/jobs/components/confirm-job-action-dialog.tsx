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
  const { label, to, viaExport } = transitionFor(action);
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
      {viaExport
        ? // A release waits for its cut pack (the job stays approved meanwhile, its files being built on the
          // page): said before it is confirmed, not learnt from a state that did not change.
          `Its cut pack is built first; the job moves from ${from} to ${to} once its files are ready.`
        : `The job moves from ${from} to ${to}.`}
    </ConfirmDialog>
  );
}
