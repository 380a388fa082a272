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
    setError(field, {
      type: 'server',
      message: sentence(fieldError.messages.map((m) => withoutFieldName(m, fieldError.field)).join('; ')),
    });
    applied = true;
  }
  return applied;
}

function sentence(text: string): string {
  const trimmed = text.trim();
  return trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
}

/**
 * The API's validator starts a message with the field's own name ("displayName must not contain…"); under the
 * field, that name is already the label beside it, and read as a word ("DisplayName") it is not English.
 */
function withoutFieldName(message: string, field: string): string {
  const name = field.slice(field.lastIndexOf('.') + 1);
  for (const prefix of [`${field} `, `${name} `]) {
    if (message.startsWith(prefix)) return message.slice(prefix.length);
  }
  return message;
}
