/**
 * Test helpers (not a suite): read pack files back with independent parsers from npm — dxf-parser for DXF,
 * svg-path-parser for SVG path data, polygon-clipping for areas and containment.
 */
import { execFileSync } from 'node:child_process';
import DxfParser from 'dxf-parser';
import * as polygonClipping from 'polygon-clipping';
import { makeAbsolute, parseSVG } from 'svg-path-parser';

export type P = [number, number];

export interface ParsedDxf {
  insUnits: unknown;
  /** Closed polylines on the cut layer, in file order. */
  cut: P[][];
  /** Open polylines on the mark layer, in file order. */
  mark: P[][];
  /** Every polyline in file order with its layer. */
  all: { layer: string; closed: boolean; pts: P[] }[];
  layers: string[];
}

export function readDxf(bytes: Uint8Array): ParsedDxf {
  const doc = new DxfParser().parseSync(new TextDecoder().decode(bytes));
  if (!doc) throw new Error('dxf-parser returned nothing');
  const all = doc.entities
    .filter((e) => e.type === 'LWPOLYLINE')
    .map((e) => {
      const pl = e as unknown as { layer: string; shape?: boolean; vertices: { x: number; y: number }[] };
      return { layer: pl.layer, closed: pl.shape === true, pts: pl.vertices.map((v) => [v.x, v.y] as P) };
    });
  return {
    insUnits: doc.header.$INSUNITS,
    cut: all.filter((x) => x.layer === 'cut').map((x) => x.pts),
    mark: all.filter((x) => x.layer === 'mark').map((x) => x.pts),
    all,
    layers: Object.keys(doc.tables.layer.layers),
  };
}

export interface ParsedSvg {
  width: number;
  height: number;
  unit: string;
  viewBox: number[];
  cut: P[][];
  mark: P[][];
}

function pathsIn(svg: string, group: string): P[][] {
  const body = new RegExp(`<g id="${group}"[^>]*>([\\s\\S]*?)</g>`).exec(svg)?.[1] ?? '';
  return [...body.matchAll(/<path d="([^"]+)"/g)].map((m) => {
    const cmds = makeAbsolute(parseSVG(m[1]!));
    return cmds.filter((c) => c.code === 'M' || c.code === 'L').map((c) => [c.x ?? 0, c.y ?? 0] as P);
  });
}

export function readSvg(bytes: Uint8Array): ParsedSvg {
  const svg = new TextDecoder().decode(bytes);
  const w = /<svg[^>]* width="([\d.]+)(mm|in)"/.exec(svg);
  const h = /<svg[^>]* height="([\d.]+)(mm|in)"/.exec(svg);
  return {
    width: Number(w?.[1]),
    height: Number(h?.[1]),
    unit: w?.[2] ?? '',
    viewBox: (/viewBox="([^"]+)"/.exec(svg)?.[1] ?? '').split(/\s+/).map(Number),
    cut: pathsIn(svg, 'cut'),
    mark: pathsIn(svg, 'mark'),
  };
}

/** Area of a polygon-clipping result (outer rings minus holes). */
export function areaOf(g: polygonClipping.Geom): number {
  const polys = (Array.isArray(g[0]?.[0]?.[0]) ? g : [g]) as P[][][];
  return polys.reduce(
    (s, poly) =>
      s +
      poly.reduce((t, r, k) => {
        let a = 0;
        for (let i = 0; i < r.length - 1; i++) a += r[i]![0] * r[i + 1]![1] - r[i + 1]![0] * r[i]![1];
        const n = r.length;
        if (n && (r[0]![0] !== r[n - 1]![0] || r[0]![1] !== r[n - 1]![1]))
          a += r[n - 1]![0] * r[0]![1] - r[0]![0] * r[n - 1]![1];
        return t + (k === 0 ? 1 : -1) * Math.abs(a / 2);
      }, 0),
    0,
  );
}

export const polyArea = (pts: P[]): number => areaOf(polygonClipping.union([pts]));
export const overlapArea = (a: P[], b: P[]): number => areaOf(polygonClipping.intersection([a], [b]));
export const outsideArea = (a: P[], b: P[]): number => areaOf(polygonClipping.difference([a], [b]));

/** A regular 32-gon of radius r about p (nearly the disc). */
export const disc = (p: P, r: number): P[] =>
  Array.from({ length: 32 }, (_, i) => [
    p[0] + r * Math.cos((i * Math.PI) / 16),
    p[1] + r * Math.sin((i * Math.PI) / 16),
  ]);

export const perimeterOf = (pts: P[], closed = true): number => {
  let s = 0;
  const n = pts.length;
  for (let i = 0; i < (closed ? n : n - 1); i++) {
    const a = pts[i]!;
    const b = pts[(i + 1) % n]!;
    s += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return s;
};

/** The scale bar among mark polylines: four points tick–bar–tick with a horizontal bar. Returns its length. */
export function scaleBars(mark: P[][], tol = 1e-6): number[] {
  return mark
    .filter(
      (s) =>
        s.length === 4 &&
        Math.abs(s[0]![0] - s[1]![0]) < tol &&
        Math.abs(s[1]![1] - s[2]![1]) < tol &&
        Math.abs(s[2]![0] - s[3]![0]) < tol &&
        Math.abs(s[0]![1] - s[3]![1]) < tol,
    )
    .map((s) => Math.abs(s[2]![0] - s[1]![0]));
}

/**
 * Text and info of a PDF read back with pdf-parse (npm). pdf.js needs dynamic imports that Jest's VM cannot
 * run, so the parser runs in a plain Node child process.
 */
export function readPdf(data: Uint8Array): { text: string; info: Record<string, unknown> } {
  const script = `
    const { PDFParse } = require(process.argv[1]);
    const chunks = [];
    process.stdin.on('data', (c) => chunks.push(c));
    process.stdin.on('end', async () => {
      const p = new PDFParse({ data: new Uint8Array(Buffer.concat(chunks)) });
      const t = await p.getText();
      const i = await p.getInfo();
      await p.destroy();
      process.stdout.write(JSON.stringify({ text: t.text, info: i.info }));
    });`;
  const out = execFileSync(process.execPath, ['-e', script, require.resolve('pdf-parse')], {
    input: Buffer.from(data),
    maxBuffer: 64 * 1024 * 1024,
  });
  const parsed = JSON.parse(out.toString('utf8')) as { text: string; info: Record<string, unknown> };
  return { text: parsed.text.replace(/\s+/g, ' '), info: parsed.info };
}
