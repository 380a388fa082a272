import { buildModel } from '@kerfwright/geometry';
import { screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { AssemblySteps } from './assembly-steps';

const cube = (flexible: boolean) =>
  buildModel({
    solid: 'cube',
    piece: { sides: 4, step: 1, rotationDeg: 45, size: 1.5 },
    scale: { by: 'planeDistance', mm: 80 },
    stock: { thicknessMm: flexible ? 0.5 : 3, flexible },
    machine: { kind: 'laser', kerfMm: 0.15 },
  }).report;

describe('assembly order tab', () => {
  it('lists every piece once, each later one onto placed pieces, with the slot angles for rigid stock', async () => {
    const onSelect = vi.fn();
    const { user } = renderWithProviders(<AssemblySteps report={cube(false)} onSelectPiece={onSelect} />);
    const rows = within(screen.getByRole('table', { name: 'Assembly order' }))
      .getAllByRole('row')
      .slice(1);
    expect(rows).toHaveLength(6);
    expect(rows[0]).toHaveTextContent('first piece');
    // Derived: cube edges meet at right angles or run parallel, so multi-slot steps read 90° or 180°.
    expect(rows.map((r) => r.textContent).join(' ')).toMatch(/(90|180)°/);
    expect(screen.getByTestId('assembly-summary')).toHaveTextContent(
      /Rigid stock moves one way at a time: in \d+ of the 6 steps/,
    );
    await user.click(within(rows[1]!).getByRole('button'));
    expect(onSelect).toHaveBeenCalled();
  });

  it('gives flexible stock the order without slot angles', () => {
    renderWithProviders(<AssemblySteps report={cube(true)} onSelectPiece={() => undefined} />);
    expect(screen.getByTestId('assembly-summary')).not.toHaveTextContent('Rigid');
    expect(screen.queryByText(/\d+°/)).not.toBeInTheDocument();
  });
});
