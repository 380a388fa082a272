import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import { paths } from '../../config/paths';
import { RouterLink } from '../ui/router-link';

/** Shown when a signed-in user opens a page their role does not include. */
export function ForbiddenPanel() {
  return (
    <Box sx={{ maxWidth: 640, my: 2 }}>
      <Alert severity="warning">
        <AlertTitle>This page is not part of your role</AlertTitle>
        Ask a supervisor if you need it.{' '}
        <RouterLink to={paths.home.getHref()}>Back to your home page</RouterLink>
      </Alert>
    </Box>
  );
}
