import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { paths } from '../../config/paths';
import { errorMessage } from '../../lib/api-client';

/**
 * The router's error element: a page that failed to render still leaves a way out. `embedded` is for pages
 * inside the app frame, which keeps its app bar and navigation.
 */
export function RouteError({ embedded = false }: { embedded?: boolean }) {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : errorMessage(error);
  return (
    <Box
      component={embedded ? 'section' : 'main'}
      role="alert"
      sx={embedded ? { maxWidth: 640 } : { maxWidth: 640, mx: 'auto', my: 8, px: 3 }}
    >
      <Typography variant="h1" gutterBottom>
        Something went wrong
      </Typography>
      <Typography sx={{ mb: 1 }}>This page stopped working. Reloading it usually helps.</Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        Details: {detail}
      </Typography>
      <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap' }}>
        <Button variant="contained" onClick={() => window.location.reload()}>
          Reload the page
        </Button>
        <Button variant="outlined" href={paths.home.getHref()}>
          Go to your home page
        </Button>
      </Box>
    </Box>
  );
}
