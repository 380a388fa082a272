/**
 * Stubs the network at the fetch boundary for component tests: each route answers with a real Response,
 * and every call is recorded so a test can check what the app actually sent.
 */
import { vi } from 'vitest';

export interface RecordedCall {
  method: string;
  url: URL;
  headers: Headers;
  body: unknown;
}

export type RouteHandler = (call: RecordedCall) => Response | Promise<Response>;

export function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

/** Routes are keyed "METHOD /path" (no query string); anything else answers 404 in the API's error shape. */
export function stubFetch(routes: Record<string, RouteHandler>) {
  const calls: RecordedCall[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const call: RecordedCall = {
      method: (init?.method ?? 'GET').toUpperCase(),
      url,
      headers: new Headers(init?.headers),
      body: typeof init?.body === 'string' ? JSON.parse(init.body) : undefined,
    };
    calls.push(call);
    const handler = routes[`${call.method} ${url.pathname}`];
    if (!handler) {
      return json(404, {
        statusCode: 404,
        code: 'ROUTE.NOT_FOUND',
        message: `No stub for ${call.method} ${url.pathname}`,
        requestId: 'test-request',
      });
    }
    return handler(call);
  });
  vi.stubGlobal('fetch', fetchMock);
  return { calls, fetchMock };
}
