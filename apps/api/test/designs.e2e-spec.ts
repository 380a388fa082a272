import {
  createUser,
  countRows,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { octahedronHexagons } from './support/workshop-fixtures';

// A small convex solid of our own as OFF text: a square pyramid (5 vertices, 5 faces).
const PYRAMID_OFF = `OFF
5 5 0
-1 -1 0
1 -1 0
1 1 0
-1 1 0
0 0 1.2
4 0 3 2 1
3 0 1 4
3 1 2 4
3 2 3 4
3 3 0 4
`;

describe('designs', () => {
  let ctx: TestContext;
  let owner: TestUser;
  let other: TestUser;
  let fabricator: TestUser;
  let supervisor: TestUser;
  beforeAll(async () => {
    ctx = await startTestApp();
    owner = await createUser(ctx, 'hobbyist');
    other = await createUser(ctx, 'hobbyist');
    fabricator = await createUser(ctx, 'fabricator');
    supervisor = await createUser(ctx, 'supervisor');
  });
  afterAll(async () => {
    await ctx.app.close();
  });
  const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

  async function create(u: TestUser, name = 'Reading-room octahedron') {
    const res = await ctx.http
      .post('/api/designs')
      .set(auth(u))
      .send({ name, spec: octahedronHexagons() })
      .expect(201);
    return res.body;
  }

  it('creates a design with the engine’s preview figures', async () => {
    const d = await create(owner);
    expect(d.ownerId).toBe(owner.id);
    // The octahedron has 8 faces and 12 edges (Euler: 6 − 12 + 8 = 2); hexagons of this size meet at every edge.
    expect(d.preview).toMatchObject({ valid: true, pieceCount: 8, crossingCount: 12 });
    expect(d.preview.diameterMm).toBeCloseTo(240, 1);
  });

  it('refuses a malformed spec naming the field, and stores nothing', async () => {
    const before = await countRows(ctx, 'designs');
    const spec = { ...octahedronHexagons(), piece: { sides: 6, step: 2, size: 1.3 } };
    const res = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Compound', spec })
      .expect(400);
    expectErrorBody(res.body, 400, 'DESIGN.INVALID_SPEC');
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain('spec.piece.step');
    expect(await countRows(ctx, 'designs')).toBe(before);
  });

  it('refuses at once a design too heavy to compute in time, saying how to make it lighter, and stores nothing', async () => {
    const before = await countRows(ctx, 'designs');
    // 120 pieces of 60-pointed stars: 9–20 s of a geometry thread to build (measured), 31–42 s under load.
    const spec = {
      ...octahedronHexagons(),
      solid: 'disdyakis-triacontahedron',
      piece: { sides: 60, step: 29, size: 1.2 },
    };
    const started = Date.now();
    const res = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Heavy', spec })
      .expect(422);
    expect(Date.now() - started).toBeLessThan(3000);
    expectErrorBody(res.body, 422, 'DESIGN.TOO_HEAVY');
    expect(res.body.message).toMatch(/too heavy.*120 pieces of 60 sides.*choose pieces of at most \d+ sides/);
    expect(res.body.details).toMatchObject({ reason: 'estimate', work: 120 * 119 * 60 });
    expect(await countRows(ctx, 'designs')).toBe(before);
  });

  it('keeps designs private between hobbyists: 404 for one, and lists only their own', async () => {
    const d = await create(owner);
    const nf = await ctx.http.get(`/api/designs/${d.id}`).set(auth(other)).expect(404);
    expectErrorBody(nf.body, 404, 'DESIGN.NOT_FOUND');
    // Every design route for every role is in role-matrix.e2e-spec.ts; here the list stays private too.
    const list = await ctx.http.get('/api/designs?pageSize=200').set(auth(other)).expect(200);
    expect(list.body.items.every((x: { ownerId: string }) => x.ownerId === other.id)).toBe(true);
  });

  it('lets staff read but only the owner or a supervisor change a design', async () => {
    const d = await create(owner);
    const res = await ctx.http
      .patch(`/api/designs/${d.id}`)
      .set(auth(fabricator))
      .send({ name: 'X', version: d.version })
      .expect(403);
    expectErrorBody(res.body, 403, 'DESIGN.NOT_OWNER');
    await ctx.http
      .patch(`/api/designs/${d.id}`)
      .set(auth(supervisor))
      .send({ name: 'Renamed', version: d.version })
      .expect(200);
  });

  it('keeps a design’s name trimmed, not empty, and on one line without control characters', async () => {
    const before = await countRows(ctx, 'designs');
    const blanks = ['', '   ', '\t \n'];
    const controls = [
      'Lamp\nshade',
      'Lamp\u001b[31m red',
      'Lamp\u0007',
      'Lamp\u007f',
      'Lamp\u0085',
      'Lamp\u2028shade',
    ];
    for (const name of [...blanks, ...controls]) {
      const res = await ctx.http
        .post('/api/designs')
        .set(auth(owner))
        .send({ name, spec: octahedronHexagons() })
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toEqual(['name']);
    }
    expect(await countRows(ctx, 'designs')).toBe(before);
    const d = await create(owner, '  Reading-room lamp  ');
    expect(d.name).toBe('Reading-room lamp');
    for (const name of ['   ', 'Two\nlines']) {
      const res = await ctx.http
        .patch(`/api/designs/${d.id}`)
        .set(auth(owner))
        .send({ name, version: d.version })
        .expect(400);
      expect(res.body.details.map((x: { field: string }) => x.field)).toEqual(['name']);
    }
    const kept = await ctx.http.get(`/api/designs/${d.id}`).set(auth(owner)).expect(200);
    expect(kept.body).toMatchObject({ name: 'Reading-room lamp', version: d.version });
    // Letters of any script and symbols are text, not control characters.
    expect((await create(owner, 'Lampe à étoiles ★ — 星')).name).toBe('Lampe à étoiles ★ — 星');
  });

  it('refuses a stale version with 409', async () => {
    const d = await create(owner);
    await ctx.http
      .patch(`/api/designs/${d.id}`)
      .set(auth(owner))
      .send({ name: 'First', version: d.version })
      .expect(200);
    const res = await ctx.http
      .patch(`/api/designs/${d.id}`)
      .set(auth(owner))
      .send({ name: 'Second', version: d.version })
      .expect(409);
    expectErrorBody(res.body, 409, 'DESIGN.STALE_VERSION');
  });

  it('duplicates a design into the caller’s own', async () => {
    const d = await create(owner);
    const copy = await ctx.http.post(`/api/designs/${d.id}/duplicate`).set(auth(fabricator)).expect(201);
    expect(copy.body).toMatchObject({ ownerId: fabricator.id, name: `${d.name} (copy)`, spec: d.spec });
  });

  it('accepts an uploaded OFF solid checked by the engine', async () => {
    const d = await create(owner);
    const check = await ctx.http
      .post('/api/designs/solid-check')
      .set(auth(owner))
      .attach('file', Buffer.from(PYRAMID_OFF), 'pyramid.off')
      .expect(200);
    expect(check.body).toMatchObject({ format: 'off', vertexCount: 5, faceCount: 5 });
    const res = await ctx.http
      .post(`/api/designs/${d.id}/solid`)
      .set(auth(owner))
      .attach('file', Buffer.from(PYRAMID_OFF), 'pyramid.off')
      .expect(201);
    expect(res.body.solidFileName).toBe('pyramid.off');
    expect(res.body.preview.pieceCount).toBe(5);
  });

  it.each([
    ['a coplanar point set', 'OFF\n4 1 0\n0 0 0\n1 0 0\n0 1 0\n1 1 0\n4 0 1 3 2\n', 'scatter.off', 400],
    ['text that is not OBJ or OFF', 'hello world, not a solid', 'notes.obj', 400],
    ['NaN coordinates', 'v 0 0 0\nv 1 0 0\nv 0 1 0\nv 0 0 NaN\n', 'nan.obj', 400],
    ['a wrong file type', 'v 0 0 0', 'model.stl', 415],
    ['binary content', '\u0000\u0001\u0002binary', 'blob.obj', 400],
  ])('refuses %s and stores nothing', async (_what, text, name, status) => {
    const d = await create(owner);
    const res = await ctx.http
      .post(`/api/designs/${d.id}/solid`)
      .set(auth(owner))
      .attach('file', Buffer.from(text), name)
      .expect(status);
    expectErrorBody(res.body, status);
    const after = await ctx.http.get(`/api/designs/${d.id}`).set(auth(owner)).expect(200);
    expect(after.body.spec.solid).toBe('octahedron');
    expect(after.body.version).toBe(d.version);
  });

  it('refuses an upload over the size limit with 413', async () => {
    const d = await create(owner);
    const big = Buffer.alloc(2 * 1024 * 1024 + 10, 'v 0 0 0\n');
    const res = await ctx.http
      .post(`/api/designs/${d.id}/solid`)
      .set(auth(owner))
      .attach('file', big, 'big.obj')
      .expect(413);
    expectErrorBody(res.body, 413);
  });

  it('keeps a CLI spec’s fit scale, colours and stock sheet, margin and gap, and returns them', async () => {
    // The same spec shape the geometry CLI reads (libs/geometry README): sized to fit two 600 × 400 sheets.
    const spec = {
      ...octahedronHexagons(),
      scale: { by: 'fitSheets', sheets: 2 },
      stock: {
        thicknessMm: 3,
        flexible: false,
        sheet: { widthMm: 600, heightMm: 400 },
        marginMm: 8,
        gapMm: 4,
      },
      colours: { count: 2, rule: 'neighbour-distinct' },
    };
    const created = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Two-sheet octahedron', spec })
      .expect(201);
    expect(created.body.spec).toEqual(spec);
    expect(created.body.preview.pieceCount).toBe(8);
    const read = await ctx.http.get(`/api/designs/${created.body.id}`).set(auth(owner)).expect(200);
    expect(read.body.spec).toEqual(spec);

    const bedSpec = { ...spec, scale: { by: 'fitBed' }, bed: { widthMm: 300, heightMm: 200 } };
    const changed = await ctx.http
      .patch(`/api/designs/${created.body.id}`)
      .set(auth(owner))
      .send({ spec: bedSpec, version: created.body.version })
      .expect(200);
    expect(changed.body.spec).toEqual(bedSpec);
    // The largest piece must fit a bed half the sheet's size each way, so the model is smaller than one
    // fitted to a bed the sheet's size.
    const fullBed = await ctx.http
      .patch(`/api/designs/${created.body.id}`)
      .set(auth(owner))
      .send({ spec: { ...bedSpec, bed: { widthMm: 600, heightMm: 400 } }, version: changed.body.version })
      .expect(200);
    expect(changed.body.preview.diameterMm).toBeLessThan(fullBed.body.preview.diameterMm);
  });

  it.each([
    ['fitSheets without sheets', { by: 'fitSheets' }, 'spec.scale.sheets'],
    ['fitBed without a bed', { by: 'fitBed' }, 'spec.bed'],
    ['an unknown colour rule', null, 'spec.colours.rule'],
  ])('refuses %s, naming the field, and stores nothing', async (_what, scale, field) => {
    const before = await countRows(ctx, 'designs');
    const spec = scale
      ? { ...octahedronHexagons(), scale }
      : { ...octahedronHexagons(), colours: { count: 2, rule: 'all-different' } };
    const res = await ctx.http.post('/api/designs').set(auth(owner)).send({ name: 'Bad', spec }).expect(400);
    expectErrorBody(res.body, 400, 'DESIGN.INVALID_SPEC');
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await countRows(ctx, 'designs')).toBe(before);
  });

  it('refuses to delete a design that has jobs, and deletes one that has none', async () => {
    const d = await create(owner);
    await ctx.http.post('/api/jobs').set(auth(owner)).send({ designId: d.id }).expect(201);
    const res = await ctx.http.delete(`/api/designs/${d.id}`).set(auth(owner)).expect(409);
    expectErrorBody(res.body, 409, 'DESIGN.IN_USE');
    const free = await create(owner);
    await ctx.http.delete(`/api/designs/${free.id}`).set(auth(owner)).expect(204);
    await ctx.http.get(`/api/designs/${free.id}`).set(auth(owner)).expect(404);
  });
});

describe('designs whose computation outlasts its deadline', () => {
  let ctx: TestContext;
  let owner: TestUser;
  const saved = process.env.KW_GEOMETRY_TASK_MS;
  beforeAll(async () => {
    process.env.KW_GEOMETRY_TASK_MS = '400';
    ctx = await startTestApp();
    owner = await createUser(ctx, 'hobbyist');
  });
  afterAll(async () => {
    await ctx.app.close();
    if (saved === undefined) delete process.env.KW_GEOMETRY_TASK_MS;
    else process.env.KW_GEOMETRY_TASK_MS = saved;
  });
  const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

  it('stops the thread at the deadline, answers 422 DESIGN.TOO_HEAVY, and computes the next design on a new one', async () => {
    const before = await countRows(ctx, 'designs');
    // Under the up-front limit (120 × 119 × 12 = 171,360) but about 2.3 s of one thread (measured): past 0.4 s.
    const spec = {
      ...octahedronHexagons(),
      solid: 'disdyakis-triacontahedron',
      piece: { sides: 12, step: 5, size: 1.2 },
    };
    const started = Date.now();
    const res = await ctx.http.post('/api/designs').set(auth(owner)).send({ name: 'Slow', spec }).expect(422);
    expect(Date.now() - started).toBeLessThan(2000);
    expectErrorBody(res.body, 422, 'DESIGN.TOO_HEAVY');
    expect(res.body.message).toMatch(/longer than 0\.4 s.*fewer faces/);
    expect(res.body.details).toEqual({ reason: 'deadline', deadlineMs: 400 });
    expect(await countRows(ctx, 'designs')).toBe(before);
    const next = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Light', spec: octahedronHexagons() })
      .expect(201);
    expect(next.body.preview).toMatchObject({ valid: true, pieceCount: 8 });
  });
});
