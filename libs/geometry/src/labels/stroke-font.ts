/**
 * Single-stroke engraving text from the Hershey "Sans 1-stroke" font (the npm package hersheytext, MIT; the
 * Hershey glyph data itself was published by the U.S. National Bureau of Standards). Each glyph is a set of
 * open polylines, so the mark layer engraves one line per stroke instead of an outline font's contours.
 *
 * Units: glyph coordinates are font units with y down; cap height is 21 units (y 1…22, baseline at 22). The
 * functions here return millimetres with y up and the baseline's left end at the origin.
 */
import fonts from 'hersheytext/hersheytext.min.json';
import { type Vec2 } from '../math/vec';

interface Glyph {
  strokes: Vec2[][];
  advance: number;
}

const CAP_UNITS = 21;
const BASELINE_UNITS = 22;
/** Advance of a space in font units (the width of a narrow glyph). */
const SPACE_UNITS = 16;

const glyphCache = new Map<string, Glyph>();

function parseGlyph(d: string, halfWidth: number): Glyph {
  const strokes: Vec2[][] = [];
  for (const part of d.split('M')) {
    const nums = part.match(/-?\d+(?:\.\d+)?/g);
    if (!nums || nums.length < 2) continue;
    const pts: Vec2[] = [];
    for (let i = 0; i + 1 < nums.length; i += 2) {
      pts.push([Number(nums[i]), BASELINE_UNITS - Number(nums[i + 1])]);
    }
    strokes.push(pts);
  }
  return { strokes, advance: 2 * halfWidth };
}

/** The glyph for a character; characters outside printable ASCII use "?". */
function glyphOf(ch: string): Glyph {
  const hit = glyphCache.get(ch);
  if (hit) return hit;
  let glyph: Glyph;
  if (ch === ' ') glyph = { strokes: [], advance: SPACE_UNITS };
  else {
    const code = ch.charCodeAt(0);
    const chars = fonts.futural.chars;
    const data = code >= 33 && code <= 126 ? chars[code - 33] : chars['?'.charCodeAt(0) - 33];
    glyph = data ? parseGlyph(data.d, Number(data.o)) : { strokes: [], advance: SPACE_UNITS };
  }
  glyphCache.set(ch, glyph);
  return glyph;
}

/** Text as single strokes, mm: baseline from (0, 0) to (widthMm, 0), capitals `heightMm` tall, y up. */
export interface StrokeText {
  text: string;
  heightMm: number;
  widthMm: number;
  /** Open polylines (some glyph strokes are single points: drawn as a dot). */
  strokes: Vec2[][];
}

/** Lays out one line of text in the stroke font at cap height `heightMm`. */
export function strokeText(text: string, heightMm: number): StrokeText {
  const k = heightMm / CAP_UNITS;
  const strokes: Vec2[][] = [];
  let x = 0;
  let right = 0;
  for (const ch of text) {
    const g = glyphOf(ch);
    for (const s of g.strokes) {
      strokes.push(s.map((p) => [(x + p[0]) * k, p[1] * k] as Vec2));
      for (const p of s) right = Math.max(right, (x + p[0]) * k);
    }
    x += g.advance;
  }
  return { text, heightMm, widthMm: right, strokes };
}

/** Bounding box of a stroke text, mm (descenders of lower-case letters reach below the baseline). */
export function strokeBounds(t: StrokeText): { x0: number; y0: number; x1: number; y1: number } {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const s of t.strokes)
    for (const p of s) {
      x0 = Math.min(x0, p[0]);
      y0 = Math.min(y0, p[1]);
      x1 = Math.max(x1, p[0]);
      y1 = Math.max(y1, p[1]);
    }
  if (x0 === Infinity) return { x0: 0, y0: 0, x1: 0, y1: 0 };
  return { x0, y0, x1, y1 };
}

/** Total stroke length, mm (what the mark pass travels with the beam on). */
export function strokeLength(strokes: readonly (readonly Vec2[])[]): number {
  let len = 0;
  for (const s of strokes)
    for (let i = 1; i < s.length; i++) {
      const a = s[i - 1] as Vec2;
      const b = s[i] as Vec2;
      len += Math.hypot(b[0] - a[0], b[1] - a[1]);
    }
  return len;
}
