import { buildModel } from '@kerfwright/geometry';
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { DEFAULT_DESIGN_VALUES, toDesignSpec } from './design-form-schema';
import { StudioDetailsPanel } from './studio-details-panel';

describe('studio details panel', () => {
  it('scrolls its four tabs sideways on a narrow screen instead of clipping them', async () => {
    const report = buildModel(toDesignSpec(DEFAULT_DESIGN_VALUES, null)).report;
    renderWithProviders(
      <StudioDetailsPanel
        report={report}
        pieceColour={{}}
        tab={0}
        onTab={() => undefined}
        selectedPiece={undefined}
        onSelectPiece={() => undefined}
        formatLength={(mm) => `${mm.toFixed(1)} mm`}
      />,
    );
    const tabs = await screen.findByRole('tablist');
    expect(screen.getAllByRole('tab').map((t) => t.textContent)).toEqual([
      'Piece',
      `Crossings (${report.crossings.length})`,
      expect.stringMatching(/^Report \(/),
      'Assembly',
    ]);
    // The tab row's box scrolls along its width (a fixed row hides what does not fit).
    expect(getComputedStyle(tabs.parentElement!).overflowX).toBe('auto');
  });
});
