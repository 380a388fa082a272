import { describe, expect, it } from 'vitest';
import {
  applyViewCommand,
  clampTilt,
  eyeOffset,
  HOME_VIEW,
  MAX_DISTANCE_SCALE,
  MAX_TILT_DEG,
  MIN_DISTANCE_SCALE,
  normaliseTurn,
  type PreviewView,
  type ViewCommand,
  viewCommandForKey,
  viewFromEye,
  viewsMatch,
  VIEW_STEP_DEG,
  ZOOM_STEP,
} from './preview-view';

const view = (over: Partial<PreviewView> = {}): PreviewView => ({
  turnDeg: 40,
  tiltDeg: 20,
  distanceScale: 1,
  target: [0, 0, 0],
  ...over,
});

const applyAll = (start: PreviewView, commands: ViewCommand[]) => commands.reduce(applyViewCommand, start);

describe('the 3D preview view: keys', () => {
  it('maps the arrows, + and -, and Home to commands, and nothing else', () => {
    expect(viewCommandForKey('ArrowLeft')).toBe('turn-left');
    expect(viewCommandForKey('ArrowRight')).toBe('turn-right');
    expect(viewCommandForKey('ArrowUp')).toBe('tilt-up');
    expect(viewCommandForKey('ArrowDown')).toBe('tilt-down');
    expect(viewCommandForKey('+')).toBe('zoom-in');
    expect(viewCommandForKey('=')).toBe('zoom-in');
    expect(viewCommandForKey('-')).toBe('zoom-out');
    expect(viewCommandForKey('_')).toBe('zoom-out');
    expect(viewCommandForKey('Home')).toBe('reset');
    for (const key of ['Tab', 'Enter', ' ', 'End', 'PageUp', 'a', 'Escape']) {
      expect(viewCommandForKey(key)).toBeNull();
    }
  });
});

describe('the 3D preview view: one step', () => {
  it('turns by one step about the vertical axis, left adding and right taking away', () => {
    expect(applyViewCommand(view(), 'turn-left')).toEqual(view({ turnDeg: 40 + VIEW_STEP_DEG }));
    expect(applyViewCommand(view(), 'turn-right')).toEqual(view({ turnDeg: 40 - VIEW_STEP_DEG }));
    expect(VIEW_STEP_DEG).toBe(15);
  });

  it('wraps the turn into [0, 360)', () => {
    expect(applyViewCommand(view({ turnDeg: 350 }), 'turn-left').turnDeg).toBeCloseTo(5, 9);
    expect(applyViewCommand(view({ turnDeg: 5 }), 'turn-right').turnDeg).toBeCloseTo(350, 9);
    expect(applyAll(view({ turnDeg: 0 }), Array<ViewCommand>(24).fill('turn-left')).turnDeg).toBeCloseTo(
      0,
      9,
    );
    expect(normaliseTurn(-720)).toBe(0);
    expect(normaliseTurn(-1e-15)).toBe(0);
    expect(normaliseTurn(725)).toBe(5);
  });

  it('tilts by one step: up lowers the eye (the near side rises), down raises it', () => {
    expect(applyViewCommand(view(), 'tilt-up')).toEqual(view({ tiltDeg: 20 - VIEW_STEP_DEG }));
    expect(applyViewCommand(view(), 'tilt-down')).toEqual(view({ tiltDeg: 20 + VIEW_STEP_DEG }));
  });

  it('stops the tilt short of straight above and straight below', () => {
    expect(applyAll(view(), Array<ViewCommand>(20).fill('tilt-down')).tiltDeg).toBe(MAX_TILT_DEG);
    expect(applyAll(view(), Array<ViewCommand>(20).fill('tilt-up')).tiltDeg).toBe(-MAX_TILT_DEG);
    expect(applyViewCommand(view({ tiltDeg: 80 }), 'tilt-down').tiltDeg).toBe(MAX_TILT_DEG);
    expect(MAX_TILT_DEG).toBeLessThan(90);
    expect(clampTilt(120)).toBe(MAX_TILT_DEG);
    expect(clampTilt(-91)).toBe(-MAX_TILT_DEG);
    expect(clampTilt(12.5)).toBe(12.5);
  });

  it('zooms by one factor each way, within the distance limits', () => {
    expect(applyViewCommand(view(), 'zoom-in').distanceScale).toBeCloseTo(1 / ZOOM_STEP, 12);
    expect(applyViewCommand(view(), 'zoom-out').distanceScale).toBeCloseTo(ZOOM_STEP, 12);
    expect(applyAll(view(), Array<ViewCommand>(30).fill('zoom-in')).distanceScale).toBe(MIN_DISTANCE_SCALE);
    expect(applyAll(view(), Array<ViewCommand>(30).fill('zoom-out')).distanceScale).toBe(MAX_DISTANCE_SCALE);
  });

  it('changes only what the command is about, and keeps the target', () => {
    const panned = view({ target: [5, -3, 2] });
    const turned = applyViewCommand(panned, 'turn-left');
    expect(turned.target).toEqual([5, -3, 2]);
    expect([turned.tiltDeg, turned.distanceScale]).toEqual([20, 1]);
    const tilted = applyViewCommand(panned, 'tilt-down');
    expect([tilted.turnDeg, tilted.distanceScale]).toEqual([40, 1]);
    expect(panned).toEqual(view({ target: [5, -3, 2] }));
  });

  it('resets turn, tilt, zoom and target to the starting view', () => {
    const moved = applyAll(view({ target: [9, 9, 9] }), ['turn-left', 'tilt-up', 'zoom-in', 'zoom-in']);
    expect(applyViewCommand(moved, 'reset')).toEqual(HOME_VIEW);
    expect(HOME_VIEW.target).toEqual([0, 0, 0]);
    expect(HOME_VIEW.distanceScale).toBe(1);
  });
});

describe('the 3D preview view: camera position', () => {
  it('puts the starting eye where the preview has always fitted the camera', () => {
    const [x, y, z] = eyeOffset(HOME_VIEW, 200);
    expect(x).toBeCloseTo(180, 9);
    expect(y).toBeCloseTo(140, 9);
    expect(z).toBeCloseTo(260, 9);
  });

  it('turning left moves the eye from the front towards +x (the near side goes left)', () => {
    const [x, , z] = eyeOffset(view({ turnDeg: 0, tiltDeg: 0 }), 100);
    expect(x).toBeCloseTo(0, 9);
    expect(z).toBeGreaterThan(0);
    const [x2] = eyeOffset(applyViewCommand(view({ turnDeg: 0, tiltDeg: 0 }), 'turn-left'), 100);
    expect(x2).toBeGreaterThan(0);
  });

  it('reads back the view it placed, and the starting view for an eye on the target', () => {
    const placed = view({ turnDeg: 300, tiltDeg: -60, distanceScale: 2.5, target: [1, 2, 3] });
    const read = viewFromEye(eyeOffset(placed, 80), placed.target, 80);
    expect(viewsMatch(read, placed)).toBe(true);
    expect(read.turnDeg).toBeCloseTo(300, 9);
    expect(read.tiltDeg).toBeCloseTo(-60, 9);
    expect(read.distanceScale).toBeCloseTo(2.5, 9);
    expect(viewFromEye([0, 0, 0], [0, 0, 0], 80)).toBe(HOME_VIEW);
  });

  it('scales the distance with the diameter, with 1 mm for a diameter that is not a number', () => {
    const at = (d: number) => Math.hypot(...eyeOffset(HOME_VIEW, d));
    expect(at(400) / at(100)).toBeCloseTo(4, 9);
    expect(at(Number.NaN)).toBeCloseTo(at(1), 12);
    expect(at(0)).toBeCloseTo(at(1), 12);
  });

  it('tells views apart by turn, tilt, zoom or target, and not by a whole turn', () => {
    expect(viewsMatch(view(), view())).toBe(true);
    expect(viewsMatch(view({ turnDeg: 0 }), view({ turnDeg: 360 - 1e-9 }))).toBe(true);
    expect(viewsMatch(view(), view({ turnDeg: 41 }))).toBe(false);
    expect(viewsMatch(view(), view({ tiltDeg: 21 }))).toBe(false);
    expect(viewsMatch(view(), view({ distanceScale: 1.1 }))).toBe(false);
    expect(viewsMatch(view(), view({ target: [0, 0.5, 0] }))).toBe(false);
  });
});
