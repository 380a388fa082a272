/**
 * The one way the app talks to the API: JSON over fetch, the bearer token attached, and every non-2xx answer
 * turned into an `ApiError` carrying the API's error body `{ statusCode, code, message, details?, requestId }`.
 * A 401 on a request that carried a token means the session is over: the token is dropped (signing the user
 * out everywhere in the app).
 */
import { type FieldError, isErrorBody } from '@kerfwright/contracts';
import { env } from '../config/env';
import { endRefusedSession, getAccessToken } from './token-store';

export class ApiError extends Error {
  override readonly name = 'ApiError';

  constructor(
    /** HTTP status; 0 when the API could not be reached at all. */
    readonly status: number,
    /** `AREA.REASON`, e.g. `AUTH.INVALID_CREDENTIALS`. */
    readonly code: string,
    message: string,
    readonly details: unknown = undefined,
    readonly requestId: string | undefined = undefined,
  ) {
    super(message);
  }

  /**
   * The per-field messages of a validation error (400) or a conflict naming a field (409), else []. A conflict
   * names its field either in a list like a validation error's or as one object, `{ field: 'name' }`, whose
   * message is the error's own ("A material with this name already exists"); see the services' AppErrors in
   * apps/api/src.
   */
  get fieldErrors(): FieldError[] {
    if (isFieldErrorList(this.details)) return this.details;
    const field = namedField(this.details);
    return field === null ? [] : [{ field, messages: [this.message] }];
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError;
}

/** The field an error's details name as one object (`{ field: 'name', … }`), else null. */
function namedField(details: unknown): string | null {
  if (typeof details !== 'object' || details === null || Array.isArray(details)) return null;
  const field = (details as { field?: unknown }).field;
  return typeof field === 'string' && field !== '' ? field : null;
}

export function isFieldErrorList(value: unknown): value is FieldError[] {
  return (
    Array.isArray(value) &&
    value.every(
      (item: unknown) =>
        typeof item === 'object' &&
        item !== null &&
        typeof (item as FieldError).field === 'string' &&
        Array.isArray((item as FieldError).messages) &&
        (item as FieldError).messages.every((m) => typeof m === 'string'),
    )
  );
}

/** Reads an error response into an ApiError, whatever its body holds (JSON error body, other JSON, HTML, nothing). */
export async function parseErrorResponse(response: Response): Promise<ApiError> {
  const text = await response.text().catch(() => '');
  let body: unknown = undefined;
  if (text) {
    try {
      body = JSON.parse(text);
    } catch {
      body = undefined;
    }
  }
  if (isErrorBody(body)) {
    return new ApiError(body.statusCode, body.code, body.message, body.details, body.requestId);
  }
  const fallback = response.statusText
    ? `The server answered ${response.status} ${response.statusText}`
    : `The server answered ${response.status}`;
  return new ApiError(
    response.status,
    `HTTP.${response.status}`,
    fallback,
    undefined,
    response.headers.get('x-request-id') ?? undefined,
  );
}

export type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
}

export function buildUrl(path: string, query?: Record<string, QueryValue>): string {
  const base = env.apiBaseUrl.replace(/\/$/, '');
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value === undefined || value === null || value === '') continue;
    search.set(key, String(value));
  }
  const qs = search.toString();
  return `${base}${path.startsWith('/') ? path : `/${path}`}${qs ? `?${qs}` : ''}`;
}

export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const token = getAccessToken();
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (token) headers.Authorization = `Bearer ${token}`;

  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      method: options.method ?? 'GET',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(
      0,
      'NETWORK.UNREACHABLE',
      'The Kerfwright service cannot be reached. Check the connection.',
    );
  }

  if (!response.ok) {
    const error = await parseErrorResponse(response);
    if (response.status === 401 && token) endRefusedSession(token);
    throw error;
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get: <T>(path: string, query?: Record<string, QueryValue>, signal?: AbortSignal) =>
    apiRequest<T>(path, { query, signal }),
  post: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'POST', body }),
  patch: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  put: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'PUT', body }),
};

/** Fetches a file with the bearer token and hands it to the browser as a download under `fileName`. */
export async function downloadFile(path: string, fileName: string): Promise<void> {
  const token = getAccessToken();
  const response = await fetch(buildUrl(path), {
    headers: token ? { Authorization: `Bearer ${token}` } : {},
  });
  if (!response.ok) {
    const error = await parseErrorResponse(response);
    if (response.status === 401 && token) endRefusedSession(token);
    throw error;
  }
  const url = URL.createObjectURL(await response.blob());
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** A sentence to show a person for any error thrown while talking to the API. */
export function errorMessage(error: unknown): string {
  if (isApiError(error)) return error.message;
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong.';
}
