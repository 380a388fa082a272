import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import { type ReactNode, useEffect, useRef } from 'react';
import { useBlocker } from 'react-router-dom';

/**
 * Asks before unsaved edits are lost: a link or Back inside the app opens a dialog (React Router's blocker),
 * a reload or closing the tab gets the browser's own question (beforeunload). Nothing is asked while
 * `dirty` is false. Set `leaving.current` just before a navigation the page makes itself after saving, when
 * the form's new state has not rendered yet.
 */
export function useUnsavedChangesGuard(dirty: boolean): {
  leaving: { current: boolean };
  dialog: ReactNode;
} {
  const leaving = useRef(false);
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) =>
      dirty &&
      !leaving.current &&
      (currentLocation.pathname !== nextLocation.pathname || currentLocation.search !== nextLocation.search),
  );

  useEffect(() => {
    if (!dirty) return;
    const ask = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      // Older browsers show their question only when returnValue is set.
      event.returnValue = '';
    };
    window.addEventListener('beforeunload', ask);
    return () => window.removeEventListener('beforeunload', ask);
  }, [dirty]);

  // Saved meanwhile (e.g. the edits were saved while the dialog was open): let the navigation go on.
  useEffect(() => {
    if (blocker.state === 'blocked' && !dirty) blocker.proceed();
  }, [blocker, dirty]);

  const dialog = (
    <Dialog
      open={blocker.state === 'blocked'}
      onClose={() => blocker.reset?.()}
      aria-labelledby="unsaved-changes-title"
    >
      <DialogTitle id="unsaved-changes-title">Leave without saving?</DialogTitle>
      <DialogContent>
        <DialogContentText>
          This design has changes that are not saved yet. They are lost if you leave the studio now.
        </DialogContentText>
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        <Button onClick={() => blocker.reset?.()}>Stay in the studio</Button>
        <Button variant="contained" color="error" onClick={() => blocker.proceed?.()}>
          Leave without saving
        </Button>
      </DialogActions>
    </Dialog>
  );
  return { leaving, dialog };
}
