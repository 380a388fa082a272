import { createHash } from 'node:crypto';
import JSZip from 'jszip';
import type { CutPackInput, CutPackResult, DesignSpec } from '@kerfwright/contracts';
import { buildModel } from '../build';
import { toolPathLength } from '../estimate';
import { design, octahedronHexagons } from '../test-support/designs';
import { CutPackError, archiveName, createCutPack, sheetOverBedNote } from './pack';
import { drawSheet, placeScaleMark } from './sheet-drawing';
import { sheetToDxf } from './sheet-files';
import { packInputFrom, runPackCommand } from './cli-commands';
import { SAFETY_DEFERRAL } from './documents';
import {
  type P,
  disc,
  outsideArea,
  overlapArea,
  perimeterOf,
  polyArea,
  readDxf,
  readPdf,
  readSvg,
  scaleBars,
} from './read-back.test';

const NOTICES = [
  { id: 'SAF-LASER-FIRE', version: 3, title: 'Never leave a running laser unattended', severity: 'danger' },
  { id: 'SAF-ACRYLIC-FUMES', version: 1, title: 'Acrylic fumes need extraction', severity: 'warning' },
];

function input(spec: DesignSpec, extra: Partial<CutPackInput> = {}): CutPackInput {
  return {
    ...packInputFrom(spec, {}),
    sheet: { widthMm: 600, heightMm: 400 },
    marginMm: 5,
    gapMm: 3,
    colours: ['saffron', 'teal'],
    colourRule: 'neighbour-distinct',
    machine: {
      profileName: 'Bay 2 CO2',
      profileVersion: 4,
      kind: 'laser',
      bedWidthMm: 600,
      bedHeightMm: 400,
      cutSpeedMmS: 12,
      markSpeedMmS: 150,
      pierceTimeS: 0.3,
      rapidSpeedMmS: 400,
      passes: 1,
      powerPct: 65,
      hourlyRate: 30,
      currency: 'EUR',
    },
    material: {
      name: 'Cast acrylic 3 mm',
      family: 'acrylic',
      thicknessMm: 3,
      pricePerSheet: 18.5,
      currency: 'EUR',
    },
    job: { id: 'job-42', title: 'Octahedron lamp', requester: 'ada' },
    notices: NOTICES,
    localRulesVersion: 7,
    units: 'mm',
    archive: true,
    createdAt: '2026-05-04T10:20:30.000Z',
    ...extra,
  };
}

const file = (r: CutPackResult, name: string) => {
  const f = r.files.find((x) => x.name === name);
  if (!f) throw new Error(`no ${name} in ${r.files.map((x) => x.name).join(', ')}`);
  return f;
};
const sheetsOf = (r: CutPackResult, ext: string) =>
  r.files.filter((f) => f.role === (ext === 'dxf' ? 'sheet-dxf' : 'sheet-svg'));
const pdfText = async (data: Uint8Array) => readPdf(data);

describe('createCutPack (octahedron hexagons, two colours, mm)', () => {
  const spec = octahedronHexagons();
  let pack: CutPackResult;
  beforeAll(async () => {
    pack = await createCutPack(input(spec));
  });

  it('writes per sheet a DXF and an SVG, the coupon, two PDFs, a manifest and a ZIP', () => {
    const names = pack.files.map((f) => f.name);
    expect(names).toEqual(
      expect.arrayContaining([
        'sheet-01-saffron.dxf',
        'sheet-01-saffron.svg',
        'coupon.dxf',
        'coupon.svg',
        'setup-sheet.pdf',
        'assembly-guide.pdf',
        'manifest.json',
      ]),
    );
    for (const n of names) expect(n).toMatch(/^[a-z0-9.-]+$/);
    expect(sheetsOf(pack, 'dxf')).toHaveLength(pack.manifest.sheetCount);
    expect(sheetsOf(pack, 'svg')).toHaveLength(pack.manifest.sheetCount);
    expect(pack.files.filter((f) => f.role === 'archive')).toHaveLength(1);
  });

  it('names the ZIP by the job’s title and the start of its id, never an id cut off partway', () => {
    const job = { id: '0390947a-70d0-40be-9fb8-d3e97ee1c2b4', title: 'Felt honeycomb ball' };
    expect(archiveName('cut-pack', job)).toBe('cut-pack-felt-honeycomb-ball-0390947a.zip');
    expect(archiveName('coupon', job)).toBe('coupon-felt-honeycomb-ball-0390947a.zip');
    expect(archiveName('cut-pack', { id: '0390947a-70d0-40be-9fb8-d3e97ee1c2b4', title: '' })).toBe(
      'cut-pack-0390947a.zip',
    );
    // An id given by hand is kept as it is (the command line's).
    expect(archiveName('cut-pack', { id: 'cli', title: 'command-line pack' })).toBe('cut-pack-cli.zip');
    expect(archiveName('coupon', { id: '--', title: 'Ball' })).toBe('coupon.zip');
    const zip = pack.files.find((f) => f.role === 'archive')!;
    expect(zip.name).toBe(archiveName('cut-pack', input(spec).job));
  });

  it('DXF (read back with dxf-parser): mm units, closed cut contours of the real pieces, no overlaps, all on the sheet', () => {
    const model = buildModel(spec);
    const areas = model.pieces.map((p) => p.outline.map((q) => [q[0], q[1]] as P)).map(polyArea);
    let contours = 0;
    for (const f of sheetsOf(pack, 'dxf')) {
      const d = readDxf(f.data);
      // $INSUNITS = 4 means millimetres (Autodesk DXF reference, from memory).
      expect(d.insUnits).toBe(4);
      expect(d.layers).toEqual(expect.arrayContaining(['cut', 'mark']));
      expect(d.all.filter((x) => x.layer === 'cut').every((x) => x.closed)).toBe(true);
      const sheet: P[] = [
        [0, 0],
        [600, 0],
        [600, 400],
        [0, 400],
      ];
      d.cut.forEach((c, i) => {
        // polygon-clipping: every contour is one of the built pieces (by area) and lies on the sheet.
        const a = polyArea(c);
        expect(Math.min(...areas.map((x) => Math.abs(x - a)))).toBeLessThan(1e-3);
        expect(outsideArea(c, sheet)).toBeLessThan(1e-6);
        for (const o of d.cut.slice(i + 1)) expect(overlapArea(c, o)).toBeLessThan(1e-6);
      });
      contours += d.cut.length;
    }
    expect(contours).toBe(model.pieces.length);
  });

  it('cuts no segment twice and no contour after the contour enclosing it (parsed DXF, polygon-clipping)', () => {
    for (const f of sheetsOf(pack, 'dxf')) {
      const d = readDxf(f.data);
      const segs: { a: P; b: P; c: number }[] = [];
      d.cut.forEach((c, ci) => c.forEach((p, i) => segs.push({ a: p, b: c[(i + 1) % c.length]!, c: ci })));
      // Duplicates: the same segment (either direction) twice, or two collinear segments overlapping.
      const key = (s: { a: P; b: P }) =>
        [s.a, s.b]
          .map((p) => `${p[0].toFixed(4)},${p[1].toFixed(4)}`)
          .sort()
          .join('|');
      expect(new Set(segs.map(key)).size).toBe(segs.length);
      for (let i = 0; i < segs.length; i++) {
        for (let j = i + 1; j < segs.length; j++) {
          const s = segs[i]!;
          const t = segs[j]!;
          if (s.c === t.c) continue;
          const dx = s.b[0] - s.a[0];
          const dy = s.b[1] - s.a[1];
          const len = Math.hypot(dx, dy);
          if (len < 1e-9) continue;
          const off = (p: P) => Math.abs((p[0] - s.a[0]) * dy - (p[1] - s.a[1]) * dx) / len;
          if (off(t.a) > 1e-4 || off(t.b) > 1e-4) continue;
          const along = (p: P) => ((p[0] - s.a[0]) * dx + (p[1] - s.a[1]) * dy) / len;
          const [u0, u1] = [along(t.a), along(t.b)].sort((x, y) => x - y) as [number, number];
          expect(Math.min(u1, len) - Math.max(u0, 0)).toBeLessThan(1e-4);
        }
      }
      for (let i = 0; i < d.cut.length; i++)
        for (let j = i + 1; j < d.cut.length; j++) {
          const later = d.cut[j]!;
          const inside = outsideArea(later, d.cut[i]!) < 1e-6 && polyArea(later) < polyArea(d.cut[i]!);
          expect(inside).toBe(false);
        }
    }
  });

  it('keeps every label stroke inside its piece, at least 1 mm from every cut line (parsed DXF, polygon-clipping)', () => {
    const kerf = 0.15;
    for (const f of sheetsOf(pack, 'dxf')) {
      const d = readDxf(f.data);
      const bars = scaleBars(d.mark);
      expect(bars).toEqual([100]);
      for (const s of d.mark) {
        for (const p of s) {
          const around = disc(p, 1 + kerf / 2 - 1e-3);
          const host = d.cut.find((c) => outsideArea(around, c) < 1e-9);
          if (host) continue;
          // Not in a piece: then it belongs to the scale mark and keeps clear of every piece.
          for (const c of d.cut) expect(overlapArea(disc(p, 2 - 1e-3), c)).toBeLessThan(1e-9);
        }
      }
    }
  });

  it('SVG: width/height in mm with a viewBox of the same numbers, and a 100 mm scale bar', () => {
    for (const f of sheetsOf(pack, 'svg')) {
      const s = readSvg(f.data);
      // W3C SVG: width/height in mm with a viewBox of the same numbers makes one user unit one millimetre.
      expect(s.unit).toBe('mm');
      expect(s.width).toBe(600);
      expect(s.height).toBe(400);
      expect(s.viewBox).toEqual([0, 0, 600, 400]);
      expect(scaleBars(s.mark)).toEqual([100]);
      const dxf = readDxf(file(pack, f.name.replace('.svg', '.dxf')).data);
      expect(s.cut.length).toBe(dxf.cut.length);
      // Same contours, y flipped (SVG y points down).
      s.cut.forEach((c, i) => {
        const flipped = c.map((p) => [p[0], 400 - p[1]] as P);
        expect(polyArea(flipped)).toBeCloseTo(polyArea(dxf.cut[i]!), 4);
        expect(outsideArea(flipped, dxf.cut[i]!)).toBeLessThan(1e-4);
      });
    }
  });

  it('estimates agree with the parsed files and the time model', () => {
    // Recomputed from the parsed DXF files (dxf-parser): cut length is the sum of contour perimeters,
    // pierces the number of contours, travel the rapid moves from the origin through the marks then the
    // cuts in file order; time per REFERENCES "Stock and machines".
    let cut = 0;
    let mark = 0;
    let travel = 0;
    let pierces = 0;
    for (const f of sheetsOf(pack, 'dxf')) {
      const d = readDxf(f.data);
      let at: P = [0, 0];
      const move = (p: P) => {
        travel += Math.hypot(p[0] - at[0], p[1] - at[1]);
      };
      for (const x of d.all) {
        move(x.pts[0]!);
        at = x.closed ? x.pts[0]! : x.pts[x.pts.length - 1]!;
        if (x.layer === 'cut') {
          cut += perimeterOf(x.pts);
          pierces++;
        } else mark += perimeterOf(x.pts, false);
      }
      expect(d.all.findIndex((x) => x.layer === 'cut')).toBeGreaterThan(
        d.all.findLastIndex((x) => x.layer === 'mark'),
      );
    }
    const e = pack.manifest.estimate;
    expect(e.cutLengthMm).toBeCloseTo(cut, 1);
    expect(e.markLengthMm).toBeCloseTo(mark, 1);
    expect(e.pierces).toBe(pierces);
    expect(e.travelMm).toBeCloseTo(travel, 1);
    const seconds = cut / 12 + mark / 150 + pierces * 0.3 + travel / 400;
    expect(e.minutes).toBeCloseTo(seconds / 60, 1);
    expect(e.machineCost).toBeCloseTo((seconds / 3600) * 30, 1);
    expect(e.materialCost).toBeCloseTo(pack.manifest.sheetCount * 18.5, 6);
  });

  it('setup sheet (read back with pdf-parse) lists material, machine settings, estimates, notices and the deferral', async () => {
    const { text, info } = await pdfText(file(pack, 'setup-sheet.pdf').data);
    for (const s of [
      'Cast acrylic 3 mm',
      'Thickness 3 mm',
      'Kerf 0.15 mm',
      'every cut line is already offset outward by half the kerf (0.075 mm)',
      '12.0 mm/s, 1 pass',
      '150.0 mm/s',
      '65.0 %',
      'Pierce time 0.30 s',
      '400.0 mm/s',
      `Sheet count ${pack.manifest.sheetCount}`,
      'Bay 2 CO2 v4',
      'SAF-LASER-FIRE v3: Never leave a running laser unattended (danger)',
      'SAF-ACRYLIC-FUMES v1: Acrylic fumes need extraction (warning)',
      'Workshop rules version 7',
      SAFETY_DEFERRAL,
      `Pierces ${pack.manifest.estimate.pierces}`,
      `${pack.manifest.estimate.materialCost!.toFixed(2)} EUR`,
      'sheet-01-saffron 100 MM',
      'Sheet 1 of 2: saffron',
      'Sheet 2 of 2: teal',
      'millimetres (DXF $INSUNITS 4',
    ])
      expect(text).toContain(s);
    expect(String(info.CreationDate)).toContain('20260504102030');
  });

  it('assembly guide (pdf-parse) lists pieces by colour and an order in which every new piece joins a placed one', async () => {
    const { text } = await pdfText(file(pack, 'assembly-guide.pdf').data);
    const model = buildModel(spec);
    expect(text).toContain('Pieces by colour');
    expect(text).toContain('saffron');
    expect(text).toContain('teal');
    const steps = [...text.matchAll(/(\d+)\. (P\d+) \((\w+)\): ([^.]*)\./g)];
    expect(steps.map((m) => m[2]).sort()).toEqual(model.pieces.map((p) => p.id).sort());
    const placed = new Set<string>();
    for (const [, , id, , joins] of steps) {
      if (placed.size > 0) {
        const partners = [...joins!.matchAll(/slots? for (P\d+) onto/g)].map((m) => m[1]!);
        expect(partners.length).toBeGreaterThan(0);
        for (const p of partners) {
          expect(placed.has(p)).toBe(true);
          // Each named join is a real crossing of the design.
          expect(
            model.report.crossings.some((c) => (c.a === id && c.b === p) || (c.b === id && c.a === p)),
          ).toBe(true);
        }
      }
      placed.add(id!);
    }
  });

  it('manifest checksums and sizes match the files (node:crypto SHA-256), and the ZIP holds them all (jszip)', async () => {
    const listed = pack.manifest.files;
    const others = pack.files.filter((f) => f.role !== 'manifest' && f.role !== 'archive');
    expect(listed.map((x) => x.name)).toEqual(others.map((f) => f.name));
    for (const f of others) {
      const m = listed.find((x) => x.name === f.name)!;
      expect(m.bytes).toBe(f.data.byteLength);
      expect(m.sha256).toBe(createHash('sha256').update(f.data).digest('hex'));
    }
    const manifest = JSON.parse(new TextDecoder().decode(file(pack, 'manifest.json').data));
    expect(manifest).toEqual(JSON.parse(JSON.stringify(pack.manifest)));
    const zip = await JSZip.loadAsync(pack.files.find((f) => f.role === 'archive')!.data);
    const inZip = Object.keys(zip.files).sort();
    expect(inZip).toEqual([...others.map((f) => f.name), 'manifest.json'].sort());
    for (const f of others) {
      const data = await zip.file(f.name)!.async('uint8array');
      expect(createHash('sha256').update(data).digest('hex')).toBe(
        createHash('sha256').update(f.data).digest('hex'),
      );
    }
  });

  it('is deterministic for the same input (same checksums, same ZIP bytes)', async () => {
    const seen: number[] = [];
    const again = await createCutPack(input(spec), (f) => seen.push(f));
    expect(again.manifest).toEqual(pack.manifest);
    expect(seen.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= seen[i - 1]!))).toBe(true);
    expect(seen[seen.length - 1]).toBe(1);
    const zipA = pack.files.find((f) => f.role === 'archive')!.data;
    const zipB = again.files.find((f) => f.role === 'archive')!.data;
    expect(Buffer.from(zipA).equals(Buffer.from(zipB))).toBe(true);
  });
});

describe('createCutPack in inches', () => {
  const spec = octahedronHexagons();
  let mm: CutPackResult;
  let inch: CutPackResult;
  beforeAll(async () => {
    const one = { colours: ['natural'], archive: false };
    [mm, inch] = await Promise.all([
      createCutPack(input(spec, { ...one, units: 'mm' })),
      createCutPack(input(spec, { ...one, units: 'in' })),
    ]);
  });

  it('writes true inches: $INSUNITS 1, every cut vertex 1/25.4 of the mm file, a 4 in scale bar', async () => {
    const mmD = sheetsOf(mm, 'dxf').map((f) => readDxf(f.data));
    const inD = sheetsOf(inch, 'dxf').map((f) => readDxf(f.data));
    expect(inD).toHaveLength(mmD.length);
    const sortKey = (c: P[]) =>
      c
        .map((p) => [Math.round(p[0] * 1e3), Math.round(p[1] * 1e3)])
        .sort((a, b) => a[0]! - b[0]! || a[1]! - b[1]!)
        .join(';');
    inD.forEach((d, i) => {
      // $INSUNITS = 1 means inches (Autodesk DXF reference, from memory); 1 in = 25.4 mm exactly (by definition).
      expect(d.insUnits).toBe(1);
      const scaled = d.cut.map((c) => sortKey(c.map((p) => [p[0] * 25.4, p[1] * 25.4] as P))).sort();
      expect(scaled).toEqual(mmD[i]!.cut.map(sortKey).sort());
      // A difference of two positions written in full precision: equal to 4 in up to the last bits.
      expect(scaleBars(d.mark).map((x) => Math.round(x * 1e9) / 1e9)).toEqual([4]);
    });
    for (const f of sheetsOf(inch, 'svg')) {
      const s = readSvg(f.data);
      expect(s.unit).toBe('in');
      expect(s.width).toBeCloseTo(600 / 25.4, 5);
      expect(s.viewBox[2]).toBeCloseTo(600 / 25.4, 5);
      expect(scaleBars(s.mark).map((x) => Math.round(x * 1e4) / 1e4)).toEqual([4]);
    }
    const { text } = await pdfText(file(inch, 'setup-sheet.pdf').data);
    expect(text).toContain('inches (DXF $INSUNITS 1');
    expect(text).toContain('4 IN');
  });

  /** The inches printed for `mm`: 1 in = 25.4 mm exactly (NIST SP 811, appendix B), to the printed decimals. */
  const expectInches = (printed: string | undefined, mm: number, decimals: number) => {
    expect(printed?.split('.')[1]).toHaveLength(decimals);
    expect(Math.abs(Number(printed) - mm / 25.4)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
  };

  it('setup sheet (pdf-parse) gives sheet, thickness, kerf and lengths in inches with the mm beside them', async () => {
    const { text } = await pdfText(file(inch, 'setup-sheet.pdf').data);
    // Thickness 3 mm, kerf 0.15 mm, sheet 600 x 400 mm, margin 5 mm, gap 3 mm: the input above.
    const thickness = /Thickness ([\d.]+) in \(3 mm\)/.exec(text);
    expectInches(thickness?.[1], 3, 3);
    const sheet =
      /Sheet ([\d.]+) x ([\d.]+) in \(600 x 400 mm\), margin ([\d.]+) in \(5 mm\), gap ([\d.]+) in \(3 mm\)/.exec(
        text,
      );
    expectInches(sheet?.[1], 600, 2);
    expectInches(sheet?.[2], 400, 2);
    expectInches(sheet?.[3], 5, 3);
    expectInches(sheet?.[4], 3, 3);
    // Below 0.1 in a thou is too coarse for a kerf: four decimals.
    expectInches(/Kerf ([\d.]+) in \(0\.15 mm\)/.exec(text)?.[1], 0.15, 4);
    expectInches(/half the kerf, ([\d.]+) in \(0\.075 mm\)\./.exec(text)?.[1], 0.075, 4);
    expectInches(/Bed ([\d.]+) x [\d.]+ in \(600\.0 x 400\.0 mm\)/.exec(text)?.[1], 600, 2);
    const cut = inch.manifest.estimate.cutLengthMm;
    expectInches(new RegExp(`Cut length ([\\d.]+) in \\(${cut.toFixed(1)} mm\\)`).exec(text)?.[1], cut, 1);
    // Speeds stay in the profile's mm/s, said so; the coupon's widths stay in mm, and the text says why.
    expect(text).toContain('Cut speed 12.0 mm/s, 1 pass');
    expect(text).toMatch(/slots [\d. /]+ mm; C2/);
    expect(text).toContain('in millimetres in this inch pack too, as engraved on the coupon');
    // The assembly guide gives no lengths at all: nothing there to convert.
    const guide = await pdfText(file(inch, 'assembly-guide.pdf').data);
    expect(guide.text).not.toMatch(/\d ?(mm|in)\b/);
  });

  it('mm setup sheet prints the same lengths in mm only, as before', async () => {
    const { text } = await pdfText(file(mm, 'setup-sheet.pdf').data);
    for (const s of [
      'Thickness 3 mm',
      'Sheet 600 x 400 mm, margin 5 mm, gap 3 mm',
      'Bed 600.0 x 400.0 mm',
      'Kerf 0.15 mm',
      'offset outward by half the kerf (0.075 mm). Cut on the line',
      `Cut length ${mm.manifest.estimate.cutLengthMm.toFixed(1)} mm`,
    ])
      expect(text).toContain(s);
    expect(text).not.toMatch(/\d in\b/);
    expect(text).not.toContain('inch pack');
  });
});

describe('createCutPack failures and the command-line helper', () => {
  it('refuses a design with errors and a layout that cannot fit', async () => {
    const bad = design({ solid: 'cube', piece: { sides: 4, rotationDeg: 45, size: 0.5 } });
    await expect(createCutPack(input(bad))).rejects.toMatchObject({ code: 'PACK.DESIGN_INVALID' });
    const malformed = { ...octahedronHexagons(), piece: { sides: 6, step: 2, size: 1.3 } };
    await expect(createCutPack(input(malformed))).rejects.toMatchObject({ code: 'PACK.SPEC_INVALID' });
    const tiny = input(octahedronHexagons(), { sheet: { widthMm: 60, heightMm: 60 } });
    await expect(createCutPack(tiny)).rejects.toBeInstanceOf(CutPackError);
    await expect(createCutPack(tiny)).rejects.toMatchObject({ code: 'PACK.LAYOUT_FAILED' });
  });

  it('refuses a colour rule that one colour cannot meet (as build does), and colour names the files could not tell apart', async () => {
    const one = { ...octahedronHexagons(), colours: { count: 1, rule: 'neighbour-distinct' } };
    await expect(runPackCommand(one)).rejects.toMatchObject({
      code: 'PACK.LAYOUT_FAILED',
      message: expect.stringMatching(/needs at least 2/),
    });
    // The same failure with a fitted size: the fit search reports it among the design's errors, but it is a
    // layout failure all the same. (Derived: four faces meet at each vertex of the octahedron, so
    // vertex-distinct needs four colours.)
    const rule = { count: 3, rule: 'vertex-distinct' };
    const fixed = { ...octahedronHexagons(), colours: rule };
    const fixedFailure = await runPackCommand(fixed).catch((e: CutPackError) => e);
    expect(fixedFailure).toMatchObject({ code: 'PACK.LAYOUT_FAILED' });
    const fitted = { ...fixed, scale: { by: 'fitBed' }, bed: { widthMm: 300, heightMm: 300 } };
    await expect(runPackCommand(fitted)).rejects.toMatchObject({ code: 'PACK.LAYOUT_FAILED' });
    for (const colours of [
      ['Opal', 'opal'],
      ['Amber #2', 'amber-2'],
    ])
      await expect(createCutPack(input(octahedronHexagons(), { colours }))).rejects.toMatchObject({
        code: 'PACK.SAME_COLOUR_NAMES',
        details: colours,
      });
  });

  it('prints and engraves colour names the fonts lack under names they hold, and says so', async () => {
    const r = await createCutPack(input(octahedronHexagons(), { colours: ['日本', 'Grün'], archive: false }));
    const names = sheetsOf(r, 'dxf').map((f) => f.name);
    expect(names.some((n) => /-colour-1\.dxf$/.test(n))).toBe(true);
    expect(names.some((n) => /-grun\.dxf$/.test(n))).toBe(true);
    expect((r.manifest.warnings ?? []).join('\n')).toMatch(
      /"日本" .* printed as "colour 1" and engraved as "COLOUR 1"/,
    );
    const setup = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(setup.text).toMatch(/colour 1/);
    expect(setup.text).toMatch(/Grün/);
    expect(setup.text).not.toMatch(/日本/);
  });

  it('packs one colour with no rule, and says which colours a rule leaves without pieces', async () => {
    const one = await runPackCommand({ ...octahedronHexagons(), colours: { count: 1 } }, { archive: false });
    expect(one.manifest.sheetCount).toBeGreaterThan(0);
    // Opposite faces match: the octahedron's 8 faces make 4 pairs, so 4 of 6 colours at most.
    const six = await runPackCommand(
      { ...octahedronHexagons(), colours: { count: 6, rule: 'opposite-match' } },
      { archive: false },
    );
    expect(six.manifest.warnings).toContainEqual(
      '2 of the 6 colours get no pieces under the colour rule (colour-5, colour-6): no sheets of them are needed',
    );
  });

  it('tells the operator where the safety notices are when a pack carries none', async () => {
    const r = await createCutPack(input(octahedronHexagons(), { notices: [], archive: false }));
    const setup = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(setup.text).toMatch(/No safety notices were attached to this pack/);
    expect(setup.text).toMatch(/safety\/ ?notices/); // PDF text may break the line after the slash
  });

  it('leaves the material cost unknown, not nought, when the sheet has no price, and the setup sheet says so', async () => {
    const base = input(octahedronHexagons(), { archive: false });
    const r = await createCutPack({ ...base, material: { ...base.material, pricePerSheet: null } });
    expect(r.manifest.estimate.materialCost).toBeNull();
    expect(r.manifest.estimate.machineCost).toBeGreaterThan(0);
    const setup = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(setup.text).toMatch(/not priced \(no price for this sheet size in EUR\)/);
    expect(setup.text).not.toMatch(/Material cost\s*0\.00/);
  });

  it("takes the spec's bed for the machine and warns when the sheet fits the bed neither way round", async () => {
    const spec = { ...octahedronHexagons(), bed: { widthMm: 300, heightMm: 300 } };
    const inputOf = packInputFrom(spec, { sheet: { widthMm: 500, heightMm: 450 } });
    expect([inputOf.machine.bedWidthMm, inputOf.machine.bedHeightMm]).toEqual([300, 300]);
    expect(sheetOverBedNote(inputOf)).toBe(
      "the 500 × 450 mm sheet does not fit the machine's 300 × 300 mm bed: cut the stock down to the bed " +
        'first, or lay out on sheets the bed takes',
    );
    // A sheet bought in inches (24 × 18 in, exactly 25.4 mm to the inch: NIST SP 811) reads as a person writes
    // it, not as binary floating point leaves 24 × 25.4 (609.5999999999999).
    expect(sheetOverBedNote({ ...inputOf, sheet: { widthMm: 24 * 25.4, heightMm: 18 * 25.4 } })).toMatch(
      /^the 609\.6 × 457\.2 mm sheet does not fit the machine's 300 × 300 mm bed/,
    );
    // A sheet that fits turned a quarter turn is fine.
    expect(
      sheetOverBedNote({
        ...inputOf,
        sheet: { widthMm: 300, heightMm: 600 },
        machine: { ...inputOf.machine, bedWidthMm: 600 },
      }),
    ).toBeNull();
    const r = await runPackCommand(spec, { sheet: { widthMm: 500, heightMm: 450 }, archive: false });
    expect(r.manifest.warnings).toContainEqual(sheetOverBedNote(inputOf));
    const setup = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(setup.text).toMatch(/Bed 300\.0 x 300\.0 mm/);
  });

  it('gives a router design router defaults and, with no bed in the spec, a bed that takes the sheet', async () => {
    const spec = octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } });
    const inputOf = packInputFrom(spec, { sheet: { widthMm: 1220, heightMm: 2440 } });
    expect(inputOf.machine).toMatchObject({ kind: 'router', bedWidthMm: 1220, bedHeightMm: 2440 });
    expect(inputOf.machine.powerPct).toBeUndefined();
    const r = await runPackCommand(spec, { sheet: { widthMm: 1220, heightMm: 2440 }, archive: false });
    expect(r.manifest.warnings ?? []).not.toContainEqual(expect.stringMatching(/does not fit the machine/));
    const { text } = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(text).toMatch(/Spindle\s*as the profile sets/);
    expect(text).toMatch(/Plunge time\s*1\.00 s/);
    expect(text).not.toMatch(/Pierce time|Power/);
  });

  it("prints a router profile's spindle speed on the setup sheet, for the operator to set", async () => {
    const spec = octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } });
    const base = packInputFrom(spec, { sheet: { widthMm: 1220, heightMm: 2440 } });
    const r = await createCutPack({
      ...base,
      archive: false,
      machine: { ...base.machine, spindleRpm: 18000, powerPct: 65 },
    });
    const { text } = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(text).toMatch(/Spindle\s*18000 rpm/);
    // A power setting means nothing to a spindle: never printed as one.
    expect(text).not.toMatch(/65(\.0)? %/);
  });

  it('gives an inch pack a 1/8 in bit and its 1/16 in offset in inches (1 in = 25.4 mm exactly, NIST SP 811)', async () => {
    // A 1/8 in bit is 3.175 mm (common practice); the tool offset to type is its radius, 0.0625 in.
    const spec = octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } });
    const base = packInputFrom(spec, { sheet: { widthMm: 1220, heightMm: 2440 } });
    const r = await createCutPack({ ...base, units: 'in', archive: false });
    const { text } = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(text).toContain('Tool diameter 0.125 in (3.175 mm); dog-bone reliefs in slot corners');
    expect(text).toContain(
      "Set an outside tool offset of the bit's radius, 0.0625 in (1.5875 mm), in the machine",
    );
  });

  it("gives an inch pack's own warnings in inches, the millimetres beside them (1 in = 25.4 mm, NIST SP 811)", async () => {
    // The bit (1/8 in = 3.175 mm) raises a 1 mm gap to 4.175 mm and a 0 margin to 3.175 mm (see plan-layout); the
    // 1/4 in stock differs from the design's; the 48 × 24 in sheet does not fit a 24 × 24 in bed.
    const spec = { ...octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } }) };
    const base = packInputFrom(spec, {
      sheet: { widthMm: 48 * 25.4, heightMm: 24 * 25.4 },
      gapMm: 1,
      marginMm: 0,
      machine: { bedWidthMm: 24 * 25.4, bedHeightMm: 24 * 25.4 },
      material: { thicknessMm: 6.35 },
    });
    const r = await createCutPack({ ...base, units: 'in', archive: false });
    const warnings = r.manifest.warnings ?? [];
    expect(warnings).toContainEqual(
      'pieces are laid out 0.164 in (4.175 mm) apart, not 0.0394 in (1 mm): the 0.125 in (3.175 mm) bit, ' +
        'passing outside both neighbours on separate paths, needs that much room between neighbours',
    );
    expect(warnings).toContainEqual(
      "pieces keep 0.125 in (3.175 mm) from the sheet's edges, not 0.0000 in (0 mm): the 0.125 in (3.175 mm) " +
        'bit passes outside each piece and must stay on the stock',
    );
    expect(warnings).toContainEqual(
      "the 48.00 × 24.00 in (1219.2 × 609.6 mm) sheet does not fit the machine's 24.00 × 24.00 in " +
        '(609.6 × 609.6 mm) bed: cut the stock down to the bed first, or lay out on sheets the bed takes',
    );
    expect(warnings).toContainEqual(
      `the material is 0.250 in (6.35 mm) thick but the design was built for ${(spec.stock.thicknessMm / 25.4).toFixed(3)} in ` +
        `(${spec.stock.thicknessMm} mm) stock: slot widths follow the design`,
    );
    // The setup sheet prints the same words.
    const { text } = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(text.replace(/\s+/g, ' ')).toContain('pieces are laid out 0.164 in (4.175 mm) apart');
  });

  it('fits a fitBed design without a stock sheet to the sheet the pack lays out on (600 × 400, margin 5)', async () => {
    // Sized to the 600 × 400 bed alone, the largest piece would not fit the default sheet less its margins.
    const spec = { ...octahedronHexagons(), scale: { by: 'fitBed' }, bed: { widthMm: 600, heightMm: 400 } };
    const r = await runPackCommand(spec, { archive: false });
    expect(r.manifest.sheetCount).toBeGreaterThan(0);
    expect(r.files.filter((f) => /^sheet-.*\.dxf$/.test(f.name))).toHaveLength(r.manifest.sheetCount);
  });

  it("compares a profile's machine kind with the design's by how it cuts (a CO2 laser is a laser)", async () => {
    const spec = octahedronHexagons();
    const base = input(spec, { archive: false });
    const laser = await createCutPack({ ...base, machine: { ...base.machine, kind: 'co2-laser' } });
    expect(laser.manifest.warnings ?? []).not.toContainEqual(expect.stringMatching(/compensated for/));
    const router = await createCutPack({ ...base, machine: { ...base.machine, kind: 'cnc-router' } });
    expect(router.manifest.warnings).toContainEqual(
      'the machine profile is a cnc-router but the design is compensated for a laser',
    );
  });

  it('engraves the scale mark on a piece, clear of its cuts and labels, when no stock is free, never off the sheet', () => {
    // One 200 × 100 piece filling a 200 × 100 sheet with no margin, a label near its left end.
    const outline: [number, number][] = [
      [0, 0],
      [200, 0],
      [200, 100],
      [0, 100],
    ];
    const label: [number, number][][] = [
      [
        [10, 40],
        [40, 60],
      ],
    ];
    const m = placeScaleMark(
      { widthMm: 200, heightMm: 100 },
      0,
      [{ id: 'P7', outline, marks: label }],
      'mm',
      2,
    );
    expect(m.offSheet).toBe(false);
    expect(m.onPiece).toBe('P7');
    expect(m.lengthMm).toBe(100);
    // The bar lies inside the piece at least 2 mm from its edges and clear of the label's box.
    const [x0, y] = m.from;
    const x1 = m.to[0];
    expect(x0).toBeGreaterThanOrEqual(2);
    expect(x1).toBeLessThanOrEqual(198);
    expect(y).toBeGreaterThanOrEqual(2);
    expect(x0 > 41 || x1 < 9 || y > 61 || y + 10 < 39).toBe(true);
    // With free stock beside the piece, the mark goes there instead.
    const free = placeScaleMark(
      { widthMm: 400, heightMm: 100 },
      0,
      [{ id: 'P7', outline, marks: label }],
      'mm',
      2,
    );
    expect(free.onPiece).toBeUndefined();
    expect(free.from[0]).toBeGreaterThan(200);
  });

  it('keeps the whole scale mark, label included, clear of the cuts when only a short bar fits', () => {
    // Two 20 mm-wide pieces fill a 60 × 40 sheet's sides, leaving a pocket too narrow for the 20 mm (1 in) bar.
    // "10 MM" and "0.5 IN" in the 3.5 mm stroke font are wider than their bars (15.7 and 14.5 mm against 10 and
    // 12.7): every stroke of the mark, read back from the DXF with dxf-parser, must still lie clear of every cut
    // line by the clearance, or inside one piece as far from its edges (polygon-clipping: a disc of that radius
    // round each point lies wholly inside or wholly outside each piece, and on the sheet).
    const clearMm = 2;
    const machine = {
      cutSpeedMmS: 10,
      markSpeedMmS: 100,
      pierceTimeS: 0.5,
      rapidSpeedMmS: 200,
      hourlyRate: 0,
    };
    for (const [units, pocketMm] of [
      ['mm', 15],
      ['in', 18],
    ] as const) {
      const rect = (x0: number, x1: number): [number, number][] => [
        [x0, 0],
        [x1, 0],
        [x1, 40],
        [x0, 40],
      ];
      const parts = [
        { id: 'P1', outline: rect(0, 20), marks: [] },
        { id: 'P2', outline: rect(20 + pocketMm, 60), marks: [] },
      ];
      const sheet = drawSheet({
        name: 'sheet-01',
        title: 'pocket',
        colourName: '',
        sheet: { widthMm: 60, heightMm: 40 },
        marginMm: 0,
        clearMm,
        parts,
        units,
        machine,
      });
      const k = units === 'in' ? 25.4 : 1;
      const d = readDxf(new TextEncoder().encode(sheetToDxf(sheet, units)));
      const points = d.mark.flat().map((p) => [p[0] * k, p[1] * k] as P);
      expect(points.length).toBeGreaterThan(0);
      for (const p of points) {
        const c = disc(p, clearMm - 1e-3);
        expect(outsideArea(c, rect(0, 60))).toBeLessThan(1e-9);
        for (const part of parts) {
          const inside = outsideArea(c, part.outline) < 1e-9;
          const outside = overlapArea(c, part.outline) < 1e-9;
          expect(inside || outside).toBe(true);
        }
      }
    }
  });

  it('keeps the scale mark off the stock edge on a sheet with no margin', () => {
    // Common practice: an engraving on the edge is half off the stock. With no margin and nothing on the
    // sheet, the bar and its box keep the same clearance from the edges as from pieces (here 3 mm).
    const m = placeScaleMark({ widthMm: 300, heightMm: 200 }, 0, [], 'mm', 3);
    expect(m.offSheet).toBe(false);
    expect(m.from[0]).toBeGreaterThanOrEqual(3);
    expect(m.from[1]).toBeGreaterThanOrEqual(3);
    // A wider margin still rules.
    const inside = placeScaleMark({ widthMm: 300, heightMm: 200 }, 12, [], 'mm', 3);
    expect(inside.from[1]).toBeGreaterThanOrEqual(12);
  });

  it('keeps the SVG page to the sheet when the margin is under a millimetre', async () => {
    const r = await createCutPack(input(octahedronHexagons(), { marginMm: 0, archive: false }));
    expect(r.manifest.warnings ?? []).not.toContainEqual(expect.stringMatching(/below the sheet/));
    for (const f of sheetsOf(r, 'svg')) {
      const s = readSvg(f.data);
      expect(s.viewBox).toEqual([0, 0, 600, 400]);
      expect([s.height, s.unit]).toEqual([400, 'mm']);
    }
  });

  it('grows the SVG page to hold a scale mark that lies below a sheet narrower than the mark', async () => {
    // An 11.2 mm square sheet filled by one piece: the 50 mm bar can only go below it, and reaches well past
    // its right edge. W3C SVG: whatever lies outside the viewBox is clipped, so the page must hold all of it.
    const spec = design({
      solid: 'cube',
      piece: { sides: 4, rotationDeg: 45, size: 1.7 },
      scale: { by: 'diameter', mm: 15 },
      stock: { thicknessMm: 0.3, flexible: false },
      machine: { kind: 'laser', kerfMm: 0.05 },
    });
    const r = await createCutPack(
      input(spec, {
        sheet: { widthMm: 11.202, heightMm: 11.202 },
        marginMm: 1,
        gapMm: 0.5,
        colours: ['saffron'],
        archive: false,
      }),
    );
    expect(r.manifest.warnings ?? []).toContainEqual(expect.stringMatching(/it lies below the sheet/));
    for (const f of sheetsOf(r, 'svg')) {
      const s = readSvg(f.data);
      const [x0, y0, w, h] = s.viewBox as [number, number, number, number];
      // One user unit is still one millimetre, and the sheet's corner still at (0, sheet height) as in the DXF.
      expect([s.width, s.height]).toEqual([w, h]);
      expect(x0).toBe(0);
      expect(y0).toBe(0);
      const drawn = [...s.cut, ...s.mark].flat();
      expect(Math.max(...drawn.map((p) => p[0]))).toBeLessThanOrEqual(x0 + w);
      expect(Math.max(...drawn.map((p) => p[1]))).toBeLessThanOrEqual(y0 + h);
      expect(w).toBeGreaterThan(50);
      expect(Math.min(...drawn.map((p) => p[0]))).toBeGreaterThanOrEqual(x0);
    }
  });

  it('lays router pieces a bit diameter and 1 mm apart and says so when the gap asked for is narrower', async () => {
    const spec = octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } });
    const r = await createCutPack(
      input(spec, { gapMm: 1, machine: { ...input(spec).machine, kind: 'router' }, archive: false }),
    );
    expect(r.manifest.warnings).toContainEqual(
      expect.stringMatching(/4\.175 mm apart, not 1 mm: the 3\.175 mm bit/),
    );
    const setup = await pdfText(file(r, 'setup-sheet.pdf').data);
    expect(setup.text).toMatch(/gap 4\.175 mm/);
    expect(setup.text).toMatch(/Tool diameter\s*3\.175 mm/);
    expect(setup.text).toMatch(/outside tool offset of the bit's\s+radius \(1\.5875 mm\)/);
  });

  it("estimates a router's cut along the bit centre's path, longer than the drawn outlines (parsed DXF)", async () => {
    // The files carry the nominal outline and the machine's tool offset runs the bit's centre half a diameter
    // outside it (common practice: tool radius compensation), so that path is what the time is worked on.
    const spec = octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 3.175 } });
    const r = await createCutPack(
      input(spec, { machine: { ...input(spec).machine, kind: 'router' }, archive: false }),
    );
    let drawn = 0;
    let path = 0;
    for (const f of sheetsOf(r, 'dxf'))
      for (const c of readDxf(f.data).cut) {
        drawn += perimeterOf(c);
        path += toolPathLength(c, 3.175);
      }
    expect(r.manifest.estimate.cutLengthMm).toBeCloseTo(path, 1);
    expect(path).toBeGreaterThan(drawn);
  });

  it("puts the design's warnings on the setup sheet (pdf-parse), one line per kind, collisions first", async () => {
    // A tetrahedron of {7/2} stars in 3.54 mm stock (our own design): three pairs of pieces run into each
    // other through the stock's thickness, and twelve slots leave thin webs. Four colours: every face meets
    // every other.
    const spec = design({
      solid: 'tetrahedron',
      piece: { sides: 7, step: 2, rotationDeg: 285, size: 1.785 },
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm: 3.54 },
    });
    const pack = await createCutPack(
      input(spec, {
        colours: ['birch', 'teal', 'plum', 'slate'],
        material: { ...input(spec).material, thicknessMm: 3.54 },
      }),
    );
    const { text } = await pdfText(file(pack, 'setup-sheet.pdf').data);
    const flat = text.replace(/\s+/g, ' ');
    const clash = flat.indexOf(
      'design: PIECE.THICKNESS_CLASH (3 findings; the first): P1 and P2 run into each other',
    );
    const web = flat.indexOf('design: SLOT.THIN_WEB (');
    expect(clash).toBeGreaterThan(-1);
    expect(web).toBeGreaterThan(clash);
    expect((pack.manifest.warnings ?? []).filter((w) => w.startsWith('design: '))).toHaveLength(2);
  });

  it('runPackCommand reads sheet, margin, gap and colours from the spec', async () => {
    const raw = {
      ...octahedronHexagons(),
      stock: { thicknessMm: 3, sheet: { widthMm: 500, heightMm: 450 }, marginMm: 8, gapMm: 4 },
      colours: { count: 2, rule: 'neighbour-distinct' },
    };
    const r = await runPackCommand(raw);
    const svgs = sheetsOf(r, 'svg').map((f) => readSvg(f.data));
    expect(svgs.map((s) => [s.width, s.height])).toEqual(svgs.map(() => [500, 450]));
    const dxfNames = sheetsOf(r, 'dxf').map((f) => f.name);
    expect(dxfNames.some((n) => /^sheet-\d+-colour-1\.dxf$/.test(n))).toBe(true);
    expect(dxfNames.some((n) => /^sheet-\d+-colour-2\.dxf$/.test(n))).toBe(true);
    for (const f of sheetsOf(r, 'dxf')) {
      for (const c of readDxf(f.data).cut) {
        // 8 mm margin: every vertex at least 8 mm inside the sheet edges (up to rounding).
        for (const p of c) {
          expect(Math.min(p[0], p[1], 500 - p[0], 450 - p[1])).toBeGreaterThan(8 - 1e-3);
        }
      }
    }
  });
});
