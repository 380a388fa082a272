import { type Role } from '@kerfwright/contracts';
import {
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { octahedronHexagons } from './support/workshop-fixtures';

/**
 * A table of read routes × roles: allowed → 2xx, a role that may not → 403 with the error body, and another
 * user's object → 404 (broken object-level authorisation is the first item of the OWASP API Security Top 10).
 * Write routes have their own suites (designs, jobs, materials, machine profiles, safety, users).
 */
type Expect = 200 | 403 | 404;
const ROLES: Role[] = ['hobbyist', 'fabricator', 'operator', 'supervisor'];

describe('role matrix of the read routes', () => {
  let ctx: TestContext;
  const users = {} as Record<Role, TestUser>;
  let owner: TestUser;
  let designId: string;
  let jobId: string;
  let draftJobId: string;

  beforeAll(async () => {
    ctx = await startTestApp();
    for (const r of ROLES) users[r] = await createUser(ctx, r);
    owner = await createUser(ctx, 'hobbyist');
    const auth = { Authorization: `Bearer ${owner.token}` };
    designId = (
      await ctx.http
        .post('/api/designs')
        .set(auth)
        .send({ name: 'Matrix', spec: octahedronHexagons() })
        .expect(201)
    ).body.id;
    const job = (await ctx.http.post('/api/jobs').set(auth).send({ designId }).expect(201)).body;
    await ctx.http.post(`/api/jobs/${job.id}/request`).set(auth).send({ version: job.version }).expect(200);
    jobId = job.id;
    draftJobId = (await ctx.http.post('/api/jobs').set(auth).send({ designId }).expect(201)).body.id;
  });
  afterAll(async () => {
    await ctx.app.close();
  });

  // [route, expectation per role: hobbyist (not the owner), fabricator, operator, supervisor]
  const table: [string, () => string, Expect[]][] = [
    ['users list', () => '/api/users', [403, 403, 403, 200]],
    ['audit trail', () => '/api/audit', [403, 403, 403, 200]],
    ['designs list', () => '/api/designs', [200, 200, 200, 200]],
    ["another user's design", () => `/api/designs/${designId}`, [404, 200, 200, 200]],
    ['jobs list', () => '/api/jobs', [200, 200, 200, 200]],
    ["another user's requested job", () => `/api/jobs/${jobId}`, [404, 200, 200, 200]],
    ["another user's draft job", () => `/api/jobs/${draftJobId}`, [404, 404, 404, 200]],
    ["another user's job safety", () => `/api/jobs/${jobId}/safety`, [404, 200, 200, 200]],
    ["another user's draft job safety", () => `/api/jobs/${draftJobId}/safety`, [404, 404, 404, 200]],
    ['materials list', () => '/api/materials', [200, 200, 200, 200]],
    ['machine profiles list', () => '/api/machine-profiles', [200, 200, 200, 200]],
    ['safety notices', () => '/api/safety/notices', [200, 200, 200, 200]],
    ['own account', () => '/api/auth/me', [200, 200, 200, 200]],
  ];

  for (const [name, url, expected] of table) {
    it(`${name}: ${ROLES.map((r, i) => `${r} ${expected[i]}`).join(', ')}`, async () => {
      for (const [i, role] of ROLES.entries()) {
        const res = await ctx.http.get(url()).set('Authorization', `Bearer ${users[role].token}`);
        expect({ role, status: res.status }).toEqual({ role, status: expected[i] });
        if (res.status >= 400) expectErrorBody(res.body, res.status);
      }
      const anonymous = await ctx.http.get(url());
      expect(anonymous.status).toBe(401);
    });
  }

  it('lets the owner read their own design and jobs', async () => {
    const auth = { Authorization: `Bearer ${owner.token}` };
    await ctx.http.get(`/api/designs/${designId}`).set(auth).expect(200);
    await ctx.http.get(`/api/jobs/${jobId}`).set(auth).expect(200);
    await ctx.http.get(`/api/jobs/${draftJobId}`).set(auth).expect(200);
  });
});
