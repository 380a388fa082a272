import { buildModel } from '@kerfwright/geometry';
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { formatLength } from '../../../lib/units';
import { renderWithProviders } from '../../../testing/render-app';
import { drawableSlabs, ModelPreview3d } from './model-preview-3d';
import { pieceHasShape } from './piece-slab';
import { PieceView2d } from './piece-view-2d';

const specAt = (mm: number) => ({
  solid: 'octahedron',
  piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
  scale: { by: 'diameter' as const, mm },
  stock: { thicknessMm: 3 },
  machine: { kind: 'laser' as const, kerfMm: 0.15 },
});
// At 2 mm across, 3 mm stock leaves no piece an outline: its slots take all of it.
const tiny = buildModel(specAt(2)).report;
const normal = buildModel(specAt(240)).report;
const fmt = (mm: number) => formatLength(mm, 'mm');

/** Every number in the SVG's attributes, so none can be Infinity or NaN. */
function svgNumbersAreFinite(svg: Element): boolean {
  const attributes = [svg, ...svg.querySelectorAll('*')].flatMap((el) =>
    ['viewBox', 'd', 'x', 'y', 'x1', 'y1', 'x2', 'y2', 'font-size', 'stroke-width', 'transform']
      .map((a) => el.getAttribute(a))
      .filter((v): v is string => v !== null),
  );
  return attributes.every((v) => !/Infinity|NaN/.test(v));
}

describe('a piece in 2D and the 3D slabs, for any size', () => {
  it('the tiny model really has pieces without an outline (the case these views must survive)', () => {
    expect(tiny.pieces.length).toBeGreaterThan(0);
    expect(tiny.pieces.every((p) => !pieceHasShape(p))).toBe(true);
    expect(normal.pieces.every(pieceHasShape)).toBe(true);
  });

  it('says a piece has no outline left instead of drawing an empty path with an infinite frame', async () => {
    const piece = tiny.pieces[0]!;
    const { container } = renderWithProviders(
      <PieceView2d piece={piece} colourIndex={0} flagged={false} formatLength={fmt} />,
    );
    const note = await screen.findByTestId('piece-2d-empty');
    expect(note).toHaveTextContent(`Piece ${piece.id} has no outline left at this size`);
    expect(container.querySelector('svg[data-testid="piece-2d"]')).toBeNull();
    expect(container.innerHTML).not.toMatch(/Infinity|NaN|M Z/);
  });

  it('shows a note in place of the 3D view when no piece has a shape', async () => {
    renderWithProviders(<ModelPreview3d report={tiny} pieceColours={{}} modelKey="tiny" />);
    expect(await screen.findByTestId('preview-3d-empty')).toHaveTextContent('Nothing to show at this size');
  });

  it('draws a real piece with finite numbers only', async () => {
    renderWithProviders(
      <PieceView2d piece={normal.pieces[0]!} colourIndex={1} flagged={false} formatLength={fmt} />,
    );
    const svg = await screen.findByTestId('piece-2d');
    expect(svgNumbersAreFinite(svg)).toBe(true);
  });

  it('gives the 3D view no slab for a piece without an outline, and finite slabs otherwise', () => {
    expect(drawableSlabs(tiny)).toEqual([]);
    const slabs = drawableSlabs(normal);
    expect(slabs.map((s) => s.id)).toEqual(normal.pieces.map((p) => p.id));
    for (const { slab } of slabs) {
      expect(slab.positions.length).toBeGreaterThan(0);
      expect(slab.positions.every(Number.isFinite)).toBe(true);
      expect(slab.normals.every(Number.isFinite)).toBe(true);
    }
  });
});
