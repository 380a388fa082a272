import { type BuiltModel, type ModelLayout } from '@kerfwright/geometry';

type Point = [number, number];

/** One piece placed on a sheet: its compensated outline in sheet coordinates (mm, origin lower left, y up). */
export interface SheetPieceView {
  id: string;
  outline: Point[];
  colourIndex: number;
}

/** One sheet of a layout as the layout view draws it. Lengths in mm. */
export interface SheetView {
  widthMm: number;
  heightMm: number;
  marginMm: number;
  colourIndex: number;
  /** The stock colour's name when the job names its colours (else the view says "colour 1", …). */
  colourName: string | null;
  pieces: SheetPieceView[];
  /** Pieces' area ÷ whole sheet area, from the nesting. */
  utilisation: number;
}

/** Layout figures that need no machine: cut length (every placed outline) and pierces (one per outline). */
export interface LayoutCutFigures {
  cutLengthMm: number;
  pierces: number;
}

/**
 * A placement of the nesting, as the geometry library defines it: rotate the outline about the piece's own
 * origin by rotationDeg (counter-clockwise), then translate by (x, y).
 */
export function placePoint(
  [x, y]: readonly [number, number],
  rotationDeg: number,
  dx: number,
  dy: number,
): Point {
  const t = (rotationDeg * Math.PI) / 180;
  const c = Math.cos(t);
  const s = Math.sin(t);
  return [x * c - y * s + dx, x * s + y * c + dy];
}

/**
 * The sheets of a successful layout of a built model, with every piece placed. The margin drawn is the one the
 * layout kept (a router's bit can widen the one asked for).
 */
export function sheetViews(
  model: BuiltModel,
  layout: Extract<ModelLayout, { ok: true }>,
  sheet: { widthMm: number; heightMm: number },
  colourNames: readonly string[] = [],
): SheetView[] {
  const byId = new Map(model.pieces.map((p) => [p.id, p]));
  return layout.sheets.map((s) => {
    const colourIndex = Number(s.group) || 0;
    return {
      widthMm: sheet.widthMm,
      heightMm: sheet.heightMm,
      marginMm: layout.marginMm,
      colourIndex,
      colourName: colourNames[colourIndex] ?? null,
      utilisation: s.utilisation,
      pieces: s.placements.flatMap((pl) => {
        const piece = byId.get(pl.part);
        if (!piece) return [];
        return [
          {
            id: pl.part,
            colourIndex,
            outline: piece.outline.map((p) => placePoint(p, pl.rotationDeg, pl.x, pl.y)),
          },
        ];
      }),
    };
  });
}

/** Total length of the closed outlines (each closes back to its first point) and one pierce per outline. */
export function cutFigures(sheets: readonly SheetView[]): LayoutCutFigures {
  let cutLengthMm = 0;
  let pierces = 0;
  for (const sheet of sheets) {
    for (const piece of sheet.pieces) {
      const o = piece.outline;
      for (let i = 0; i < o.length; i++) {
        const a = o[i] as Point;
        const b = o[(i + 1) % o.length] as Point;
        cutLengthMm += Math.hypot(b[0] - a[0], b[1] - a[1]);
      }
      if (o.length >= 2) pierces++;
    }
  }
  return { cutLengthMm, pierces };
}
