import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { type ReactNode } from 'react';

/** The frame for signing in and registering: the product name and one card, centred, on any screen. */
export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Box
      component="main"
      sx={{ minHeight: '100vh', display: 'grid', placeItems: 'center', px: 2, py: { xs: 3, sm: 6 } }}
    >
      <Box sx={{ width: '100%', maxWidth: 440 }}>
        <Typography
          component="p"
          variant="h5"
          sx={{ fontWeight: 700, color: 'primary.dark', mb: 0.5, textAlign: 'center' }}
        >
          Kerfwright
        </Typography>
        <Typography color="text.secondary" sx={{ mb: 3, textAlign: 'center' }}>
          Slotted sheet models, from design to cut.
        </Typography>
        <Paper variant="outlined" sx={{ p: { xs: 3, sm: 4 } }}>
          <Typography variant="h1" sx={{ fontSize: '1.6rem', mb: 3 }}>
            {title}
          </Typography>
          {children}
        </Paper>
      </Box>
    </Box>
  );
}
