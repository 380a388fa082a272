import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { renderWithProviders } from '../../../testing/render-app';
import { emptyPreview } from '../lib/build-preview';
import { type StudioSheets } from '../lib/studio-layout';
import { DEFAULT_DESIGN_VALUES, toDesignSpec } from './design-form-schema';
import { StudioSheetsPanel } from './studio-sheets-panel';

/** The last fit's answer: on 2 sheets, nothing laid out, as the engine says when 2 colours cannot be planned. */
const failedOnTwo: StudioSheets = {
  sheets: [],
  diameterMm: 435.3,
  sheetsAsked: 2,
  failure: 'no plan exists: rule "neighbour-distinct" cannot be met with 2 colours; it needs at least 3',
};

function panel(pending: boolean) {
  const spec = toDesignSpec(DEFAULT_DESIGN_VALUES, null);
  return (
    <StudioSheetsPanel
      spec={spec}
      preview={emptyPreview(spec, 3, 'neighbour-distinct')}
      fit={{ sheets: 3, pending, result: failedOnTwo, error: null }}
      blocked={null}
      colourCount={3}
      colourRule="neighbour-distinct"
      unit="mm"
    />
  );
}

describe('studio sheets while a new fit runs', () => {
  it('does not show the last fit’s failure as if it were about the values just chosen', () => {
    stubFetch({
      'GET /api/materials': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
    });
    const { unmount } = renderWithProviders(panel(true));
    expect(screen.getByTestId('sheets-fitting')).toHaveTextContent('Fitting the largest size on 3 sheets…');
    expect(screen.queryByTestId('sheets-summary')).not.toBeInTheDocument();
    expect(screen.queryByText(/cannot be met with 2 colours/)).not.toBeInTheDocument();

    // Once that answer is the current one (no newer search runs), it is said with its reason.
    unmount();
    renderWithProviders(panel(false));
    expect(screen.getByTestId('sheets-summary')).toHaveTextContent(/^No size fits 2 sheets;/);
    expect(screen.getByText(/cannot be met with 2 colours/)).toBeInTheDocument();
  });
});
