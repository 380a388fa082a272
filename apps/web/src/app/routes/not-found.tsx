import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { Link, useLocation } from 'react-router-dom';
import { paths } from '../../config/paths';

/** Any address the app does not know. */
export function NotFoundRoute() {
  const location = useLocation();
  return (
    <Box
      component="main"
      data-testid="not-found"
      sx={{ maxWidth: 640, mx: 'auto', my: { xs: 6, sm: 12 }, px: 3 }}
    >
      <Typography variant="overline" color="secondary.dark" component="p">
        Error 404
      </Typography>
      <Typography variant="h1" gutterBottom>
        Page not found
      </Typography>
      <Typography sx={{ mb: 3 }}>
        There is no page at <code>{location.pathname}</code>. Check the address, or start again from your home
        page.
      </Typography>
      <Button variant="contained" component={Link} to={paths.home.getHref()}>
        Go to your home page
      </Button>
    </Box>
  );
}
