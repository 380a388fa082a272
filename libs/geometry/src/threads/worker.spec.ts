import { MessageChannel } from 'node:worker_threads';
import { buildModel } from '../build';
import { buildWithLayout } from '../layout/build-with-layout';
import { octahedronHexagons } from '../test-support/designs';
import { packInputFrom } from '../pack/cli-commands';
import { CutPackError } from '../pack/pack';
import { SolidError } from '../solids/polyhedron';
import { SpecValidationError } from '../spec/validate-spec';
import { DesignTooHeavyError } from '../spec/workload';
import { checkSolid, cutPack, prepareJob, previewDesign, reviveThreadError } from './worker';

const cut = { sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3, colours: { count: 1 } };

describe('geometry worker tasks', () => {
  it('refuses at once a design too heavy to build in time, saying how to make it lighter', async () => {
    // 120 pieces of 60-pointed stars: 9–20 s of one thread when built (measured; see designWork).
    const heavy = {
      ...octahedronHexagons(),
      solid: 'disdyakis-triacontahedron',
      piece: { sides: 60, step: 29, size: 1.2 },
    };
    const started = Date.now();
    const outcomes = [
      await previewDesign({ spec: heavy }),
      await prepareJob({ input: heavy, fitSearch: null, cut }),
    ];
    expect(Date.now() - started).toBeLessThan(1000);
    for (const out of outcomes) {
      if (out.ok) throw new Error('expected a refusal');
      const err = reviveThreadError(structuredClone(out.error));
      expect(err).toBeInstanceOf(DesignTooHeavyError);
      expect(err).toMatchObject({ code: 'DESIGN.TOO_HEAVY', work: 120 * 119 * 60, limit: 200_000 });
      expect(err.message).toMatch(
        /120 pieces of 60 sides.*at most 14 sides on this solid, or a solid with fewer faces/,
      );
    }
    // The sample designs stay far below the limit (octahedron: 8 × 7 × 6 = 336).
    expect((await previewDesign({ spec: octahedronHexagons() })).ok).toBe(true);
  });

  it('says on its port when a task starts, so a deadline counts its running time only', async () => {
    const { port1, port2 } = new MessageChannel();
    const said = new Promise((resolve) => port1.once('message', resolve));
    await previewDesign({ spec: octahedronHexagons(), started: port2 });
    expect(await said).toBe('started');
    port1.close();
  });

  it('prepares a fixed-scale design: the spec as given, no errors, a summary', async () => {
    const out = await prepareJob({ input: octahedronHexagons(), fitSearch: null, cut });
    expect(out.ok).toBe(true);
    if (!out.ok || out.value.stage !== 'cut') throw new Error('expected a cut stage');
    expect(out.value.spec.scale).toEqual(octahedronHexagons().scale);
    expect(out.value.errors).toEqual([]);
    expect(out.value.layoutFailure).toBeNull();
    expect(out.value.summary?.pieceCount).toBe(8);
  });

  it('fixes the diameter a fit search finds, and the result survives a structured clone', async () => {
    const input = { ...octahedronHexagons(), scale: { by: 'fitSheets' as const, sheets: 1 } };
    const out = await prepareJob({
      input,
      fitSearch: { ...input, stock: { ...input.stock, sheet: cut.sheet, marginMm: 5, gapMm: 3 } },
      cut,
    });
    const copy = structuredClone(out);
    expect(copy).toEqual(out);
    if (!copy.ok || copy.value.stage !== 'cut') throw new Error('expected a cut stage');
    expect(copy.value.spec.scale).toEqual({ by: 'diameter', mm: expect.any(Number) });
    expect(copy.value.summary?.sheetCount).toBe(1);
  });

  it('estimates the prepared job as its cut pack will: the same figures as the pack manifest, priced per sheet', async () => {
    // Two colours, so the pieces carry engraved colour names as well as ids and slot partners.
    const colours = ['saffron', 'teal'];
    const base = packInputFrom(octahedronHexagons(), { colours, colourRule: 'neighbour-distinct' });
    const m = base.machine;
    const machine = {
      cutSpeedMmS: m.cutSpeedMmS,
      markSpeedMmS: m.markSpeedMmS,
      pierceTimeS: m.pierceTimeS,
      rapidSpeedMmS: m.rapidSpeedMmS,
      passes: m.passes,
      hourlyRate: 30,
    };
    const layoutCut = {
      sheet: base.sheet,
      marginMm: base.marginMm,
      gapMm: base.gapMm,
      colours: { count: 2, rule: 'neighbour-distinct' as const },
    };
    const prepared = await prepareJob({
      input: base.spec,
      fitSearch: null,
      cut: layoutCut,
      estimate: { machine, colours, pricePerSheet: 4.5, currency: 'EUR' },
    });
    if (!prepared.ok || prepared.value.stage !== 'cut') throw new Error('expected a cut stage');
    const summary = prepared.value.summary!;
    const e = summary.estimate!;
    const pack = await cutPack({
      input: {
        ...base,
        machine: { ...m, hourlyRate: 30, currency: 'EUR' },
        material: { ...base.material, pricePerSheet: 4.5, currency: 'EUR' },
      },
    });
    if (!pack.ok) throw new Error(pack.error.message);
    expect(e).toEqual(pack.value.manifest.estimate);
    // Independently of the pack: every piece's outline is cut once, one pierce each (no inner contours on
    // these pieces), the labels are marked, and the sheets are priced one by one.
    const model = buildModel(base.spec);
    const perimeter = (o: readonly (readonly [number, number])[]) =>
      o.reduce(
        (s, p, i) => s + Math.hypot(o[(i + 1) % o.length]![0] - p[0], o[(i + 1) % o.length]![1] - p[1]),
        0,
      );
    const cutMm = model.pieces.reduce((s, p) => s + perimeter(p.outline), 0);
    expect(e.cutLengthMm).toBeCloseTo(cutMm, 1);
    expect(e.pierces).toBe(model.pieces.length);
    expect(e.markLengthMm).toBeGreaterThan(0);
    expect(e.materialCost).toBeCloseTo(summary.sheetCount * 4.5, 6);
    // Time model (libs/geometry/src/estimate/estimate.ts, REFERENCES "Stock and machines"): cut ÷ speed ×
    // passes + mark ÷ mark speed + pierces × pierce time × passes + travel ÷ rapid speed.
    const seconds =
      (e.cutLengthMm * machine.passes) / machine.cutSpeedMmS +
      e.markLengthMm / machine.markSpeedMmS +
      e.pierces * machine.passes * machine.pierceTimeS +
      e.travelMm / machine.rapidSpeedMmS;
    expect(e.minutes).toBeCloseTo(seconds / 60, 1);
    expect(e.machineCost).toBeCloseTo((seconds / 3600) * 30, 1);
    // A sheet size without a price: the material cost is unknown, not zero.
    const unpriced = await prepareJob({
      input: base.spec,
      fitSearch: null,
      cut: layoutCut,
      estimate: { machine, colours, pricePerSheet: null, currency: 'EUR' },
    });
    if (!unpriced.ok || unpriced.value.stage !== 'cut') throw new Error('expected a cut stage');
    expect(unpriced.value.summary!.estimate).toEqual({ ...e, materialCost: null });
  });

  it('returns engine errors as data and rebuilds them as the engine’s classes', async () => {
    const bad = await prepareJob({
      input: { ...octahedronHexagons(), fitMm: Number.NaN },
      fitSearch: null,
      cut,
    });
    expect(bad.ok).toBe(false);
    if (bad.ok) return;
    const revived = reviveThreadError(structuredClone(bad.error));
    expect(revived).toBeInstanceOf(SpecValidationError);
    expect((revived as SpecValidationError).fieldErrors.length).toBeGreaterThan(0);
    expect(reviveThreadError({ name: 'SolidError', code: 'SOLID.FLAT', message: 'flat' })).toBeInstanceOf(
      SolidError,
    );
    const pack = reviveThreadError({
      name: 'CutPackError',
      code: 'PACK.BAD_MACHINE',
      message: 'm',
      details: ['d'],
    });
    expect(pack).toBeInstanceOf(CutPackError);
    expect((pack as CutPackError).code).toBe('PACK.BAD_MACHINE');
    expect(reviveThreadError({ name: 'TypeError', message: 'x' }).message).toBe('x');
  });

  it('builds a cut pack, posts its progress on the task port and closes the port', async () => {
    const { port1, port2 } = new MessageChannel();
    const seen: number[] = [];
    port1.on('message', (f: number) => seen.push(f));
    const closed = new Promise<void>((resolve) => port1.once('close', () => resolve()));
    const out = await cutPack({ input: packInputFrom(octahedronHexagons()), progress: port2 });
    await closed;
    if (!out.ok) throw new Error(out.error.message);
    expect(out.value.files.some((f) => f.name.endsWith('.dxf'))).toBe(true);
    expect(seen.length).toBeGreaterThan(2);
    expect(seen.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= seen[i - 1]!))).toBe(true);
    expect(seen.at(-1)).toBe(1);
    const base = packInputFrom(octahedronHexagons());
    const refused = await cutPack({ input: { ...base, machine: { ...base.machine, cutSpeedMmS: 0 } } });
    expect(refused.ok).toBe(false);
    if (!refused.ok) expect(reviveThreadError(refused.error)).toBeInstanceOf(CutPackError);
  });

  it('previews a design, and returns a spec that does not validate as a SpecValidationError', async () => {
    const ok = await previewDesign({ spec: octahedronHexagons() });
    if (!ok.ok) throw new Error(ok.error.message);
    expect(ok.value).toMatchObject({ valid: true, pieceCount: 8 });
    const bad = await previewDesign({ spec: { ...octahedronHexagons(), piece: { sides: 2 } } });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(reviveThreadError(bad.error)).toBeInstanceOf(SpecValidationError);
  });

  it('previews a fit-to-sheets design at the size the search finds, not at its upper bound', async () => {
    const spec = {
      ...octahedronHexagons(),
      scale: { by: 'fitSheets', sheets: 2 },
      stock: { thicknessMm: 3, sheet: { widthMm: 500, heightMm: 450 }, marginMm: 8, gapMm: 4 },
      colours: { count: 2, rule: 'neighbour-distinct' },
    };
    const found = buildWithLayout(spec).model.report.diameterMm;
    const upper = buildModel(spec).report.diameterMm;
    expect(upper).toBeGreaterThan(found + 1);
    const r = await previewDesign({ spec });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.diameterMm).toBeCloseTo(found, 2);
  });

  it('checks uploaded solid text: a cube as OFF (8 vertices, 6 faces), a flat one refused as a SolidError', async () => {
    const cube = [
      'OFF',
      '8 6 0',
      ...[0, 1].flatMap((x) => [0, 1].flatMap((y) => [0, 1].map((z) => `${x} ${y} ${z}`))),
      '4 0 1 3 2',
      '4 4 6 7 5',
      '4 0 4 5 1',
      '4 2 3 7 6',
      '4 0 2 6 4',
      '4 1 5 7 3',
    ].join('\n');
    const ok = await checkSolid({ format: 'off', text: cube, name: 'cube' });
    if (!ok.ok) throw new Error(ok.error.message);
    expect(ok.value).toEqual({ name: 'cube', vertexCount: 8, faceCount: 6 });
    const flat = await checkSolid({
      format: 'obj',
      text: 'v 0 0 0\nv 1 0 0\nv 0 1 0\nv 1 1 0\n',
      name: 'flat',
    });
    expect(flat.ok).toBe(false);
    if (!flat.ok) expect(reviveThreadError(flat.error)).toBeInstanceOf(SolidError);
  });
});
