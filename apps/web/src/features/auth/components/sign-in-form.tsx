import { zodResolver } from '@hookform/resolvers/zod';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type LoginInput, loginInputSchema, useLogin } from '../api/login';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';

/** E-mail and password; on success the caller decides where to go. */
export function SignInForm({ onSuccess }: { onSuccess: () => void }) {
  const login = useLogin();
  const [formError, setFormError] = useState<unknown>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<LoginInput>({
    resolver: zodResolver(loginInputSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await login.mutateAsync(values);
      onSuccess();
    } catch (error) {
      if (!applyServerFieldErrors(error, setError, ['email', 'password'])) setFormError(error);
    }
  });

  return (
    <form noValidate onSubmit={(event) => void onSubmit(event)} aria-label="Sign in">
      <FormErrorAlert error={formError} />
      <Stack spacing={2.5}>
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
        <Button type="submit" variant="contained" size="large" loading={isSubmitting}>
          Sign in
        </Button>
      </Stack>
    </form>
  );
}
