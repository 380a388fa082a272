import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import DxfParser from 'dxf-parser';
import JSZip from 'jszip';
import polygonClipping from 'polygon-clipping';
import { fileSystemIo, main } from '../cli';
import { octahedronHexagons } from '../test-support/designs';
import { type CliIo } from './command';

function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { ...fileSystemIo, out: (t) => out.push(t), err: (t) => err.push(t) };
  return main(args, io).then((code) => ({ code, out: out.join(''), err: err.join('') }));
}

let dir: string;
beforeEach(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-cli-'));
});
afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

const writeJson = (name: string, value: unknown) => {
  const file = path.join(dir, name);
  fs.writeFileSync(file, typeof value === 'string' ? value : JSON.stringify(value));
  return file;
};

describe('CLI nest', () => {
  it('prints placements that stay on the sheet and do not overlap', async () => {
    const square: [number, number][] = [
      [0, 0],
      [40, 0],
      [40, 40],
      [0, 40],
    ];
    const file = writeJson('parts.json', {
      sheet: { widthMm: 200, heightMm: 100 },
      marginMm: 2,
      gapMm: 2,
      parts: [{ id: 'sq', outline: square, quantity: 6 }],
    });
    const r = await run(['nest', file]);
    expect(r.code).toBe(0);
    const output = JSON.parse(r.out);
    const placements = output.sheets.flatMap(
      (s: { placements: { x: number; y: number; rotationDeg: number }[] }, i: number) =>
        s.placements.map((p) => ({ ...p, sheet: i })),
    );
    expect(placements).toHaveLength(6);
    // Independent check with polygon-clipping: place each square (turn, then shift) and intersect.
    const placed = placements.map((p: { x: number; y: number; rotationDeg: number; sheet: number }) => {
      const a = (p.rotationDeg * Math.PI) / 180;
      return {
        sheet: p.sheet,
        poly: square.map(
          ([x, y]) =>
            [x * Math.cos(a) - y * Math.sin(a) + p.x, x * Math.sin(a) + y * Math.cos(a) + p.y] as [
              number,
              number,
            ],
        ),
      };
    });
    for (const p of placed) {
      for (const [x, y] of p.poly) {
        expect(x).toBeGreaterThanOrEqual(2 - 1e-6);
        expect(y).toBeGreaterThanOrEqual(2 - 1e-6);
        expect(x).toBeLessThanOrEqual(198 + 1e-6);
        expect(y).toBeLessThanOrEqual(98 + 1e-6);
      }
    }
    for (let i = 0; i < placed.length; i++)
      for (let j = i + 1; j < placed.length; j++) {
        if (placed[i].sheet !== placed[j].sheet) continue;
        const inter = polygonClipping.intersection([placed[i].poly], [placed[j].poly]);
        expect(inter).toEqual([]);
      }
  });

  it('exits 1 with the error JSON when a part fits no sheet, 2 for unreadable JSON', async () => {
    const file = writeJson('parts.json', {
      sheet: { widthMm: 20, heightMm: 10 },
      parts: [
        {
          id: 'big',
          outline: [
            [0, 0],
            [40, 0],
            [40, 40],
          ],
        },
      ],
    });
    const r = await run(['nest', file]);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.out).error.partIds).toEqual(['big']);
    expect((await run(['nest', writeJson('bad.json', '{ nope')])).code).toBe(2);
    expect((await run(['nest', writeJson('empty.json', {})])).code).toBe(1);
    expect((await run(['nest'])).code).toBe(2);
  });
});

describe('CLI pack and coupon', () => {
  const spec = {
    ...octahedronHexagons(),
    stock: { thicknessMm: 3, sheet: { widthMm: 500, heightMm: 450 }, marginMm: 8, gapMm: 4 },
    colours: { count: 2, rule: 'neighbour-distinct' },
  };

  it('writes the cut pack, every file listed in the manifest with its SHA-256', async () => {
    const out = path.join(dir, 'pack');
    const r = await run(['pack', writeJson('spec.json', spec), '--out', out, '--zip', '--json']);
    expect(r.code).toBe(0);
    const manifest = JSON.parse(r.out);
    const files = fs.readdirSync(out).sort();
    const zipName = files.find((n) => n.endsWith('.zip')) as string;
    expect(zipName).toMatch(/^cut-pack-.*\.zip$/);
    expect(files).toEqual(
      [...manifest.files.map((f: { name: string }) => f.name), 'manifest.json', zipName].sort(),
    );
    for (const f of manifest.files) {
      const data = fs.readFileSync(path.join(out, f.name));
      expect(data.length).toBe(f.bytes);
      expect(createHash('sha256').update(data).digest('hex')).toBe(f.sha256);
    }
    expect(files).toEqual(
      expect.arrayContaining(['setup-sheet.pdf', 'assembly-guide.pdf', 'coupon.dxf', 'coupon.svg']),
    );
    // Both colours get sheets; the sheet count matches the build report's for the same spec.
    expect(files.some((n) => /^sheet-\d+-colour-1\.dxf$/.test(n))).toBe(true);
    expect(files.some((n) => /^sheet-\d+-colour-2\.dxf$/.test(n))).toBe(true);
    const built = await run(['build', writeJson('spec2.json', spec), '--json']);
    expect(JSON.parse(built.out).sheetCount).toBe(manifest.sheetCount);
    // The ZIP holds every other file.
    const zip = await JSZip.loadAsync(fs.readFileSync(path.join(out, zipName)));
    expect(Object.keys(zip.files).sort()).toEqual(files.filter((n) => n !== zipName));
    // PDF files start with the PDF header (ISO 32000-1, 7.5.2).
    expect(fs.readFileSync(path.join(out, 'setup-sheet.pdf')).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('removes the sheets and ZIP of an earlier, larger pack in the same folder, and nothing else', async () => {
    const out = path.join(dir, 'reused');
    const eight = { ...spec, colours: { count: 8, rule: 'neighbour-distinct' } };
    expect((await run(['pack', writeJson('eight.json', eight), '--out', out, '--zip'])).code).toBe(0);
    fs.writeFileSync(path.join(out, 'operator-notes.txt'), 'kept');
    const r = await run(['pack', writeJson('spec.json', spec), '--out', out, '--json']);
    expect(r.code).toBe(0);
    const manifest = JSON.parse(r.out);
    expect(fs.readdirSync(out).sort()).toEqual(
      [...manifest.files.map((f: { name: string }) => f.name), 'manifest.json', 'operator-notes.txt'].sort(),
    );
    expect(r.err).toMatch(/removed \d+ files an earlier run left in .*cut-pack-.*\.zip/);
  });

  it('writes inch files with --units in', async () => {
    const out = path.join(dir, 'pack-in');
    const r = await run(['pack', writeJson('spec.json', spec), '--out', out, '--units', 'in']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/wrote \d+ files/);
    const sheet = fs.readdirSync(out).find((n) => /^sheet-01-.*\.dxf$/.test(n)) as string;
    const doc = new DxfParser().parseSync(fs.readFileSync(path.join(out, sheet), 'utf8'));
    // DXF $INSUNITS 1 = inches (Autodesk DXF reference, from memory; see REFERENCES.md).
    expect(doc?.header.$INSUNITS).toBe(1);
  });

  it('exits non-zero with one line and writes nothing for an invalid spec or a design with errors', async () => {
    const out = path.join(dir, 'nothing');
    const invalid = await run([
      'pack',
      writeJson('bad.json', { ...spec, colours: { count: 0 } }),
      '--out',
      out,
    ]);
    expect(invalid.code).toBe(2);
    expect(invalid.err.trim().split('\n')).toHaveLength(1);
    expect(invalid.err).toMatch(/colours\.count/);
    const broken = await run([
      'pack',
      writeJson('broken.json', { ...spec, piece: { sides: 6, size: 0.5 } }),
      '--out',
      out,
    ]);
    expect(broken.code).toBe(1);
    expect(broken.err.trim().split('\n')).toHaveLength(1);
    expect(broken.err).toMatch(/PACK\.DESIGN_INVALID/);
    const noPlan = await run([
      'pack',
      writeJson('noplan.json', { ...spec, colours: { count: 2, rule: 'vertex-distinct' } }),
      '--out',
      out,
    ]);
    // Four faces meet at each octahedron vertex: vertex-distinct needs 4 colours (derived).
    expect(noPlan.code).toBe(1);
    expect(noPlan.err).toMatch(/no plan exists/);
    expect(fs.existsSync(out)).toBe(false);
    expect((await run(['pack', writeJson('s.json', spec)])).code).toBe(2);
    expect((await run(['pack', writeJson('s.json', spec), '--out', out, '--units', 'cm'])).code).toBe(2);
  });

  it('writes the coupon alone', async () => {
    const out = path.join(dir, 'coupon');
    const r = await run(['coupon', writeJson('spec.json', spec), '--out', out]);
    expect(r.code).toBe(0);
    expect(fs.readdirSync(out).sort()).toEqual(['coupon.dxf', 'coupon.svg', 'manifest.json']);
    // Again into the same folder: replaced.
    expect((await run(['coupon', writeJson('spec.json', spec), '--out', out])).code).toBe(0);
  });

  it("refuses to write a coupon alone into a pack's folder, which would leave the pack's manifest wrong", async () => {
    const out = path.join(dir, 'pack');
    expect((await run(['pack', writeJson('spec.json', spec), '--out', out])).code).toBe(0);
    const before = fs.readFileSync(path.join(out, 'manifest.json'), 'utf8');
    const r = await run(['coupon', writeJson('spec.json', spec), '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/holds a cut pack/);
    expect(fs.readFileSync(path.join(out, 'manifest.json'), 'utf8')).toBe(before);
  });

  it('cuts a fitBed spec at the fitted size', async () => {
    const out = path.join(dir, 'fit');
    const fit = { ...octahedronHexagons(), scale: { by: 'fitBed' }, bed: { widthMm: 250, heightMm: 250 } };
    const built = JSON.parse((await run(['build', writeJson('fit.json', fit), '--json'])).out);
    expect(built.scale.method).toBe('fitBed');
    const r = await run(['pack', writeJson('fit2.json', fit), '--out', out, '--json']);
    expect(r.code).toBe(0);
    const sheetSvg = fs.readdirSync(out).find((n) => /^sheet-01-.*\.svg$/.test(n)) as string;
    expect(sheetSvg).toBeDefined();
  });
});
