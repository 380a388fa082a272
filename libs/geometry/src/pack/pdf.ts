/**
 * The two PDFs of a cut pack, drawn with pdfkit (Node only): the setup sheet for the operator and the
 * assembly guide. Deterministic for the same input: the creation date comes from the input's createdAt.
 * Page size A4 portrait, units PDF points; drawings are scaled to fit their boxes.
 */
import PDFDocument from 'pdfkit';
import { type Vec2, type Vec3 } from '../math/vec';
import { winAnsiText } from './slug';

export type Pdf = PDFKit.PDFDocument;

/** Renders a document built by `draw` to bytes. */
export function renderPdf(
  meta: { title: string; subject: string; createdAt: string },
  draw: (doc: Pdf) => void,
): Promise<Uint8Array> {
  const date = new Date(meta.createdAt);
  const when = Number.isNaN(date.getTime()) ? new Date(0) : date;
  const doc = new PDFDocument({
    size: 'A4',
    margin: 48,
    compress: true,
    info: {
      Title: meta.title,
      Subject: meta.subject,
      Author: 'Kerfwright',
      Creator: 'Kerfwright',
      Producer: 'Kerfwright (pdfkit)',
      CreationDate: when,
      ModDate: when,
    },
  });
  // The standard fonts hold WinAnsi only: other characters (a name in another script) would print as
  // gibberish, so every string is folded first (see winAnsiText).
  const text = doc.text.bind(doc) as (...args: unknown[]) => Pdf;
  const widthOf = doc.widthOfString.bind(doc) as (...args: unknown[]) => number;
  const heightOf = doc.heightOfString.bind(doc) as (...args: unknown[]) => number;
  const fold = (v: unknown) => (typeof v === 'string' ? winAnsiText(v) : v);
  Object.assign(doc, {
    text: (t: unknown, ...rest: unknown[]) => text(fold(t), ...rest),
    widthOfString: (t: unknown, ...rest: unknown[]) => widthOf(fold(t), ...rest),
    heightOfString: (t: unknown, ...rest: unknown[]) => heightOf(fold(t), ...rest),
  });
  const chunks: Buffer[] = [];
  return new Promise((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(new Uint8Array(Buffer.concat(chunks))));
    doc.on('error', reject);
    try {
      draw(doc);
      doc.end();
    } catch (e) {
      reject(e as Error);
    }
  });
}

export const PAGE = { width: 595.28, height: 841.89, margin: 48 };

/** Starts a new page when fewer than `need` points remain. */
export function ensureRoom(doc: Pdf, need: number): void {
  if (doc.y + need > PAGE.height - PAGE.margin) doc.addPage();
}

export function heading(doc: Pdf, text: string): void {
  ensureRoom(doc, 60);
  doc.moveDown(0.6).font('Helvetica-Bold').fontSize(12).fillColor('#000000').text(text).moveDown(0.2);
  doc.font('Helvetica').fontSize(9.5);
}

/** Label: value rows. */
export function rows(doc: Pdf, items: readonly [string, string][]): void {
  const x = PAGE.margin;
  for (const [k, v] of items) {
    ensureRoom(doc, 14);
    const y = doc.y;
    doc.font('Helvetica-Bold').fontSize(9.5).text(k, x, y, { width: 150 });
    const y1 = doc.y;
    doc.font('Helvetica').text(v, x + 155, y, { width: PAGE.width - 2 * PAGE.margin - 155 });
    doc.y = Math.max(y1, doc.y);
    doc.x = x;
  }
}

/**
 * Draws polygons (and open polylines) of a flat drawing into a box, keeping proportions; y up in the
 * drawing, flipped for the page. `frame` is the drawing's extent [x0, y0, x1, y1].
 */
export function drawFlat(
  doc: Pdf,
  box: { x: number; y: number; w: number; h: number },
  frame: readonly [number, number, number, number],
  closed: readonly (readonly Vec2[])[],
  open: readonly (readonly Vec2[])[] = [],
): void {
  const [x0, y0, x1, y1] = frame;
  const k = Math.min(box.w / Math.max(x1 - x0, 1e-9), box.h / Math.max(y1 - y0, 1e-9));
  const ox = box.x + (box.w - (x1 - x0) * k) / 2;
  const oy = box.y + (box.h - (y1 - y0) * k) / 2;
  const map = (p: Vec2): [number, number] => [ox + (p[0] - x0) * k, oy + (y1 - p[1]) * k];
  doc.save().lineWidth(0.4).strokeColor('#888888');
  doc.rect(ox, oy, (x1 - x0) * k, (y1 - y0) * k).stroke();
  doc.lineWidth(0.5).strokeColor('#000000');
  for (const c of closed) {
    if (c.length < 2) continue;
    const [sx, sy] = map(c[0]!);
    doc.moveTo(sx, sy);
    for (const p of c.slice(1)) doc.lineTo(...map(p));
    doc.closePath().stroke();
  }
  doc.lineWidth(0.3).strokeColor('#3366aa');
  for (const s of open) {
    if (s.length < 2) continue;
    const [sx, sy] = map(s[0]!);
    doc.moveTo(sx, sy);
    for (const p of s.slice(1)) doc.lineTo(...map(p));
    doc.stroke();
  }
  doc.restore();
}

/** An orthographic view of 3D polygons (piece outlines) into a box, farthest first, with light fills. */
export function drawProjected(
  doc: Pdf,
  box: { x: number; y: number; w: number; h: number },
  polys: readonly { id: string; points: readonly Vec3[]; centre: Vec3; shade: string }[],
  view: Vec3,
): void {
  const len = Math.hypot(...view);
  const d: Vec3 = [view[0] / len, view[1] / len, view[2] / len];
  // Screen axes: u horizontal (perpendicular to d and the world z axis), v up.
  let u: Vec3 = [d[1], -d[0], 0];
  const ul = Math.hypot(...u) || 1;
  u = [u[0] / ul, u[1] / ul, 0];
  const v: Vec3 = [u[1] * d[2] - u[2] * d[1], u[2] * d[0] - u[0] * d[2], u[0] * d[1] - u[1] * d[0]];
  const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
  const flat = polys.map((p) => ({
    ...p,
    pts: p.points.map((q) => [dot(q, u), dot(q, v)] as Vec2),
    depth: dot(p.centre, d),
    c2: [dot(p.centre, u), dot(p.centre, v)] as Vec2,
  }));
  const all = flat.flatMap((p) => p.pts);
  if (all.length === 0) return;
  const xs = all.map((p) => p[0]);
  const ys = all.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const k = Math.min(box.w / Math.max(x1 - x0, 1e-9), box.h / Math.max(y1 - y0, 1e-9));
  const ox = box.x + (box.w - (x1 - x0) * k) / 2;
  const oy = box.y + (box.h - (y1 - y0) * k) / 2;
  const map = (p: Vec2): [number, number] => [ox + (p[0] - x0) * k, oy + (y1 - p[1]) * k];
  // Farthest from the viewer first (the viewer looks along −d from +d·∞).
  const order = [...flat].sort((a, b) => a.depth - b.depth);
  doc.save();
  for (const p of order) {
    const [sx, sy] = map(p.pts[0]!);
    doc.moveTo(sx, sy);
    for (const q of p.pts.slice(1)) doc.lineTo(...map(q));
    doc.closePath().lineWidth(0.6).fillOpacity(0.55).fillAndStroke(p.shade, '#222222');
  }
  doc.fillOpacity(1).fillColor('#000000').font('Helvetica-Bold').fontSize(7);
  for (const p of order) {
    const [cx, cy] = map(p.c2);
    doc.text(p.id, cx - 10, cy - 3, { width: 20, align: 'center', lineBreak: false });
  }
  doc.restore();
}
