import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';

/**
 * Duplicate with unsaved changes: the server copies the design as last saved, so the member chooses between
 * saving first (the copy then holds what is on screen) and a copy of the saved version without the changes.
 */
export function DuplicateDialog({
  open,
  savedVersion,
  canSave,
  busy,
  onSaveAndDuplicate,
  onDuplicateSaved,
  onClose,
}: {
  open: boolean;
  savedVersion: number;
  /** The member may save this design (its owner, or a supervisor); otherwise only the saved version is copied. */
  canSave: boolean;
  busy: boolean;
  onSaveAndDuplicate: () => void;
  onDuplicateSaved: () => void;
  onClose: () => void;
}) {
  return (
    <Dialog open={open} onClose={onClose} aria-labelledby="duplicate-title">
      <DialogTitle id="duplicate-title">Duplicate with unsaved changes?</DialogTitle>
      <DialogContent>
        <DialogContentText>
          {`A copy is made of the design as last saved (version ${savedVersion}): the changes you have not saved are not in it, and are left behind when the copy opens.`}
          {canSave
            ? ' Save them first to copy the design as you see it.'
            : ' Only its owner or a supervisor can save them.'}
        </DialogContentText>
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2, flexWrap: 'wrap', gap: 1 }}>
        <Button onClick={onClose}>Cancel</Button>
        <Button variant={canSave ? 'outlined' : 'contained'} disabled={busy} onClick={onDuplicateSaved}>
          {`Copy version ${savedVersion} without the changes`}
        </Button>
        {canSave ? (
          <Button variant="contained" disabled={busy} onClick={onSaveAndDuplicate}>
            Save, then duplicate
          </Button>
        ) : null}
      </DialogActions>
    </Dialog>
  );
}
