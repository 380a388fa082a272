import { screen, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { buildPreview, emptyPreview } from '../lib/build-preview';
import { DEFAULT_DESIGN_VALUES, toDesignSpec } from './design-form-schema';
import { layOutStudio } from '../lib/studio-layout';
import { BUILDING_NOTICE_DELAY_MS, StudioPreviewPanel, unfittedNote } from './studio-preview-panel';
import { stubResizeObserver } from '../../../testing/resize-observer';

// No WebGL here (as in model-preview-3d.test.tsx): the 3D view draws nothing, the panel around it is tested.
vi.mock('./render-quality', () => ({ isSoftwareWebGl: () => true }));

const spec = toDesignSpec(DEFAULT_DESIGN_VALUES, null);
const built = buildPreview(spec, 1, 'neighbour-distinct');

function panel(preview: typeof built, building: boolean) {
  return (
    <StudioPreviewPanel
      preview={preview}
      building={building}
      idleMessage="Correct the marked fields to see the model."
      selectedPiece={undefined}
      onSelectPiece={() => undefined}
      formatLength={(mm) => `${mm.toFixed(1)} mm`}
    />
  );
}

describe('studio preview panel while the next model builds', () => {
  beforeEach(stubResizeObserver);
  afterEach(() => vi.unstubAllGlobals());

  it('keeps the model built before on screen, and says so once the build takes a while', async () => {
    const { rerender } = renderWithProviders(panel(built, true));
    const facts = screen.getByTestId('model-facts');
    // A build that ends in a moment leaves the panel as it was (no flicker on every keystroke).
    expect(screen.queryByTestId('preview-building')).not.toBeInTheDocument();
    expect(facts.parentElement).not.toHaveAttribute('aria-busy');
    const notice = await screen.findByRole('status', {}, { timeout: BUILDING_NOTICE_DELAY_MS + 1000 });
    expect(notice).toHaveTextContent(
      'Building the model for the values entered… The model below is the one built before.',
    );
    // Words, not a moving bar (a bar is laid out and painted on every frame while the worker builds).
    expect(within(notice).queryByRole('progressbar')).not.toBeInTheDocument();
    expect(screen.getByTestId('model-facts')).toHaveTextContent('Pieces8');
    expect(screen.getByTestId('model-facts').parentElement).toHaveAttribute('aria-busy', 'true');

    rerender(panel(built, false));
    expect(screen.queryByTestId('preview-building')).not.toBeInTheDocument();
    expect(screen.getByTestId('model-facts').parentElement).not.toHaveAttribute('aria-busy');
  });

  it('gives the build time in whole milliseconds, thousands grouped as every other figure', () => {
    renderWithProviders(panel({ ...built, buildMs: 1234.56 }, false));
    expect(screen.getByTestId('model-facts')).toHaveTextContent('Built in1,235 ms');
  });

  it('says nothing is there to see only when no model is on its way', async () => {
    const { rerender } = renderWithProviders(panel(emptyPreview(null, 1, 'neighbour-distinct'), true));
    // The first model of the page is being built: no "correct the fields", a notice after a moment.
    expect(screen.queryByTestId('preview-unavailable')).not.toBeInTheDocument();
    expect(
      await screen.findByRole('status', {}, { timeout: BUILDING_NOTICE_DELAY_MS + 1000 }),
    ).toHaveTextContent(/^Building the model…$/);
    rerender(panel(emptyPreview(null, 1, 'neighbour-distinct'), false));
    expect(screen.getByTestId('preview-unavailable')).toHaveTextContent(
      'Correct the marked fields to see the model.',
    );
  });

  it('keeps showing why the engine refused the last spec while the next one builds', () => {
    const refused = emptyPreview(
      spec,
      1,
      'neighbour-distinct',
      'This design is too heavy to compute in time',
    );
    renderWithProviders(panel(refused, true));
    expect(screen.getByTestId('preview-unavailable')).toHaveTextContent(
      'This design is too heavy to compute in time',
    );
  });
});

describe('studio preview panel when fit to sheets found no size', () => {
  beforeEach(stubResizeObserver);
  afterEach(() => vi.unstubAllGlobals());

  it('says the size is not fitted while the colour rule cannot be met, and marks the sizes so', () => {
    // Four faces meet at each vertex of an octahedron, so "all differ at each vertex" needs 4 colours, not 2
    // (the engine's own colour-plan tests check the rule): no search runs, and its answer lays out nothing.
    const base = spec!;
    const fitSpec: typeof base = {
      ...base,
      scale: { by: 'fitSheets', sheets: 2 },
      stock: { ...base.stock, sheet: { widthMm: 600, heightMm: 400 } },
    };
    const answer = layOutStudio(fitSpec, 2, 'vertex-distinct', null);
    expect(answer.failure).toMatch(/^no plan exists/);
    expect(answer.sheets).toEqual([]);
    const note = unfittedNote({ sheets: 2, pending: false, result: answer });
    expect(note).toBe(
      'No size is fitted to 2 sheets while the colour rule cannot be met: the model is shown at the most the ' +
        'sheets could hold, an upper bound.',
    );
    renderWithProviders(
      <StudioPreviewPanel
        preview={built}
        unfitted={note}
        idleMessage=""
        selectedPiece={undefined}
        onSelectPiece={() => undefined}
        formatLength={(mm) => `${mm.toFixed(1)} mm`}
      />,
    );
    expect(screen.getByTestId('preview-unfitted')).toHaveTextContent(note!);
    expect(screen.getByTestId('model-facts')).toHaveTextContent(/Diameter[\d.]+ mm \(not fitted\)/);
  });

  it('says nothing while the search runs or once it found a size, and names the last size tried otherwise', () => {
    const found = { sheets: [{}], failure: null };
    expect(unfittedNote(null)).toBeNull();
    expect(
      unfittedNote({ sheets: 1, pending: true, result: { sheets: [], failure: 'no size fits' } }),
    ).toBeNull();
    expect(unfittedNote({ sheets: 1, pending: false, result: found })).toBeNull();
    expect(
      unfittedNote({ sheets: 1, pending: false, result: { sheets: [], failure: 'no size fits 1 sheet' } }),
    ).toBe('No size fits 1 sheet: the model is shown at the last size tried (see Sheets).');
  });
});
