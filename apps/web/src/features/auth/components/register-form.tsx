import { zodResolver } from '@hookform/resolvers/zod';
import { PASSWORD_MIN_LENGTH } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type RegisterInput, registerInputSchema, useRegister } from '../api/register';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';

/** A new member's account. Everyone who registers starts as a hobbyist; a supervisor can change that. */
export function RegisterForm({ onSuccess }: { onSuccess: () => void }) {
  const registerAccount = useRegister();
  const [formError, setFormError] = useState<unknown>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<RegisterInput>({
    resolver: zodResolver(registerInputSchema),
    defaultValues: { displayName: '', email: '', password: '', confirmPassword: '' },
  });

  const onSubmit = handleSubmit(async ({ displayName, email, password }) => {
    setFormError(null);
    try {
      await registerAccount.mutateAsync({ displayName, email, password });
      onSuccess();
    } catch (error) {
      if (!applyServerFieldErrors(error, setError, ['displayName', 'email', 'password'])) {
        setFormError(error);
      }
    }
  });

  return (
    <form noValidate onSubmit={(event) => void onSubmit(event)} aria-label="Create an account">
      <FormErrorAlert error={formError} />
      <Stack spacing={2.5}>
        <FormTextField
          label="Your name"
          autoComplete="name"
          autoFocus
          required
          helperText="Shown to the workshop team on your jobs."
          registration={register('displayName')}
          error={errors.displayName}
        />
        <FormTextField
          label="E-mail"
          type="email"
          autoComplete="email"
          required
          registration={register('email')}
          error={errors.email}
        />
        <FormTextField
          label="Password"
          type="password"
          autoComplete="new-password"
          required
          helperText={`At least ${PASSWORD_MIN_LENGTH} characters. A short sentence is easy to remember.`}
          registration={register('password')}
          error={errors.password}
        />
        <FormTextField
          label="Repeat password"
          type="password"
          autoComplete="new-password"
          required
          registration={register('confirmPassword')}
          error={errors.confirmPassword}
        />
        <Button type="submit" variant="contained" size="large" loading={isSubmitting}>
          Create account
        </Button>
      </Stack>
    </form>
  );
}
