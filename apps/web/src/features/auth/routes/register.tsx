import Typography from '@mui/material/Typography';
import { Navigate, useNavigate } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { useAccessToken } from '../../../lib/token-store';
import { RegisterForm } from '../components/register-form';

export function RegisterRoute() {
  const token = useAccessToken();
  const navigate = useNavigate();

  if (token) return <Navigate to={paths.home.getHref()} replace />;
  return (
    <AuthLayout title="Create an account">
      <title>Create an account · Kerfwright</title>
      <RegisterForm onSuccess={() => void navigate(paths.home.getHref(), { replace: true })} />
      <Typography sx={{ mt: 3 }}>
        Already have an account? <RouterLink to={paths.signIn.getHref()}>Sign in</RouterLink>
      </Typography>
    </AuthLayout>
  );
}
