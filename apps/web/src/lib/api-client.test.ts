import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiRequest, buildUrl, parseErrorResponse } from './api-client';
import { getAccessToken, setAccessToken } from './token-store';

// The error body shape is the API's contract (libs/contracts/src/errors.ts): { statusCode, code, message,
// details?, requestId }, with details a FieldError[] for validation failures.
const validationBody = {
  statusCode: 400,
  code: 'VALIDATION.FAILED',
  message: 'Invalid request: email (email must be an e-mail address)',
  details: [{ field: 'email', messages: ['email must be an e-mail address'] }],
  requestId: 'req-123',
};

function jsonResponse(status: number, body: unknown, statusText = ''): Response {
  return new Response(JSON.stringify(body), {
    status,
    statusText,
    headers: { 'Content-Type': 'application/json' },
  });
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('parseErrorResponse', () => {
  it('reads the API error body into a typed ApiError with its field errors', async () => {
    const error = await parseErrorResponse(jsonResponse(400, validationBody));
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe('VALIDATION.FAILED');
    expect(error.message).toBe(validationBody.message);
    expect(error.requestId).toBe('req-123');
    expect(error.fieldErrors).toEqual([{ field: 'email', messages: ['email must be an e-mail address'] }]);
  });

  it('reads a conflict that names its field as one object as that field’s error, in its own words', async () => {
    // The API's duplicate-name answer (apps/api/src/materials/materials.service.ts, mapDbErrors).
    const body = {
      statusCode: 409,
      code: 'MATERIAL.NAME_TAKEN',
      message: 'A material with this name already exists',
      details: { field: 'name' },
      requestId: 'req-409',
    };
    const error = await parseErrorResponse(jsonResponse(409, body));
    expect(error.fieldErrors).toEqual([{ field: 'name', messages: [body.message] }]);
  });

  it('keeps details that are not field errors out of fieldErrors', async () => {
    const body = {
      statusCode: 503,
      code: 'SERVICE.DEGRADED',
      message: 'A backing service is down',
      details: { status: 'degraded', database: 'up', redis: 'down', version: '0.1.0' },
      requestId: 'req-9',
    };
    const error = await parseErrorResponse(jsonResponse(503, body));
    expect(error.code).toBe('SERVICE.DEGRADED');
    expect(error.details).toEqual(body.details);
    expect(error.fieldErrors).toEqual([]);
  });

  it('falls back to the HTTP status when the body is not the API error shape (a proxy page)', async () => {
    const response = new Response('<html>Bad gateway</html>', {
      status: 502,
      statusText: 'Bad Gateway',
      headers: { 'Content-Type': 'text/html' },
    });
    const error = await parseErrorResponse(response);
    expect(error.status).toBe(502);
    expect(error.code).toBe('HTTP.502');
    expect(error.message).toBe('The server answered 502 Bad Gateway');
    expect(error.requestId).toBeUndefined();
  });

  it('treats JSON that lacks required fields as not an error body', async () => {
    const error = await parseErrorResponse(jsonResponse(400, { statusCode: 400, message: 'partial' }));
    expect(error.code).toBe('HTTP.400');
  });
});

describe('apiRequest', () => {
  it('sends JSON with the bearer token and returns the parsed body', async () => {
    setAccessToken('token-abc');
    const fetchMock = vi.fn(async () => jsonResponse(200, { ok: true }));
    vi.stubGlobal('fetch', fetchMock);

    const result = await apiRequest<{ ok: boolean }>('/users/42', {
      method: 'PATCH',
      body: { active: false },
    });

    expect(result).toEqual({ ok: true });
    expect(fetchMock).toHaveBeenCalledTimes(1);
    const [url, init] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    expect(url).toBe('/api/users/42');
    expect(init.method).toBe('PATCH');
    expect(init.body).toBe('{"active":false}');
    const headers = init.headers as Record<string, string>;
    expect(headers.Authorization).toBe('Bearer token-abc');
    expect(headers['Content-Type']).toBe('application/json');
  });

  it('sends no Authorization header when signed out', async () => {
    const fetchMock = vi.fn(async () => jsonResponse(200, {}));
    vi.stubGlobal('fetch', fetchMock);
    await apiRequest('/health');
    const [, init] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    expect((init.headers as Record<string, string>).Authorization).toBeUndefined();
  });

  it('throws the parsed ApiError for a non-2xx answer', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonResponse(400, validationBody)),
    );
    await expect(apiRequest('/auth/register', { method: 'POST', body: {} })).rejects.toMatchObject({
      status: 400,
      code: 'VALIDATION.FAILED',
      requestId: 'req-123',
    });
  });

  it('signs the user out when the API rejects their token with 401', async () => {
    setAccessToken('expired-token');
    const body = { statusCode: 401, code: 'AUTH.UNAUTHENTICATED', message: 'Sign in first', requestId: 'r' };
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonResponse(401, body)),
    );
    await expect(apiRequest('/auth/me')).rejects.toMatchObject({ status: 401 });
    expect(getAccessToken()).toBeNull();
  });

  it('keeps a session begun while a request of the last one was on its way, whatever it is answered', async () => {
    setAccessToken('old-token');
    const body = { statusCode: 401, code: 'AUTH.UNAUTHENTICATED', message: 'Sign in first', requestId: 'r' };
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => {
        // Signed in again before the old token's answer came back.
        setAccessToken('new-token');
        return jsonResponse(401, body);
      }),
    );
    await expect(apiRequest('/auth/me')).rejects.toMatchObject({ status: 401 });
    expect(getAccessToken()).toBe('new-token');
  });

  it('keeps the token on a 403: the user is signed in, just not allowed', async () => {
    setAccessToken('valid-token');
    const body = { statusCode: 403, code: 'AUTH.FORBIDDEN', message: 'Needs supervisor', requestId: 'r' };
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonResponse(403, body)),
    );
    await expect(apiRequest('/users')).rejects.toMatchObject({ status: 403 });
    expect(getAccessToken()).toBe('valid-token');
  });

  it('reports an unreachable API as a network ApiError', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => {
        throw new TypeError('Failed to fetch');
      }),
    );
    await expect(apiRequest('/health')).rejects.toMatchObject({ status: 0, code: 'NETWORK.UNREACHABLE' });
  });
});

describe('buildUrl', () => {
  it('adds only the query values that are set', () => {
    expect(
      buildUrl('/users', { page: 2, pageSize: 25, sort: '-email', q: '', role: undefined, active: false }),
    ).toBe('/api/users?page=2&pageSize=25&sort=-email&active=false');
  });
});
