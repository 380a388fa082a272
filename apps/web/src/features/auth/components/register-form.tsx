import { zodResolver } from '@hookform/resolvers/zod';
import { PASSWORD_MIN_LENGTH } from '@kerfwright/contracts';
import { useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type RegisterInput, registerInputSchema, useRegister } from '../api/register';
import { AuthForm, useAuthSubmit } from './auth-form';

/** A new member's account. Everyone who registers starts as a hobbyist; a supervisor can change that. */
export function RegisterForm({ onSuccess }: { onSuccess: () => void }) {
  const registerAccount = useRegister();
  const form = useForm<RegisterInput>({
    resolver: zodResolver(registerInputSchema),
    defaultValues: { displayName: '', email: '', password: '', confirmPassword: '' },
  });
  const {
    register,
    formState: { errors, isSubmitting },
  } = form;
  const { formError, onSubmit } = useAuthSubmit(
    form,
    ['displayName', 'email', 'password'],
    ({ displayName, email, password }) => registerAccount.mutateAsync({ displayName, email, password }),
    onSuccess,
  );

  return (
    <AuthForm
      label="Create an account"
      formError={formError}
      onSubmit={onSubmit}
      submitting={isSubmitting}
      submitLabel="Create account"
    >
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
    </AuthForm>
  );
}
