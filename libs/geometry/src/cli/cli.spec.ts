import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import DxfParser from 'dxf-parser';
import { fileSystemIo, main } from '../cli';
import { type CliIo } from './command';
import { octahedronHexagons } from '../test-support/designs';

const fixtures = path.join(__dirname, '..', 'test-support', 'fixtures');

function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { ...fileSystemIo, out: (t) => out.push(t), err: (t) => err.push(t) };
  return main(args, io).then((code) => ({ code, out: out.join(''), err: err.join('') }));
}

describe('CLI build', () => {
  let dir: string;
  beforeEach(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-cli-'));
  });
  afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

  it.each([
    'octahedron-hexagons',
    'cube-squares-45',
    'cube-star-8-3',
    'uploaded-rhombic-dodecahedron-hexagons',
  ])('writes report.json and a DXF and an SVG per piece for %s', async (name) => {
    const r = await run(['build', path.join(fixtures, `${name}.json`), '--out', dir]);
    expect(r.code).toBe(0);
    const report = JSON.parse(fs.readFileSync(path.join(dir, 'report.json'), 'utf8'));
    const files = fs.readdirSync(dir).sort();
    expect(files).toHaveLength(1 + 2 * report.pieces.length);
    for (const p of report.pieces) {
      expect(files).toContain(`${p.id}.dxf`);
      expect(files).toContain(`${p.id}.svg`);
    }
    const doc = new DxfParser().parseSync(fs.readFileSync(path.join(dir, 'P1.dxf'), 'utf8'));
    expect(doc?.header.$INSUNITS).toBe(4);
  });

  it('writes no cut files for the antiprism lamp whose top and bottom stars have no slot', async () => {
    const r = await run(['build', path.join(fixtures, 'uploaded-antiprism-stars.json'), '--out', dir]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/PIECE\.NO_SLOT/);
    expect(fs.readdirSync(dir)).toEqual(['report.json']);
  });

  it('removes the piece files an earlier build left in the folder when this design has errors', async () => {
    expect((await run(['build', path.join(fixtures, 'octahedron-hexagons.json'), '--out', dir])).code).toBe(
      0,
    );
    fs.writeFileSync(path.join(dir, 'notes.txt'), 'the workshop keeps its own files here');
    const r = await run(['build', path.join(fixtures, 'uploaded-antiprism-stars.json'), '--out', dir]);
    expect(r.code).toBe(1);
    expect(fs.readdirSync(dir).sort()).toEqual(['notes.txt', 'report.json']);
    expect(r.err).toMatch(/removed 16 files an earlier run left/);
  });

  it('prints the report with --json', async () => {
    const r = await run(['build', path.join(fixtures, 'octahedron-hexagons.json'), '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).pieces).toHaveLength(8);
  });

  it('exits non-zero with one line and writes nothing for an invalid spec', async () => {
    const r = await run(['build', path.join(fixtures, 'bad-compound.json'), '--out', dir]);
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/piece\.step/);
    expect(r.err).toMatch(/colour/);
    expect(fs.readdirSync(dir)).toEqual([]);
  });

  it('exits non-zero with one line and writes nothing for a bad upload', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(
      spec,
      JSON.stringify(
        octahedronHexagons({ solid: { format: 'off', text: 'OFF\n3 0 0\n0 0 0\n1 0 0\n0 1 0\n' } }),
      ),
    );
    const out = path.join(dir, 'out');
    const r = await run(['build', spec, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/SOLID\.FLAT/);
    expect(fs.existsSync(out)).toBe(false);
  });

  it('writes the report but no cut files when the design has errors', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(spec, JSON.stringify(octahedronHexagons({ piece: { sides: 6, size: 0.5 } })));
    const out = path.join(dir, 'out');
    const r = await run(['build', spec, '--out', out]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/DESIGN\.NO_CROSSINGS/);
    expect(fs.readdirSync(out)).toEqual(['report.json']);
  });

  it('refuses an --out it cannot write with one line and exit code 2', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(spec, JSON.stringify(octahedronHexagons()));
    const blocker = path.join(dir, 'a-file');
    fs.writeFileSync(blocker, 'not a directory');
    const r = await run(['build', spec, '--out', path.join(blocker, 'out')]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: cannot write the output: E[A-Z]+/);
  });

  it('makes nested --out folders, and refuses one under /proc instead of hanging as recursive mkdirSync does', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(spec, JSON.stringify(octahedronHexagons()));
    const nested = path.join(dir, 'a', 'b', 'c');
    const ok = await run(['build', spec, '--out', nested]);
    expect(ok.code).toBe(0);
    expect(fs.existsSync(path.join(nested, 'report.json'))).toBe(true);
    if (!fs.existsSync('/proc/self')) return; // Linux only
    const r = await run(['build', spec, '--out', '/proc/kerfwright-test/out']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: cannot write the output: E[A-Z]+/);
  });

  it('reports unreadable JSON, unknown commands and missing arguments', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(spec, '{ not json');
    expect((await run(['build', spec, '--out', dir])).code).toBe(2);
    expect((await run(['frobnicate'])).code).toBe(2);
    expect((await run(['build'])).code).toBe(2);
    expect((await run(['build', spec])).code).toBe(2);
    expect((await run(['--help'])).out).toMatch(/build SPEC\.json/);
  });

  it('reads a spec saved with a byte-order mark, as some editors on Windows save UTF-8', async () => {
    const spec = path.join(dir, 'spec.json');
    fs.writeFileSync(
      spec,
      '\uFEFF' + fs.readFileSync(path.join(fixtures, 'octahedron-hexagons.json'), 'utf8'),
    );
    const r = await run(['build', spec, '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).pieces).toHaveLength(8);
  });
});
