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
    // Named (WAI-ARIA 1.2: a tablist should have an accessible name).
    const tabs = await screen.findByRole('tablist', { name: 'Details of the design' });
    expect(screen.getAllByRole('tab').map((t) => t.textContent)).toEqual([
      'Piece',
      `Crossings (${report.crossings.length})`,
      expect.stringMatching(/^Report \(/),
      'Assembly',
    ]);
    // The tab row's box scrolls along its width (a fixed row hides what does not fit).
    expect(getComputedStyle(tabs.parentElement!).overflowX).toBe('auto');
  });

  it("shows each tab's content in a tab panel named by its tab, which the tabs point to", () => {
    const report = buildModel(toDesignSpec(DEFAULT_DESIGN_VALUES, null)).report;
    const panel = (tab: number) => (
      <StudioDetailsPanel
        report={report}
        pieceColour={{}}
        tab={tab}
        onTab={() => undefined}
        selectedPiece={undefined}
        onSelectPiece={() => undefined}
        formatLength={(mm) => `${mm.toFixed(1)} mm`}
      />
    );
    const { rerender } = renderWithProviders(panel(0));
    expect(screen.getByRole('tabpanel', { name: 'Piece' })).toBeInTheDocument();
    rerender(panel(1));
    const crossings = screen.getByRole('tabpanel', { name: `Crossings (${report.crossings.length})` });
    expect(crossings).toContainElement(screen.getByRole('table'));
    for (const tab of screen.getAllByRole('tab')) {
      expect(tab).toHaveAttribute('aria-controls', crossings.id);
    }
  });

  it('claims no problems on the Piece tab only when the report has no errors', () => {
    const valid = buildModel(toDesignSpec(DEFAULT_DESIGN_VALUES, null)).report;
    // An error of the whole design (as the audit's Size 0.5 gave) names no piece.
    const error = { code: 'SCALE.TOO_SMALL', message: 'The model is too small to cut.', pieces: [] };
    const panel = (report: typeof valid) => (
      <StudioDetailsPanel
        report={report}
        pieceColour={{}}
        tab={0}
        onTab={() => undefined}
        selectedPiece={undefined}
        onSelectPiece={() => undefined}
        formatLength={(mm) => `${mm.toFixed(1)} mm`}
      />
    );
    const { unmount } = renderWithProviders(panel({ ...valid, errors: [error] }));
    expect(screen.queryByTestId('report-valid')).not.toBeInTheDocument();
    expect(screen.getByTestId('report-piece-clear')).toHaveTextContent(
      'No finding concerns this piece, but the design has 1 error: see the Report tab.',
    );
    unmount();

    renderWithProviders(panel({ ...valid, errors: [] }));
    expect(screen.getByTestId('report-valid')).toBeInTheDocument();
  });
});
