import Typography from '@mui/material/Typography';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { RouterLink } from '../../../components/ui/router-link';
import { paths, redirectTarget } from '../../../config/paths';
import { useEndSessionOnArrival } from '../../../lib/auth';
import { useAccessToken } from '../../../lib/token-store';
import { SignInForm } from '../components/sign-in-form';

export function SignInRoute() {
  const token = useAccessToken();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const target = redirectTarget(search);
  const signingOut = useEndSessionOnArrival();

  // Signing out: the token goes in a moment (not to be taken for a signed-in visitor meanwhile).
  if (token && signingOut) return null;
  if (token) return <Navigate to={target} replace />;
  return (
    <AuthLayout title="Sign in">
      <title>Sign in · Kerfwright</title>
      <SignInForm onSuccess={() => void navigate(target, { replace: true })} />
      <Typography sx={{ mt: 3 }}>
        New to the workshop? <RouterLink to={paths.register.getHref()}>Create an account</RouterLink>
      </Typography>
    </AuthLayout>
  );
}
