import { type FieldValues, type Path, type UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the API's per-field messages (`details: FieldError[]`) under the matching form fields.
 * Returns true when at least one message landed on a field; other errors are for the form as a whole.
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): boolean {
  if (!isApiError(error)) return false;
  let applied = false;
  for (const fieldError of error.fieldErrors) {
    const field = fields.find((f) => f === fieldError.field);
    if (!field || fieldError.messages.length === 0) continue;
    setError(field, { type: 'server', message: sentence(fieldError.messages.join('; ')) });
    applied = true;
  }
  return applied;
}

function sentence(text: string): string {
  const trimmed = text.trim();
  return trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
}
