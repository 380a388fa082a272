import { buildModel } from '@kerfwright/geometry';
import { fireEvent, screen } from '@testing-library/react';
import { useState } from 'react';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { ModelPreview3d } from './model-preview-3d';
import { HOME_VIEW, VIEW_STEP_DEG, ZOOM_STEP } from './preview-view';
import { stubResizeObserver } from '../../../testing/resize-observer';

// No WebGL here: with no size measured, React Three Fiber draws nothing and the view's frame is tested alone.
vi.mock('./render-quality', () => ({ isSoftwareWebGl: () => true }));

const report = buildModel({
  solid: 'octahedron',
  piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
  scale: { by: 'diameter', mm: 240 },
  stock: { thicknessMm: 3 },
  machine: { kind: 'laser', kerfMm: 0.15 },
}).report;

const BUTTON_NAMES = [
  'Turn model left',
  'Turn model right',
  'Tilt model up',
  'Tilt model down',
  'Zoom in',
  'Zoom out',
  'Reset view',
];

function renderPreview() {
  const utils = renderWithProviders(
    <>
      <button type="button">Before the preview</button>
      <ModelPreview3d report={report} pieceColours={{}} modelKey="k" />
    </>,
  );
  return utils;
}

async function findView() {
  return screen.findByRole('application', { name: '3D preview of the assembled model' });
}

/** The view the preview holds, as it writes it on the focusable frame. */
function viewOf(frame: HTMLElement) {
  return {
    turn: Number(frame.getAttribute('data-turn-deg')),
    tilt: Number(frame.getAttribute('data-tilt-deg')),
    scale: Number(frame.getAttribute('data-distance-scale')),
  };
}

const HOME = {
  turn: Number(HOME_VIEW.turnDeg.toFixed(1)),
  tilt: Number(HOME_VIEW.tiltDeg.toFixed(1)),
  scale: 1,
};

describe('the 3D preview without a pointer', () => {
  beforeEach(stubResizeObserver);

  it('is a named stop in the tab order, described by a visible hint of its keys', async () => {
    const { user } = renderPreview();
    const frame = await findView();
    expect(frame).toHaveAttribute('tabindex', '0');
    expect(frame).toHaveAccessibleDescription(/arrow keys turn it.*\+ and − zoom.*Home resets it/);
    expect(screen.getByText(/arrow keys turn it/)).toBeVisible();
    expect(frame.querySelector('canvas')).not.toBeNull();
    await user.click(screen.getByRole('button', { name: 'Before the preview' }));
    await user.tab();
    expect(frame).toHaveFocus();
  });

  it('turns and tilts by one step per arrow key, zooms with + and -, and Home resets', async () => {
    const { user } = renderPreview();
    const frame = await findView();
    expect(viewOf(frame)).toEqual(HOME);
    frame.focus();

    await user.keyboard('{ArrowLeft}');
    expect(viewOf(frame).turn).toBeCloseTo(HOME.turn + VIEW_STEP_DEG, 1);
    await user.keyboard('{ArrowRight}{ArrowRight}');
    expect(viewOf(frame).turn).toBeCloseTo(HOME.turn - VIEW_STEP_DEG, 1);
    await user.keyboard('{ArrowDown}');
    expect(viewOf(frame).tilt).toBeCloseTo(HOME.tilt + VIEW_STEP_DEG, 1);
    await user.keyboard('{ArrowUp}{ArrowUp}');
    expect(viewOf(frame).tilt).toBeCloseTo(HOME.tilt - VIEW_STEP_DEG, 1);
    await user.keyboard('+');
    expect(viewOf(frame).scale).toBeCloseTo(1 / ZOOM_STEP, 3);
    await user.keyboard('--');
    expect(viewOf(frame).scale).toBeCloseTo(ZOOM_STEP, 3);

    await user.keyboard('{Home}');
    expect(viewOf(frame)).toEqual(HOME);
  });

  it('keeps the page from scrolling on the keys it uses, and leaves other keys alone', async () => {
    renderPreview();
    const frame = await findView();
    frame.focus();
    // fireEvent returns false when the handler prevented the default action.
    for (const key of ['ArrowUp', 'ArrowDown', 'ArrowLeft', 'ArrowRight', 'Home', '+', '-']) {
      expect(fireEvent.keyDown(frame, { key }), key).toBe(false);
    }
    expect(fireEvent.keyDown(frame, { key: 'Tab' })).toBe(true);
    expect(fireEvent.keyDown(frame, { key: 'PageDown' })).toBe(true);
  });

  it('does nothing with the keys while the focus is elsewhere or with Ctrl, Alt or Meta held', async () => {
    const { user } = renderPreview();
    const frame = await findView();
    screen.getByRole('button', { name: 'Before the preview' }).focus();
    await user.keyboard('{ArrowLeft}{ArrowDown}+{Home}');
    screen.getByRole('button', { name: 'Turn model left' }).focus();
    await user.keyboard('{ArrowLeft}{ArrowDown}-');
    expect(viewOf(frame)).toEqual(HOME);

    frame.focus();
    expect(fireEvent.keyDown(frame, { key: 'ArrowLeft', ctrlKey: true })).toBe(true);
    expect(fireEvent.keyDown(frame, { key: 'ArrowLeft', altKey: true })).toBe(true);
    expect(fireEvent.keyDown(frame, { key: '+', metaKey: true })).toBe(true);
    expect(viewOf(frame)).toEqual(HOME);
  });

  it('has a named button for each step, which moves the view like its key', async () => {
    const { user } = renderPreview();
    const frame = await findView();
    const group = screen.getByRole('group', { name: 'Move the 3D preview' });
    for (const name of BUTTON_NAMES) {
      expect(screen.getByRole('button', { name })).toBeVisible();
      expect(group).toContainElement(screen.getByRole('button', { name }));
    }

    await user.click(screen.getByRole('button', { name: 'Turn model left' }));
    expect(viewOf(frame).turn).toBeCloseTo(HOME.turn + VIEW_STEP_DEG, 1);
    await user.click(screen.getByRole('button', { name: 'Turn model right' }));
    await user.click(screen.getByRole('button', { name: 'Turn model right' }));
    expect(viewOf(frame).turn).toBeCloseTo(HOME.turn - VIEW_STEP_DEG, 1);
    await user.click(screen.getByRole('button', { name: 'Tilt model down' }));
    expect(viewOf(frame).tilt).toBeCloseTo(HOME.tilt + VIEW_STEP_DEG, 1);
    await user.click(screen.getByRole('button', { name: 'Tilt model up' }));
    await user.click(screen.getByRole('button', { name: 'Tilt model up' }));
    expect(viewOf(frame).tilt).toBeCloseTo(HOME.tilt - VIEW_STEP_DEG, 1);
    await user.click(screen.getByRole('button', { name: 'Zoom in' }));
    expect(viewOf(frame).scale).toBeCloseTo(1 / ZOOM_STEP, 3);
    await user.click(screen.getByRole('button', { name: 'Zoom out' }));
    await user.click(screen.getByRole('button', { name: 'Zoom out' }));
    expect(viewOf(frame).scale).toBeCloseTo(ZOOM_STEP, 3);

    await user.click(screen.getByRole('button', { name: 'Reset view' }));
    expect(viewOf(frame)).toEqual(HOME);
  });

  it('keeps the view for the same model redrawn, and opens a model of another size at the starting view', async () => {
    const larger = { ...report, diameterMm: report.diameterMm * 2 };
    function Studio() {
      const [shown, setShown] = useState({ report, colours: {} as Record<string, number> });
      return (
        <>
          <button type="button" onClick={() => setShown({ report, colours: { [report.pieces[0]!.id]: 1 } })}>
            Recolour
          </button>
          <button type="button" onClick={() => setShown({ report: larger, colours: {} })}>
            Make it larger
          </button>
          <ModelPreview3d report={shown.report} pieceColours={shown.colours} modelKey="k" />
        </>
      );
    }
    const { user } = renderWithProviders(<Studio />);
    const frame = await findView();
    frame.focus();
    await user.keyboard('{ArrowLeft}{ArrowDown}');
    const turned = viewOf(frame);
    expect(turned).not.toEqual(HOME);
    await user.click(screen.getByRole('button', { name: 'Recolour' }));
    expect(viewOf(await findView())).toEqual(turned);
    await user.click(screen.getByRole('button', { name: 'Make it larger' }));
    expect(viewOf(await findView())).toEqual(HOME);
  });
});
