import OBJFile from 'obj-file-parser';
import { type Vec3 } from '../math/vec';
import { type Solid, SolidError, solidFromPoints } from './polyhedron';

/** Largest accepted upload, in UTF-16 code units of the text (about bytes for ASCII files). */
export const MAX_SOLID_TEXT_LENGTH = 5_000_000;
/** Largest accepted number of vertices in an upload. */
export const MAX_SOLID_VERTICES = 20_000;
/** Largest number of faces (pieces) a solid may have after coplanar facets are merged. */
export const MAX_SOLID_FACES = 200;

export type SolidTextFormat = 'obj' | 'off';

/** A mesh as uploaded: its vertices and, where the file gives them, its faces (0-based vertex indices). */
export interface UploadedMesh {
  points: Vec3[];
  faces: number[][];
}

/** Vertex coordinates from Wavefront OBJ text (obj-file-parser; all objects and groups). */
export function parseObjVertices(text: string): Vec3[] {
  return parseObj(text).points;
}

/** Vertices and faces from Wavefront OBJ text; face indices are 1-based across the file (OBJ's own rule). */
export function parseObj(text: string): UploadedMesh {
  if (!/^\s*v\s/m.test(text))
    throw new SolidError('SOLID.NOT_OBJ', 'the text has no OBJ vertex lines ("v x y z")');
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const m = /^\s*v\s+(.*)$/.exec(lines[i] as string);
    if (!m) continue;
    const tokens = (m[1] ?? '').trim().split(/\s+/);
    if (tokens.length < 3) {
      throw new SolidError('SOLID.NOT_OBJ', `OBJ line ${i + 1} gives fewer than three vertex coordinates`);
    }
    // The OBJ reader takes the number at the start of each coordinate and drops the rest, so "2,5" (a decimal
    // comma) would be read as 2 and the solid silently misshapen: a coordinate must be a number in full.
    for (const token of tokens.slice(0, 3)) coordinate(token, `OBJ line ${i + 1}`, 'SOLID.NOT_OBJ');
  }
  let parsed: ReturnType<OBJFile['parse']>;
  try {
    parsed = new OBJFile(text).parse();
  } catch (e) {
    throw new SolidError('SOLID.NOT_OBJ', `the OBJ text could not be read: ${(e as Error).message}`);
  }
  const points = parsed.models.flatMap((m) => m.vertices.map((v): Vec3 => [v.x, v.y, v.z]));
  const faces = parsed.models.flatMap((m) =>
    (m.faces ?? []).map((f) => f.vertices.map((v) => v.vertexIndex - 1)),
  );
  return {
    points,
    faces: faces.filter((f) => f.every((i) => Number.isInteger(i) && i >= 0 && i < points.length)),
  };
}

/**
 * Vertex coordinates from OFF text (Object File Format): a header keyword OFF (or a variant such as
 * COFF, NOFF, STOFF whose vertex lines carry extra numbers after x y z), the counts "vertexCount
 * faceCount edgeCount" (on the header line or the next), then one vertex per line. Comments start with
 * #. The hull is recomputed from the vertices; face lines ("k i1 … ik", 0-based) are read where well formed,
 * only to tell whether the upload was convex.
 */
export function parseOffVertices(text: string): Vec3[] {
  return parseOff(text).points;
}

/** Vertices and the well-formed face lines of OFF text (see parseOffVertices). */
export function parseOff(text: string): UploadedMesh {
  const lines = text
    .split(/\r?\n/)
    .map((l) => l.replace(/#.*/, '').trim())
    .filter((l) => l.length > 0);
  const header = (lines.shift() ?? '').split(/\s+/);
  const keyword = header.shift() ?? '';
  if (!/^(ST)?C?N?4?n?OFF$/.test(keyword)) {
    throw new SolidError('SOLID.NOT_OFF', 'OFF text must start with the keyword OFF');
  }
  if (/4|n/.test(keyword.replace(/OFF$/, ''))) {
    throw new SolidError('SOLID.NOT_OFF', `only three-dimensional OFF is accepted, not ${keyword}`);
  }
  const countTokens = header.length ? header : (lines.shift() ?? '').split(/\s+/);
  const [nv, nf] = countTokens.map(Number);
  if (nv === undefined || nf === undefined || !Number.isInteger(nv) || !Number.isInteger(nf) || nv < 0) {
    throw new SolidError('SOLID.NOT_OFF', 'the OFF header must give whole vertex, face and edge counts');
  }
  if (nv > MAX_SOLID_VERTICES) throw tooMany(nv);
  if (lines.length < nv) throw new SolidError('SOLID.NOT_OFF', `the OFF text ends before its ${nv} vertices`);
  const points = lines.slice(0, nv).map((l, i) => {
    const t = l.split(/\s+/);
    if (t.length < 3)
      throw new SolidError('SOLID.NOT_OFF', `OFF vertex ${i + 1} has fewer than three coordinates`);
    const where = `OFF vertex ${i + 1}`;
    const c = (j: number) => coordinate(t[j]!, where, 'SOLID.NOT_OFF');
    return [c(0), c(1), c(2)] as Vec3;
  });
  // Lines past the counted vertices and faces mean the header's counts are wrong (an edited file, points added
  // without updating them): reading only the first nv points would build another solid without a word.
  if (lines.length > nv + Math.max(0, nf)) {
    throw new SolidError(
      'SOLID.NOT_OFF',
      `the OFF header counts ${nv} vertices and ${nf} faces, but ${lines.length - nv - Math.max(0, nf)} more ` +
        'lines follow them: correct the counts',
    );
  }
  const faces: number[][] = [];
  for (const l of lines.slice(nv, nv + nf)) {
    const t = l.split(/\s+/).map(Number);
    const k = t[0] ?? 0;
    const idx = t.slice(1, 1 + k);
    if (k >= 3 && idx.length === k && idx.every((i) => Number.isInteger(i) && i >= 0 && i < nv))
      faces.push(idx);
  }
  return { points, faces };
}

/** A decimal number as OBJ and OFF write one: digits with a point, an exponent maybe; no hex, no comma. */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
/** NaN and the infinities, as C's printf writes them: read as such, and refused as not finite later on. */
const NOT_FINITE = /^[+-]?(nan|inf|infinity)$/i;

/**
 * One vertex coordinate: a decimal number in full, or NaN or an infinity (refused later with SOLID.NOT_FINITE).
 * Anything else is refused with `code`, naming where it stands and the token: "2,5" (a decimal comma, which a
 * reader taking the leading digits would make 2), "0x1A", "1.5mm".
 */
function coordinate(token: string, where: string, code: 'SOLID.NOT_OBJ' | 'SOLID.NOT_OFF'): number {
  if (DECIMAL.test(token)) return Number(token);
  if (NOT_FINITE.test(token)) return /nan/i.test(token) ? NaN : token.startsWith('-') ? -Infinity : Infinity;
  const hint = /\d,\d/.test(token) ? ' (write decimals with a point, not a comma)' : '';
  throw new SolidError(code, `${where}: "${token}" is not a number${hint}`);
}

const tooMany = (n: number) =>
  new SolidError(
    'SOLID.TOO_MANY_VERTICES',
    `the solid has ${n} vertices; at most ${MAX_SOLID_VERTICES} are accepted`,
  );

/**
 * A convex solid from uploaded OBJ or OFF text: the convex hull of the vertices, coplanar facets merged,
 * centred on its volume centroid. Throws SolidError with a code and a sentence for bad uploads.
 */
export function parseSolidText(format: SolidTextFormat, text: string, name?: string): Solid {
  if (typeof text !== 'string') throw new SolidError('SOLID.NOT_TEXT', 'the solid must be given as text');
  if (text.length > MAX_SOLID_TEXT_LENGTH) {
    throw new SolidError(
      'SOLID.TOO_LARGE',
      `the file is ${text.length} characters long; at most ${MAX_SOLID_TEXT_LENGTH} are accepted`,
    );
  }
  let mesh: UploadedMesh;
  if (format === 'obj') mesh = parseObj(text);
  else if (format === 'off') mesh = parseOff(text);
  else throw new SolidError('SOLID.FORMAT', `unknown solid format "${String(format)}" (use obj or off)`);
  const points = mesh.points;
  if (points.length > MAX_SOLID_VERTICES) throw tooMany(points.length);
  if (points.some((p) => !p.every((c) => typeof c === 'number' && Number.isFinite(c)))) {
    throw new SolidError('SOLID.NOT_FINITE', 'a vertex coordinate is missing, NaN or infinite');
  }
  return solidFromPoints(
    `uploaded-${format}`,
    name ?? `uploaded-${format}`,
    points,
    MAX_SOLID_FACES,
    mesh.faces,
  );
}
