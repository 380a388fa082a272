import Snackbar from '@mui/material/Snackbar';

/** A short confirmation at the bottom of the page ("… is saved."); null hides it. */
export function NoticeSnackbar({
  notice,
  onClose,
  autoHideMs = 5000,
}: {
  notice: string | null;
  onClose: () => void;
  autoHideMs?: number;
}) {
  return (
    <Snackbar
      open={notice !== null}
      autoHideDuration={autoHideMs}
      onClose={onClose}
      message={notice ?? ''}
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
    />
  );
}
