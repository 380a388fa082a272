import { type ReportCrossing } from '@kerfwright/contracts';
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { CrossingTable } from './crossing-table';

const crossing: ReportCrossing = {
  a: 'P1',
  b: 'P2',
  angleDeg: 70.5,
  lengthMm: 40,
  slotWidthMm: 3.1,
  drawnSlotWidthMm: 2.95,
  slotDepthMm: 20.2,
};

describe('CrossingTable', () => {
  it('scrolls in a named region the keyboard can focus, so its rows can be read without a mouse', async () => {
    const { user } = renderWithProviders(
      <CrossingTable crossings={[crossing, { ...crossing, b: 'P3' }]} formatLength={(mm) => `${mm} mm`} />,
    );
    const region = screen.getByRole('region', { name: 'Crossings' });
    expect(region).toContainElement(screen.getByRole('table', { name: 'Crossings' }));
    // Nothing else in it takes the focus: the box itself must (WCAG 2.1, 2.1.1; axe-core rule
    // "scrollable-region-focusable").
    await user.tab();
    expect(region).toHaveFocus();
  });
});
