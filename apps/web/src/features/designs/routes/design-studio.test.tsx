import {
  type DesignReport,
  type DesignSpecInput,
  type DesignView,
  type MaterialView,
} from '@kerfwright/contracts';
import { buildModel } from '@kerfwright/geometry';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { json, type RecordedCall, type RouteHandler, stubFetch } from '../../../testing/fetch-stub';
import { jobFixture, materialFixture, userFixture } from '../../../testing/fixtures';
import { formatLength } from '../../../lib/units';
import { getAccessToken } from '../../../lib/token-store';
import { renderApp } from '../../../testing/render-app';
import { DEFAULT_DESIGN_VALUES, toSavedSpec } from '../components/design-form-schema';
import { designColours } from '../../jobs/components/prepare-job-dialog';

// jsdom has no WebGL: a stand-in for the 3D view shows what it was asked to draw.
vi.mock('../components/model-preview-3d', () => ({
  ModelPreview3d: ({ report }: { report: DesignReport }) => (
    <div data-testid="preview-3d" data-diameter-mm={report.diameterMm} />
  ),
}));

const DESIGN_ID = '9a7c1f00-0000-4000-8000-000000000001';

function designFixture(overrides: Partial<DesignView> = {}): DesignView {
  const spec = toSavedSpec(DEFAULT_DESIGN_VALUES, null) as DesignSpecInput;
  return {
    id: DESIGN_ID,
    ownerId: userFixture('hobbyist').id,
    ownerName: 'Hobbyist Person',
    name: 'Octahedron hexagons',
    description: '',
    spec: spec as DesignView['spec'],
    solidFileName: null,
    preview: {
      valid: true,
      pieceCount: 8,
      crossingCount: 12,
      diameterMm: 240,
      planeDistanceMm: 73.17,
      errors: [],
      warnings: [],
    },
    version: 4,
    createdAt: '2026-01-15T09:30:00.000Z',
    updatedAt: '2026-01-15T09:30:00.000Z',
    ...overrides,
  };
}

const COPY_ID = '9a7c1f00-0000-4000-8000-000000000002';

function studioApi(
  design: DesignView = designFixture(),
  me = userFixture('hobbyist'),
  materials: MaterialView[] = [],
  more: Record<string, RouteHandler> = {},
) {
  let current = design;
  return stubFetch({
    ...more,
    // The server copies the design as it is stored (designs.service duplicate), not what a page shows.
    [`POST /api/designs/${DESIGN_ID}/duplicate`]: () =>
      json(201, { ...current, id: COPY_ID, name: `${current.name} (copy)`, version: 1 }),
    'GET /api/auth/me': () => json(200, me),
    'GET /api/machine-profiles': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
    'GET /api/materials': () =>
      json(200, { items: materials, total: materials.length, page: 1, pageSize: 100 }),
    'GET /api/designs': () => json(200, { items: [], total: 0, page: 1, pageSize: 25 }),
    [`GET /api/designs/${DESIGN_ID}`]: () => json(200, current),
    [`PATCH /api/designs/${DESIGN_ID}`]: (call: RecordedCall) => {
      const body = call.body as { name: string; version: number };
      current = { ...current, name: body.name, version: body.version + 1 };
      return json(200, current);
    },
  });
}

/** The value under a fact's label in the model facts ("Diameter" → "290.6 mm"). */
function fact(label: string): string {
  const facts = screen.getByTestId('model-facts');
  const caption = within(facts).getByText(label);
  return caption.nextElementSibling?.textContent ?? '';
}

async function field(label: string, value: string) {
  const input = await screen.findByLabelText(label);
  fireEvent.change(input, { target: { value } });
}

describe('design studio, no such design', () => {
  it('says plainly that there is no such design, with the way back and no retry, when the API knows none', async () => {
    const unknown = '9a7c1f00-0000-4000-8000-0000000000ff';
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/designs/${unknown}`]: () =>
        json(404, { statusCode: 404, code: 'DESIGN.NOT_FOUND', message: 'No such design', requestId: 'r-1' }),
    });
    renderApp(`/designs/${unknown}`, { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such design' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to the designs' })).toHaveAttribute('href', '/designs');
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    expect(screen.queryByText('The design could not be loaded')).not.toBeInTheDocument();
  });

  it('does not ask the API about an address that is no design id', async () => {
    const stub = stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('hobbyist')) });
    renderApp('/designs/not-a-design', { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such design' })).toBeInTheDocument();
    expect(stub.calls.some((c) => c.url.pathname.startsWith('/api/designs/'))).toBe(false);
  });
});

describe('design studio', () => {
  it('shows the fitted size everywhere once "fit to sheets" has searched, and says so while it searches', async () => {
    studioApi();
    const { user } = renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    await user.selectOptions(screen.getByLabelText('Scale by'), 'fitSheets');

    // While the search runs no size is claimed: the studio says it is fitting, and the model typed before
    // stays on screen (dimmed), so the page keeps its shape.
    expect(await screen.findByTestId('preview-fitting')).toHaveTextContent(
      'Fitting the largest size on 2 sheets… The model below is at the size shown before.',
    );
    expect(screen.getByTestId('preview-3d')).toBeInTheDocument();
    expect(fact('Diameter')).toBe('fitting…');
    expect(screen.getByRole('table', { name: 'Crossings' })).toBeInTheDocument();

    const summary = await screen.findByTestId('sheets-summary', undefined, { timeout: 20_000 });
    await waitFor(() => expect(screen.queryByTestId('preview-fitting')).not.toBeInTheDocument(), {
      timeout: 20_000,
    });
    const found = /Largest size on 2 sheets: diameter ([\d.]+) mm/.exec(summary.textContent ?? '');
    expect(found).not.toBeNull();
    const foundMm = Number(found?.[1]);

    // The search's upper bound (what buildModel gives a fitSheets spec) is larger than what fits:
    // otherwise this test would not tell the two apart.
    const fitSpec = {
      ...(toSavedSpec(DEFAULT_DESIGN_VALUES, null) as DesignSpecInput),
      scale: { by: 'fitSheets', sheets: 2 },
    } satisfies DesignSpecInput;
    const upperMm = buildModel(fitSpec).report.diameterMm;
    expect(upperMm - foundMm).toBeGreaterThan(5);

    // The facts, the 3D view, the piece in 2D and the crossing table all show the fitted model.
    expect(fact('Diameter')).toBe(formatLength(foundMm, 'mm'));
    const drawnMm = Number(screen.getByTestId('preview-3d').getAttribute('data-diameter-mm'));
    expect(drawnMm).toBeCloseTo(foundMm, 0);
    const fitted = buildModel({ ...fitSpec, scale: { by: 'diameter', mm: drawnMm } }).report;
    expect(fact('Plane distance')).toBe(formatLength(fitted.planeDistanceMm, 'mm'));
    const piece = fitted.pieces[0];
    const firstCrossing = fitted.crossings.find((c) => c.a === piece?.id || c.b === piece?.id);
    const table = screen.getByRole('table', { name: 'Crossings' });
    expect(within(table).getAllByRole('row')[1]).toHaveTextContent(
      formatLength(firstCrossing?.lengthMm ?? NaN, 'mm'),
    );
    const xs = piece?.outline.map((p) => p[0]) ?? [];
    const widthMm = Math.max(...xs) - Math.min(...xs);
    expect(screen.getByTestId('piece-2d')).toHaveAccessibleName(
      new RegExp(`^Piece ${piece?.id}, ${formatLength(widthMm, 'mm')} by`),
    );
  });

  it('enables "Request a cut job" right after the changes are saved', async () => {
    const { calls } = studioApi();
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await waitFor(() => expect(request).toBeEnabled());

    await field('Name', 'Octahedron hexagons, larger');
    await waitFor(() => expect(request).toBeDisabled());
    await user.hover(screen.getByTestId('request-job-wrapper'));
    expect(await screen.findByRole('tooltip')).toHaveTextContent('Save the changes first');

    await user.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText(/version 5/)).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PATCH')?.body).toMatchObject({ version: 4 });
    await waitFor(() => expect(request).toBeEnabled());

    // A later edit is unsaved again.
    await field('Description', 'for the window');
    await waitFor(() => expect(request).toBeDisabled());
  });

  it('says why a request was refused in its dialog, and requests the draft it kept when asked again', async () => {
    const message =
      '5 jobs are already waiting for the workshop (requested, or prepared and not yet approved), and 5 are ' +
      'allowed at a time: request this one once the workshop has approved or returned one, or withdraw one not ' +
      'yet prepared. The workshop can raise the limit.';
    let job = jobFixture({ designId: DESIGN_ID, state: 'draft', version: 1, actions: ['request'] });
    let refuse = true;
    const { calls } = studioApi(designFixture(), userFixture('hobbyist'), [], {
      'POST /api/jobs': () => json(201, job),
      [`GET /api/jobs/${job.id}`]: () => json(200, job),
      [`PATCH /api/jobs/${job.id}`]: (call) => {
        job = { ...job, ...(call.body as object), version: job.version + 1 };
        return json(200, job);
      },
      [`POST /api/jobs/${job.id}/request`]: (call) => {
        if (refuse) {
          return json(429, {
            statusCode: 429,
            code: 'JOB.TOO_MANY_OPEN_REQUESTS',
            message,
            details: { open: 5, limit: 5, openStates: ['requested', 'prepared'] },
            requestId: 'r-429',
          });
        }
        expect(call.body).toEqual({ version: job.version });
        job = { ...job, state: 'requested', version: job.version + 1 };
        return json(200, job);
      },
    });
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await waitFor(() => expect(request).toBeEnabled());
    await user.click(request);
    const dialog = await screen.findByRole('dialog', { name: 'Request a cut job' });
    await user.click(within(dialog).getByRole('button', { name: 'Request the cut' }));
    // Said where the request was made, with what became of the job.
    const alert = await within(dialog).findByRole('alert');
    expect(alert).toHaveTextContent(message);
    expect(alert).toHaveTextContent(
      'The job is kept as a draft: request it again here, or later from its page.',
    );
    // Asked again with two copies: the same draft, its copies changed, is requested; no second draft.
    refuse = false;
    await user.clear(within(dialog).getByLabelText('Copies'));
    await user.type(within(dialog).getByLabelText('Copies'), '2');
    await user.click(within(dialog).getByRole('button', { name: 'Request the cut' }));
    await waitFor(() => expect(job.state).toBe('requested'));
    expect(calls.filter((c) => c.method === 'POST' && c.url.pathname === '/api/jobs')).toHaveLength(1);
    expect(calls.find((c) => c.method === 'PATCH' && c.url.pathname === `/api/jobs/${job.id}`)?.body).toEqual(
      {
        version: 1,
        quantity: 2,
        notes: '',
      },
    );
  });

  it('marks the Name field when the API refuses the name, besides saying it above the page', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      'GET /api/machine-profiles': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
      'GET /api/materials': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
      [`GET /api/designs/${DESIGN_ID}`]: () => json(200, designFixture()),
      [`PATCH /api/designs/${DESIGN_ID}`]: () =>
        json(400, {
          statusCode: 400,
          code: 'VALIDATION.FAILED',
          message: 'Invalid request: name (name must not contain invisible formatting characters)',
          details: [{ field: 'name', messages: ['name must not contain invisible formatting characters'] }],
          requestId: 'r',
        }),
    });
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await field('Name', 'Octahedron\u200bhexagons');
    await user.click(await screen.findByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Must not contain invisible formatting characters')).toBeInTheDocument();
    expect(screen.getByLabelText('Name')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByTestId('form-error')).toBeInTheDocument();
  });

  it('says why a design with errors cannot be requested', async () => {
    studioApi(designFixture({ spec: { ...designFixture().spec, scale: { by: 'diameter', mm: 5 } } }));
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await screen.findByTestId('model-facts');
    await waitFor(() => expect(request).toBeDisabled());
    await user.hover(screen.getByTestId('request-job-wrapper'));
    expect(await screen.findByRole('tooltip')).toHaveTextContent(
      /The design has \d+ errors: see the Report tab/,
    );
  });

  it('says why a design whose colour rule cannot be met cannot be requested (the API refuses it: COLOUR.NO_PLAN)', async () => {
    // The faces of a cube around each vertex: three meet, so "all pieces around a vertex differ" needs 3 colours.
    const spec = {
      ...designFixture().spec,
      solid: 'cube',
      colours: { count: 2, rule: 'vertex-distinct' as const },
    };
    studioApi(designFixture({ spec }));
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await screen.findByTestId('model-facts');
    await waitFor(() => expect(request).toBeDisabled());
    await user.hover(screen.getByTestId('request-job-wrapper'));
    expect(await screen.findByRole('tooltip')).toHaveTextContent(
      'The colour rule cannot be met with these colours: see the colour notice',
    );
  });

  it('says on the page, not only in the tooltip, why a cut job cannot be requested (a phone has no hover)', async () => {
    studioApi(designFixture({ spec: { ...designFixture().spec, scale: { by: 'diameter', mm: 5 } } }));
    renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await screen.findByTestId('model-facts');
    await waitFor(() => expect(request).toBeDisabled());
    expect(screen.getByTestId('request-blocked')).toHaveTextContent(
      /^A cut job cannot be requested yet\. The design has \d+ errors: see the Report tab\.$/,
    );
    // Said after the button it explains, not before the actions under the title (where a phone, the actions
    // stacked, showed it a screen away from the button); the browser test measures the distance.
    expect(request.compareDocumentPosition(screen.getByTestId('request-blocked'))).toBe(
      Node.DOCUMENT_POSITION_FOLLOWING,
    );
  });

  it('says nothing under the request button while a sound saved design can be requested, and asks for a save after an edit', async () => {
    studioApi();
    renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await waitFor(() => expect(request).toBeEnabled());
    expect(screen.getByTestId('request-blocked')).toBeEmptyDOMElement();
    await field('Sides (n)', '5');
    await waitFor(() =>
      expect(screen.getByTestId('request-blocked')).toHaveTextContent(
        'A cut job cannot be requested yet. Save the changes first.',
      ),
    );
  });

  it('does not tell a member who may not save the design to save their changes before requesting', async () => {
    studioApi(designFixture(), userFixture('fabricator'));
    renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const request = await screen.findByRole('button', { name: 'Request a cut job' });
    await waitFor(() => expect(request).toBeEnabled());
    await field('Sides (n)', '5');
    await waitFor(() => expect(request).toBeDisabled());
    const said = screen.getByTestId('request-blocked');
    expect(said).toHaveTextContent(/undo your changes, or duplicate the design to keep them\.$/);
    expect(said).not.toHaveTextContent(/Save the changes/);
  });

  it('marks a sheet too small for its margins in plain words and keeps the last model on screen', async () => {
    studioApi();
    renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    const before = fact('Diameter');

    await field('Sheet width (mm)', '1');
    expect(
      await screen.findByText('Leaves no room inside the 5 mm margins: more than 10 mm'),
    ).toBeInTheDocument();
    expect(screen.getByLabelText('Sheet width (mm)')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByLabelText('Margin (mm)')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByText(/invalid spec|stock\.marginMm/)).not.toBeInTheDocument();
    expect(screen.getByTestId('preview-last-valid')).toBeInTheDocument();
    expect(fact('Diameter')).toBe(before);
    expect(screen.getByTestId('preview-3d')).toBeInTheDocument();

    // A smaller margin puts it right: both messages go.
    await field('Margin (mm)', '0');
    await waitFor(() =>
      expect(screen.getByLabelText('Sheet width (mm)')).toHaveAttribute('aria-invalid', 'false'),
    );
    expect(screen.queryByTestId('preview-last-valid')).not.toBeInTheDocument();
  });

  // Our own demo workshop's stock (invented): card in A3 sheets, a PVC board kept on file, no 600 × 400 sheet.
  const card = materialFixture({
    id: 'm-card',
    name: 'Card stock 300 g/m²',
    family: 'card',
    nominalThicknessMm: 0.4,
    measuredThicknessMm: 0.42,
    flexible: true,
    stockSheets: [{ widthMm: 420, heightMm: 297, pricePerSheet: 0.6, currency: 'EUR' }],
  });
  const pvc = materialFixture({
    id: 'm-pvc',
    name: 'Expanded PVC board 3 mm',
    family: 'pvc',
    laserAllowed: false,
    stockSheets: [{ widthMm: 500, heightMm: 500, pricePerSheet: 4.9, currency: 'EUR' }],
  });

  it("starts a new design on the workshop's stock when its usual sheet is not stock, and offers the rest", async () => {
    studioApi(designFixture(), userFixture('hobbyist'), [pvc, card]);
    const { user } = renderApp('/designs/new', { token: 't' });
    const picker = await screen.findByLabelText('Workshop stock');
    await waitFor(() => expect(screen.getByLabelText('Sheet width (mm)')).toHaveValue(420));
    expect(screen.getByLabelText('Sheet height (mm)')).toHaveValue(297);
    // The thickness measured on the stock on hand, and card bends: flexible.
    expect(screen.getByLabelText('Thickness (mm)')).toHaveValue(0.42);
    expect(screen.getByLabelText('Flexible')).toBeChecked();
    expect(picker).toHaveDisplayValue('Card stock 300 g/m², 420 × 297 mm');
    expect(
      screen.getByText(/^Sheet 420 × 297 mm, 0\.42 mm thick as measured, flexible\./),
    ).toBeInTheDocument();
    // A laser design is not offered the board no laser may cut; a router design is.
    expect(within(picker).queryByText(/PVC/)).not.toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText('Machine kind'), 'router');
    expect(await within(picker).findByText(/Expanded PVC board 3 mm, 500 × 500 mm/)).toBeInTheDocument();
    // A size typed in is no listed sheet.
    await field('Sheet width (mm)', '410');
    await waitFor(() => expect(picker).toHaveDisplayValue('Typed in (not a listed sheet)'));
  });

  it('starts a new design on the stock its usual sheet is, worked for the thickness it measures', async () => {
    // The audit's case: 600 × 400 at 3 mm is birch plywood that measures 2.9 mm.
    const birch = materialFixture({
      id: 'm-birch',
      name: 'Birch plywood 3 mm',
      nominalThicknessMm: 3,
      measuredThicknessMm: 2.9,
    });
    studioApi(designFixture(), userFixture('hobbyist'), [card, birch]);
    renderApp('/designs/new', { token: 't' });
    const picker = await screen.findByLabelText('Workshop stock');
    await waitFor(() => expect(screen.getByLabelText('Thickness (mm)')).toHaveValue(2.9));
    expect(screen.getByLabelText('Sheet width (mm)')).toHaveValue(600);
    expect(picker).toHaveDisplayValue('Birch plywood 3 mm, 600 × 400 mm');
    expect(screen.getByText(/^Sheet 600 × 400 mm, 2\.9 mm thick as measured\./)).toBeInTheDocument();
  });

  it('keeps a saved design as it is and marks a stock picked as an unsaved change', async () => {
    studioApi(designFixture(), userFixture('hobbyist'), [card]);
    const { user } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const picker = await screen.findByLabelText('Workshop stock');
    expect(screen.getByLabelText('Sheet width (mm)')).toHaveValue(600);
    expect(picker).toHaveDisplayValue('Typed in (not a listed sheet)');
    await user.selectOptions(picker, 'm-card:0');
    expect(screen.getByLabelText('Sheet width (mm)')).toHaveValue(420);
    expect(screen.getByLabelText('Thickness (mm)')).toHaveValue(0.42);
    const event = new Event('beforeunload', { cancelable: true });
    await waitFor(() => {
      window.dispatchEvent(event);
      expect(event.defaultPrevented).toBe(true);
    });
  });

  it('refuses a scale too small to cut', async () => {
    studioApi();
    renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    await field('Scale (mm)', '0.001');
    expect(await screen.findByText('At least 1 mm: a smaller model cannot be cut')).toBeInTheDocument();
    expect(fact('Diameter')).toBe('240.0 mm');
  });

  it('says what is wrong instead of asking for a sheet size when the fit has too few sheets', async () => {
    studioApi();
    const { user } = renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    await user.selectOptions(screen.getByLabelText('Scale by'), 'fitSheets');
    await field('Sheets', '1');
    const idle = await screen.findByTestId('sheets-idle');
    expect(idle).toHaveTextContent('2 colours need at least 2 sheets (one per colour)');
    expect(idle).not.toHaveTextContent('Give a stock sheet size');
  });

  it('names the solid in the model facts as the solid list does, and an uploaded solid by its own name', async () => {
    const catalogue = toSavedSpec(
      { ...DEFAULT_DESIGN_VALUES, solidId: 'rhombic-dodecahedron', sides: 4, rotationDeg: 45, size: 1.2 },
      null,
    ) as DesignSpecInput;
    studioApi(designFixture({ spec: catalogue as DesignView['spec'] }));
    const { unmount } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByTestId('model-facts');
    expect(screen.getByLabelText('Solid')).toHaveDisplayValue('Rhombic dodecahedron');
    expect(fact('Solid')).toBe('Rhombic dodecahedron');
    unmount();

    // A unit cube as an OFF file, uploaded under its own name.
    const cube = [
      'OFF',
      '8 6 0',
      ...['-1 -1 -1', '1 -1 -1', '1 1 -1', '-1 1 -1', '-1 -1 1', '1 -1 1', '1 1 1', '-1 1 1'],
      ...['4 0 3 2 1', '4 4 5 6 7', '4 0 1 5 4', '4 2 3 7 6', '4 1 2 6 5', '4 0 4 7 3'],
    ].join('\n');
    const upload = { format: 'off' as const, text: cube, name: 'Lamp cube' };
    const uploaded = toSavedSpec(
      { ...DEFAULT_DESIGN_VALUES, solidSource: 'upload' },
      upload,
    ) as DesignSpecInput;
    studioApi(designFixture({ spec: uploaded as DesignView['spec'], solidFileName: 'Lamp cube.off' }));
    renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByTestId('model-facts');
    expect(fact('Solid')).toBe('Lamp cube');
  });

  it('opens a design saved without colours as one colour, as preparing its job counts it', async () => {
    // One colour is saved as no colours at all.
    const spec = toSavedSpec({ ...DEFAULT_DESIGN_VALUES, colourCount: 1 }, null) as DesignSpecInput;
    expect(spec.colours).toBeUndefined();
    const design = designFixture({ spec: spec as DesignView['spec'] });
    studioApi(design);
    renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    const colours = await screen.findByLabelText('Colours');
    expect(colours).toHaveValue(1);
    expect(designColours(design).count).toBe(1);
  });

  it('says the colour rule is why nothing is laid out, not a failed layout', async () => {
    studioApi();
    renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    // Four faces meet at each vertex of the octahedron: vertex-distinct needs 4 colours (derived).
    await field('Colours', '2');
    await field('Rule', 'vertex-distinct');
    expect(await screen.findByTestId('sheets-idle')).toHaveTextContent(
      'No sheets yet: the colour rule needs at least 4 colours, not 2',
    );
    expect(screen.queryByRole('button', { name: 'Hide the sheets' })).not.toBeInTheDocument();
  });

  it('marks the sheets as soon as a fit to sheets has fewer sheets than colours', async () => {
    studioApi();
    renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    await field('Colours', '3');
    await field('Scale by', 'fitSheets');
    // Nothing typed into Sheets (2 by default): the field is marked at once, naming the rule.
    expect(await screen.findByText('3 colours need at least 3 sheets (one per colour)')).toBeInTheDocument();
  });

  it('raises the sheets of a fit to sheets with the colours it offers, so the offer leads to no new message', async () => {
    studioApi();
    const { user } = renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    // Around each vertex of an octahedron four faces meet: "vertex-distinct" needs four colours.
    await field('Rule', 'vertex-distinct');
    await field('Colours', '2');
    await field('Scale by', 'fitSheets');
    await field('Sheets', '2');
    const offer = await screen.findByRole('button', { name: /^Use \d+ colours$/ });
    const count = Number(/\d+/.exec(offer.textContent ?? '')?.[0]);
    expect(count).toBeGreaterThan(2);
    await user.click(offer);
    await waitFor(() => expect(screen.getByLabelText('Sheets')).toHaveValue(count));
    expect(screen.getByLabelText('Colours')).toHaveValue(count);
    expect(screen.queryByText(/takes at most/)).not.toBeInTheDocument();
    expect(screen.queryByText(/need at least \d+ sheets/)).not.toBeInTheDocument();
  });

  it('names the marked field when it says why nothing is laid out', async () => {
    studioApi();
    renderApp('/designs/new', { token: 't' });
    await screen.findByTestId('model-facts');
    await field('Sheet width (mm)', '0');
    expect(await screen.findByTestId('sheets-idle')).toHaveTextContent(
      'Correct the marked fields to lay the pieces out: Sheet width (mm): more than 0 mm.',
    );
  });

  it('asks before unsaved edits are left behind, and not once they are saved', async () => {
    studioApi();
    // The list first, so that Back has somewhere to go.
    const { user, router } = renderApp('/designs', { token: 't' });
    await screen.findByText(/No designs yet/);
    await router.navigate(`/designs/${DESIGN_ID}`);
    await screen.findByRole('button', { name: 'Request a cut job' });
    const nav = screen.getByRole('navigation');
    const reload = () => {
      const event = new Event('beforeunload', { cancelable: true });
      window.dispatchEvent(event);
      return event.defaultPrevented;
    };
    expect(reload()).toBe(false);

    await field('Name', 'Octahedron hexagons, teal');
    await waitFor(() => expect(reload()).toBe(true));
    await user.click(within(nav).getByRole('link', { name: 'Designs' }));
    const dialog = await screen.findByRole('dialog', { name: 'Leave without saving?' });
    await user.click(within(dialog).getByRole('button', { name: 'Stay in the studio' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(router.state.location.pathname).toBe(`/designs/${DESIGN_ID}`);
    expect(screen.getByLabelText('Name')).toHaveValue('Octahedron hexagons, teal');

    // Back, too, is held.
    await router.navigate(-1);
    expect(await screen.findByRole('dialog', { name: 'Leave without saving?' })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Stay in the studio' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());

    await user.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText(/version 5/)).toBeInTheDocument();
    await waitFor(() => expect(reload()).toBe(false));
    await user.click(within(nav).getByRole('link', { name: 'Designs' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/designs'));
    expect(screen.queryByRole('dialog', { name: 'Leave without saving?' })).not.toBeInTheDocument();
  });

  it('leaves at once when the member chooses to drop the edits', async () => {
    studioApi();
    const { user, router } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByRole('button', { name: 'Request a cut job' });
    await field('Description', 'draft');
    await user.click(within(screen.getByRole('navigation')).getByRole('link', { name: 'Designs' }));
    const dialog = await screen.findByRole('dialog', { name: 'Leave without saving?' });
    await user.click(within(dialog).getByRole('button', { name: 'Leave without saving' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/designs'));
  });

  it('asks before signing out drops unsaved edits, and signs out once the member leaves', async () => {
    studioApi();
    const { user, router } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByRole('button', { name: 'Request a cut job' });
    await field('Description', 'draft');
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    let dialog = await screen.findByRole('dialog', { name: 'Leave without saving?' });
    await user.click(within(dialog).getByRole('button', { name: 'Stay in the studio' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(router.state.location.pathname).toBe(`/designs/${DESIGN_ID}`);
    expect(getAccessToken()).toBe('t');
    expect(screen.getByLabelText('Description')).toHaveValue('draft');

    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    dialog = await screen.findByRole('dialog', { name: 'Leave without saving?' });
    await user.click(within(dialog).getByRole('button', { name: 'Leave without saving' }));
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    await waitFor(() => expect(getAccessToken()).toBeNull());
    expect(router.state.location.search).toBe('');
  });

  it('duplicates a design with unsaved changes only after asking, and saves them first when asked to', async () => {
    const { calls } = studioApi();
    const { user, router } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByRole('button', { name: 'Request a cut job' });
    await field('Name', 'Octahedron hexagons, wider slots');
    await user.click(screen.getByRole('button', { name: 'Duplicate' }));
    const dialog = await screen.findByRole('dialog', { name: 'Duplicate with unsaved changes?' });
    expect(dialog).toHaveTextContent('as last saved (version 4)');
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.click(within(dialog).getByRole('button', { name: 'Save, then duplicate' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/designs/${COPY_ID}`));
    const writes = calls.filter((c) => c.method !== 'GET').map((c) => `${c.method} ${c.url.pathname}`);
    expect(writes).toEqual([`PATCH /api/designs/${DESIGN_ID}`, `POST /api/designs/${DESIGN_ID}/duplicate`]);
    expect(
      await screen.findByText('This is a copy of “Octahedron hexagons, wider slots” as saved in version 5.'),
    ).toBeInTheDocument();
    expect(screen.getByLabelText('Name')).toHaveValue('Octahedron hexagons, wider slots (copy)');
  });

  it("offers Save only to the design's owner or a supervisor, as the server allows", async () => {
    for (const [role, allowed] of [
      ['hobbyist', true],
      ['supervisor', true],
      ['fabricator', false],
    ] as const) {
      studioApi(designFixture(), userFixture(role));
      const { unmount } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
      const save = await screen.findByRole('button', { name: 'Save' });
      if (allowed) expect(save).toBeEnabled();
      else expect(save).toBeDisabled();
      // The reason is on the page, where a keyboard or screen reader meets it, not only in a tooltip.
      const said = screen.queryByText(/^Only its owner or a supervisor saves this design/);
      if (allowed) expect(said).not.toBeInTheDocument();
      else expect(said).toBeVisible();
      unmount();
    }
  });

  it('copies the saved version without the changes when chosen, and says so on the copy', async () => {
    const { calls } = studioApi();
    const { user, router } = renderApp(`/designs/${DESIGN_ID}`, { token: 't' });
    await screen.findByRole('button', { name: 'Request a cut job' });
    await field('Name', 'Octahedron hexagons, wider slots');
    await user.click(screen.getByRole('button', { name: 'Duplicate' }));
    const dialog = await screen.findByRole('dialog', { name: 'Duplicate with unsaved changes?' });
    await user.click(within(dialog).getByRole('button', { name: 'Copy version 4 without the changes' }));
    // Chosen knowing the changes stay behind: the copy opens without a second question.
    await waitFor(() => expect(router.state.location.pathname).toBe(`/designs/${COPY_ID}`));
    expect(screen.queryByRole('dialog', { name: 'Leave without saving?' })).not.toBeInTheDocument();
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);
    expect(
      await screen.findByText('This is a copy of “Octahedron hexagons” as saved in version 4.'),
    ).toBeInTheDocument();
    expect(screen.getByLabelText('Name')).toHaveValue('Octahedron hexagons (copy)');
    // Said once: the history entry forgets it, so reloading the page does not say it again.
    await waitFor(() => expect(router.state.location.state).toBeNull());
    expect(router.state.location.pathname).toBe(`/designs/${COPY_ID}`);
  });
});
