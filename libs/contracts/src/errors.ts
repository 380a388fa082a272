/**
 * The one error body every non-2xx API response carries.
 * `code` reads AREA.REASON, for example `AUTH.INVALID_CREDENTIALS` or `MACHINE_PROFILE.NOT_APPROVED`.
 */
export interface ErrorBody {
  statusCode: number;
  code: string;
  message: string;
  details?: unknown;
  requestId: string;
}

/** A field that failed validation, as listed in `details` of a 400 response. */
export interface FieldError {
  field: string;
  messages: string[];
}

export function isErrorBody(value: unknown): value is ErrorBody {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  return (
    typeof v.statusCode === 'number' &&
    typeof v.code === 'string' &&
    typeof v.message === 'string' &&
    typeof v.requestId === 'string'
  );
}
