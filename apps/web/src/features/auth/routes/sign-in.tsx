import Alert from '@mui/material/Alert';
import Typography from '@mui/material/Typography';
import { useEffect, useState } from 'react';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { RouterLink } from '../../../components/ui/router-link';
import { paths, redirectTarget } from '../../../config/paths';
import { useEndSessionOnArrival } from '../../../lib/auth';
import { forgetSessionEnded, sessionEndedNotice, useAccessToken } from '../../../lib/token-store';
import { SignInForm } from '../components/sign-in-form';

export function SignInRoute() {
  const token = useAccessToken();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const target = redirectTarget(search);
  const signingOut = useEndSessionOnArrival();
  // Sent here because the API refused the session: said once, then forgotten.
  const [ended] = useState(sessionEndedNotice);
  useEffect(() => {
    if (ended) forgetSessionEnded();
  }, [ended]);

  // Signing out: the token goes in a moment (not to be taken for a signed-in visitor meanwhile).
  if (token && signingOut) return null;
  if (token) return <Navigate to={target} replace />;
  return (
    <AuthLayout title="Sign in">
      <title>Sign in · Kerfwright</title>
      {ended ? (
        <Alert severity="info" sx={{ mb: 2 }} data-testid="session-ended">
          You were signed out: your session has ended. It may have expired, or your account was changed or
          deactivated. Sign in again; if that is refused, ask a supervisor.
        </Alert>
      ) : null}
      <SignInForm onSuccess={() => void navigate(target, { replace: true })} />
      <Typography sx={{ mt: 3 }}>
        New to the workshop? <RouterLink to={paths.register.getHref()}>Create an account</RouterLink>
      </Typography>
    </AuthLayout>
  );
}
