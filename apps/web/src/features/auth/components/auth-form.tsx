import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { type FormEvent, type ReactNode, useEffect, useRef, useState } from 'react';
import { type FieldValues, type Path, type UseFormReturn } from 'react-hook-form';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { applyServerFieldErrors } from '../../../lib/form-errors';

/**
 * Submits an account form: the API's per-field messages go under `fields`, any other failure is kept as the
 * form's error; on success the caller decides where to go.
 */
export function useAuthSubmit<T extends FieldValues>(
  form: Pick<UseFormReturn<T>, 'handleSubmit' | 'setError'>,
  fields: readonly Path<T>[],
  send: (values: T) => Promise<unknown>,
  onSuccess: () => void,
) {
  const [formError, setFormError] = useState<unknown>(null);
  const submit = form.handleSubmit(async (values) => {
    try {
      await send(values);
      onSuccess();
    } catch (error) {
      if (!applyServerFieldErrors(error, form.setError, fields)) setFormError(error);
    }
  });
  // A new attempt drops the last answer before the fields are checked: the old message no longer applies,
  // even when this attempt stops at an empty or malformed field.
  const onSubmit = (event?: FormEvent<HTMLFormElement>) => {
    setFormError(null);
    return submit(event);
  };
  return { formError, onSubmit };
}

/** An account form's frame: the form-wide error, the fields and the submit button. */
export function AuthForm({
  label,
  formError,
  onSubmit,
  submitting,
  submitLabel,
  children,
}: {
  /** The form's accessible name. */
  label: string;
  formError: unknown;
  onSubmit: (event: FormEvent<HTMLFormElement>) => Promise<void>;
  submitting: boolean;
  submitLabel: string;
  children: ReactNode;
}) {
  // The button is disabled while the form is sent, so the keyboard falls to the page when it was there: a
  // failed attempt puts it on the message instead (Tab then goes on to the first field).
  const message = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!formError) return;
    // Enter pressed in a field leaves the keyboard there, next to what to correct.
    const at = document.activeElement;
    const inField = at instanceof HTMLInputElement && message.current?.closest('form')?.contains(at) === true;
    if (!inField) message.current?.focus();
  }, [formError]);
  return (
    <form noValidate onSubmit={(event) => void onSubmit(event)} aria-label={label}>
      <Box ref={message} tabIndex={-1} sx={{ '&:focus': { outline: 'none' } }} data-testid="form-message">
        <FormErrorAlert error={formError} />
      </Box>
      <Stack spacing={2.5}>
        {children}
        <Button type="submit" variant="contained" size="large" loading={submitting}>
          {submitLabel}
        </Button>
      </Stack>
    </form>
  );
}
