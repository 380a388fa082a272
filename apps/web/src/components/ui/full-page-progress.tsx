import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';

/** Shown while something the whole page needs is on its way. */
export function FullPageProgress({ label }: { label: string }) {
  return (
    <Box
      role="status"
      aria-live="polite"
      sx={{ minHeight: '60vh', display: 'grid', placeItems: 'center', alignContent: 'center', gap: 2 }}
    >
      <CircularProgress aria-hidden="true" />
      <Typography color="text.secondary">{label}</Typography>
    </Box>
  );
}
