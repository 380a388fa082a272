import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type LoginInput, loginInputSchema, useLogin } from '../api/login';
import { AuthForm, useAuthSubmit } from './auth-form';

/** E-mail and password; on success the caller decides where to go. */
export function SignInForm({ onSuccess }: { onSuccess: () => void }) {
  const login = useLogin();
  const form = useForm<LoginInput>({
    resolver: zodResolver(loginInputSchema),
    defaultValues: { email: '', password: '' },
  });
  const {
    register,
    formState: { errors, isSubmitting },
  } = form;
  const { formError, onSubmit } = useAuthSubmit(
    form,
    ['email', 'password'],
    (values) => login.mutateAsync(values),
    onSuccess,
  );

  return (
    <AuthForm
      label="Sign in"
      formError={formError}
      onSubmit={onSubmit}
      submitting={isSubmitting}
      submitLabel="Sign in"
    >
      <FormTextField
        label="E-mail"
        type="email"
        autoComplete="username"
        autoFocus
        required
        registration={register('email')}
        error={errors.email}
      />
      <FormTextField
        label="Password"
        type="password"
        autoComplete="current-password"
        required
        registration={register('password')}
        error={errors.password}
      />
    </AuthForm>
  );
}
