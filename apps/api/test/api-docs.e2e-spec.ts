import { type RegisteredRoute, registeredRoutes } from './support/registered-routes';
import { startTestApp, type TestContext } from './support/test-app';

jest.setTimeout(60000);

/**
 * /api/docs must describe every route's request and response shapes. The OpenAPI 3 rules checked here:
 * a Response Object's `content` maps media types to Media Type Objects whose `schema` describes the body,
 * and an operation that takes a body describes it with a Request Body Object (OpenAPI Specification 3.0.3,
 * §4.7.10 Operation Object, §4.7.13 Request Body Object, §4.7.17 Response Object). 204 No Content carries no
 * body (RFC 9110 §15.3.5), so a documented 204 needs no `content`.
 */

interface MediaType {
  schema?: Record<string, unknown>;
}
interface Operation {
  responses?: Record<string, { description?: string; content?: Record<string, MediaType> }>;
  requestBody?: { content?: Record<string, MediaType> };
}
interface OpenApiDoc {
  openapi: string;
  paths: Record<string, Record<string, Operation>>;
}

const HTTP_METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'];

/** True when a media-type map names at least one content type and gives every one of them a schema. */
function describesBody(content: Record<string, MediaType> | undefined): boolean {
  const types = Object.entries(content ?? {});
  return (
    types.length > 0 && types.every(([, m]) => m.schema !== undefined && Object.keys(m.schema).length > 0)
  );
}

/** Why an operation's success answer is undocumented, or null when it has a 204 or a 2xx with a body shape. */
function successProblem(op: Operation): string | null {
  const success = Object.entries(op.responses ?? {}).filter(([code]) => /^2(\d\d|XX)$/.test(code));
  if (success.length === 0) return 'no 2xx response';
  if (success.some(([code, r]) => code === '204' || describesBody(r.content))) return null;
  return `2xx response(s) ${success.map(([c]) => c).join(', ')} without a content type and schema`;
}

/** Why an operation's request body is undocumented, or null when it has one with a content type and schema. */
function requestBodyProblem(op: Operation): string | null {
  if (!op.requestBody) return 'no requestBody';
  return describesBody(op.requestBody.content) ? null : 'requestBody without a content type and schema';
}

describe('the checks themselves', () => {
  it('refuse a 200 with only a description, and accept a schema, a declared binary type or a 204', () => {
    expect(successProblem({ responses: { '200': { description: 'ok' } } })).toMatch(/without/);
    expect(successProblem({ responses: { '200': { content: { 'application/json': {} } } } })).toMatch(
      /without/,
    );
    expect(
      successProblem({
        responses: { '401': { content: { 'application/json': { schema: { type: 'object' } } } } },
      }),
    ).toBe('no 2xx response');
    expect(
      successProblem({
        responses: {
          '200': { content: { 'application/pdf': { schema: { type: 'string', format: 'binary' } } } },
        },
      }),
    ).toBeNull();
    expect(successProblem({ responses: { '204': { description: 'gone' } } })).toBeNull();
    expect(requestBodyProblem({})).toBe('no requestBody');
    expect(
      requestBodyProblem({ requestBody: { content: { 'application/json': { schema: { $ref: '#/x' } } } } }),
    ).toBeNull();
  });
});

describe('OpenAPI document at /api/docs-json', () => {
  let ctx: TestContext;
  let doc: OpenApiDoc;
  let routes: RegisteredRoute[];

  beforeAll(async () => {
    ctx = await startTestApp();
    doc = (await ctx.http.get('/api/docs-json').expect(200)).body as OpenApiDoc;
    routes = registeredRoutes(ctx);
  });

  afterAll(async () => {
    await ctx?.app.close();
  });

  const operations = () =>
    Object.entries(doc.paths).flatMap(([path, item]) =>
      Object.entries(item)
        .filter(([method]) => HTTP_METHODS.includes(method))
        .map(([method, op]) => ({ route: `${method.toUpperCase()} ${path}`, op })),
    );

  it('is an OpenAPI 3 document holding every registered route', () => {
    expect(doc.openapi).toMatch(/^3\./);
    expect(routes.length).toBeGreaterThanOrEqual(40);
    const missing = routes
      .filter((r) => !doc.paths[r.path]?.[r.method])
      .map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(missing).toEqual([]);
  });

  it('gives every operation a 204, or a 2xx answer with a content type and schema', () => {
    const ops = operations();
    expect(ops.length).toBe(routes.length);
    const problems = ops
      .map(({ route, op }) => ({ route, problem: successProblem(op) }))
      .filter((p) => p.problem !== null);
    expect(problems).toEqual([]);
  });

  it('gives every POST/PUT/PATCH route that reads a body a requestBody with a content type and schema', () => {
    const writes = routes.filter((r) => ['post', 'put', 'patch'].includes(r.method));
    // Some writes (login, register, local rules, uploads) read a body; the check must see them.
    expect(writes.filter((r) => r.readsBody).length).toBeGreaterThanOrEqual(10);
    const problems = writes
      .filter((r) => r.readsBody)
      .map((r) => ({
        route: `${r.method.toUpperCase()} ${r.path}`,
        problem: requestBodyProblem(doc.paths[r.path]?.[r.method] ?? {}),
      }))
      .filter((p) => p.problem !== null);
    expect(problems).toEqual([]);
  });

  it('describes the export event stream and the file download by their content types', () => {
    const events = doc.paths['/api/exports/{id}/events']?.get?.responses?.['200']?.content;
    expect(Object.keys(events ?? {})).toEqual(['text/event-stream']);
    const file = doc.paths['/api/exports/{id}/files/{name}']?.get?.responses?.['200']?.content ?? {};
    // Content types of the cut-pack files (libs/geometry pack.ts): DXF, SVG, PDF, JSON, ZIP.
    expect(Object.keys(file).sort()).toEqual([
      'application/dxf',
      'application/json',
      'application/pdf',
      'application/zip',
      'image/svg+xml',
    ]);
    for (const m of Object.values(file)) expect(m.schema).toEqual({ type: 'string', format: 'binary' });
  });
});
