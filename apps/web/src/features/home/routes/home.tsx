import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Typography from '@mui/material/Typography';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { ROLE_LABELS } from '../../../config/roles';
import { useUser } from '../../../lib/auth';
import { HealthCard } from '../components/health-card';
import { ROLE_DUTIES } from '../components/role-duties';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'long' });

/** The first page after signing in: who you are, what your role does, and whether the service is well. */
export function HomeRoute() {
  const user = useUser();
  const role = ROLE_DUTIES[user.role];
  const roleLabel = ROLE_LABELS[user.role];

  return (
    <Box data-testid={`home-${user.role}`} sx={{ maxWidth: 1100 }}>
      <title>{`${roleLabel} home · Kerfwright`}</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        {roleLabel} home
      </Typography>
      <Typography sx={{ fontSize: '1.125rem', mb: 3 }}>
        Welcome, {user.displayName}. {role.summary}
      </Typography>

      <Box
        sx={{
          display: 'grid',
          gap: 2,
          gridTemplateColumns: { xs: '1fr', md: 'minmax(0, 3fr) minmax(0, 2fr)' },
          alignItems: 'start',
        }}
      >
        <Box sx={{ display: 'grid', gap: 2 }}>
          <Card component="section" aria-labelledby="duties-heading">
            <CardContent>
              <Typography id="duties-heading" variant="h2" gutterBottom>
                Your part in the workshop
              </Typography>
              <Box component="ul" sx={{ pl: 2.5, my: 0, '& li': { mb: 1 } }}>
                {role.duties.map((duty) => (
                  <li key={duty}>
                    <Typography component="span">{duty}</Typography>
                  </li>
                ))}
              </Box>
              {user.role === 'supervisor' ? (
                <Button variant="contained" component={Link} to={paths.people.getHref()} sx={{ mt: 1 }}>
                  Manage people
                </Button>
              ) : null}
            </CardContent>
          </Card>

          <Alert severity="info" component="section" aria-label="Safety">
            Laser and CNC work can injure people and start fires. Local codes, the machine maker&apos;s manual
            and this workshop&apos;s own rules always come first.
          </Alert>
        </Box>

        <Box sx={{ display: 'grid', gap: 2 }}>
          <HealthCard />
          <Card component="section" aria-labelledby="account-heading">
            <CardContent>
              <Typography id="account-heading" variant="h2" gutterBottom>
                Your account
              </Typography>
              <Box
                component="dl"
                sx={{ m: 0, display: 'grid', gridTemplateColumns: 'auto 1fr', columnGap: 2, rowGap: 1 }}
              >
                <Typography component="dt" color="text.secondary">
                  Name
                </Typography>
                <Typography component="dd" sx={{ m: 0 }}>
                  {user.displayName}
                </Typography>
                <Typography component="dt" color="text.secondary">
                  E-mail
                </Typography>
                <Typography component="dd" sx={{ m: 0, overflowWrap: 'anywhere' }}>
                  {user.email}
                </Typography>
                <Typography component="dt" color="text.secondary">
                  Role
                </Typography>
                <Typography component="dd" sx={{ m: 0 }}>
                  {roleLabel}
                </Typography>
                <Typography component="dt" color="text.secondary">
                  Member since
                </Typography>
                <Typography component="dd" sx={{ m: 0 }}>
                  {dateFormat.format(new Date(user.createdAt))}
                </Typography>
              </Box>
            </CardContent>
          </Card>
        </Box>
      </Box>
    </Box>
  );
}
