/**
 * Where the 3D preview's eye is, as plain numbers, and how a key or a button moves it. No three.js here: the
 * preview turns these numbers into a camera position, and reads them back after a drag.
 *
 * Directions follow a drag: a step to the left moves the model's near side to the left, a step up moves it
 * up (the eye goes lower), as if the model had been dragged that way.
 */
export interface PreviewView {
  /** Angle of the eye about the vertical axis through the target, degrees in [0, 360); 0 looks from +z. */
  turnDeg: number;
  /** Angle of the eye above the horizontal plane through the target, degrees in [-MAX_TILT_DEG, MAX_TILT_DEG]. */
  tiltDeg: number;
  /** Distance of the eye from the target, as a multiple of the distance that fits the whole model in view. */
  distanceScale: number;
  /** The point looked at, mm (a right-drag moves it); the model's centre is the origin. */
  target: readonly [number, number, number];
}

export type ViewCommand =
  'turn-left' | 'turn-right' | 'tilt-up' | 'tilt-down' | 'zoom-in' | 'zoom-out' | 'reset';

/** One key press or button click turns or tilts this much. */
export const VIEW_STEP_DEG = 15;
/** The eye stays this far from straight above or below: at the pole the camera's "up" is undefined. */
export const MAX_TILT_DEG = 85;
/** One zoom step divides (in) or multiplies (out) the distance by this. */
export const ZOOM_STEP = 1.25;
export const MIN_DISTANCE_SCALE = 0.25;
export const MAX_DISTANCE_SCALE = 4;

/** The eye of the starting view, per mm of the model's diameter: above, to the right and in front. */
const FIT_EYE = [0.9, 0.7, 1.3] as const;
/** Distance from the centre to the starting eye, per mm of the model's diameter. */
export const FIT_DISTANCE_PER_MM = Math.hypot(...FIT_EYE);

const DEG = 180 / Math.PI;

/** The view the preview opens with, and the one "reset" returns to. */
export const HOME_VIEW: PreviewView = Object.freeze({
  turnDeg: Math.atan2(FIT_EYE[0], FIT_EYE[2]) * DEG,
  tiltDeg: Math.atan2(FIT_EYE[1], Math.hypot(FIT_EYE[0], FIT_EYE[2])) * DEG,
  distanceScale: 1,
  target: Object.freeze([0, 0, 0] as const),
});

const clamp = (value: number, min: number, max: number) => Math.min(max, Math.max(min, value));

export function clampTilt(tiltDeg: number): number {
  return clamp(tiltDeg, -MAX_TILT_DEG, MAX_TILT_DEG);
}

/** An angle brought into [0, 360). */
export function normaliseTurn(turnDeg: number): number {
  const turn = ((turnDeg % 360) + 360) % 360;
  // -1e-15 % 360 + 360 rounds to 360 itself.
  return turn >= 360 ? 0 : turn;
}

/** The diameter the camera is fitted to: at least 1 mm, and 1 mm for a diameter that is not a number. */
export function fittedDiameterMm(diameterMm: number): number {
  return Number.isFinite(diameterMm) ? Math.max(diameterMm, 1) : 1;
}

/**
 * The command a key stands for, or null for any other key. Arrows turn and tilt, + and - zoom ("=" and "_"
 * too: the same keys without and with Shift on many layouts), Home goes back to the starting view.
 */
export function viewCommandForKey(key: string): ViewCommand | null {
  switch (key) {
    case 'ArrowLeft':
      return 'turn-left';
    case 'ArrowRight':
      return 'turn-right';
    case 'ArrowUp':
      return 'tilt-up';
    case 'ArrowDown':
      return 'tilt-down';
    case '+':
    case '=':
      return 'zoom-in';
    case '-':
    case '_':
      return 'zoom-out';
    case 'Home':
      return 'reset';
    default:
      return null;
  }
}

/** The view after one command: turns wrap around, the tilt and the distance stop at their limits. */
export function applyViewCommand(view: PreviewView, command: ViewCommand): PreviewView {
  switch (command) {
    case 'turn-left':
      return { ...view, turnDeg: normaliseTurn(view.turnDeg + VIEW_STEP_DEG) };
    case 'turn-right':
      return { ...view, turnDeg: normaliseTurn(view.turnDeg - VIEW_STEP_DEG) };
    case 'tilt-up':
      return { ...view, tiltDeg: clampTilt(view.tiltDeg - VIEW_STEP_DEG) };
    case 'tilt-down':
      return { ...view, tiltDeg: clampTilt(view.tiltDeg + VIEW_STEP_DEG) };
    case 'zoom-in':
      return {
        ...view,
        distanceScale: clamp(view.distanceScale / ZOOM_STEP, MIN_DISTANCE_SCALE, MAX_DISTANCE_SCALE),
      };
    case 'zoom-out':
      return {
        ...view,
        distanceScale: clamp(view.distanceScale * ZOOM_STEP, MIN_DISTANCE_SCALE, MAX_DISTANCE_SCALE),
      };
    case 'reset':
      return HOME_VIEW;
  }
}

/** The eye's offset from the target, mm, for a model of this diameter (y is up). */
export function eyeOffset(view: PreviewView, diameterMm: number): [number, number, number] {
  const distance = FIT_DISTANCE_PER_MM * fittedDiameterMm(diameterMm) * view.distanceScale;
  const turn = view.turnDeg / DEG;
  const tilt = view.tiltDeg / DEG;
  const across = distance * Math.cos(tilt);
  return [across * Math.sin(turn), distance * Math.sin(tilt), across * Math.cos(turn)];
}

/** The view of an eye at this offset from this target (the inverse of eyeOffset); the starting view for none. */
export function viewFromEye(
  offset: readonly [number, number, number],
  target: readonly [number, number, number],
  diameterMm: number,
): PreviewView {
  const [x, y, z] = offset;
  const distance = Math.hypot(x, y, z);
  if (!(distance > 0) || !Number.isFinite(distance)) return HOME_VIEW;
  return {
    turnDeg: normaliseTurn(Math.atan2(x, z) * DEG),
    tiltDeg: Math.atan2(y, Math.hypot(x, z)) * DEG,
    distanceScale: distance / (FIT_DISTANCE_PER_MM * fittedDiameterMm(diameterMm)),
    target: [target[0], target[1], target[2]],
  };
}

/** Whether two views put the eye in the same place, to well under what the eye could see. */
export function viewsMatch(a: PreviewView, b: PreviewView): boolean {
  const near = (p: number, q: number, tolerance: number) => Math.abs(p - q) <= tolerance;
  const turnGap = Math.abs(normaliseTurn(a.turnDeg) - normaliseTurn(b.turnDeg));
  return (
    Math.min(turnGap, 360 - turnGap) <= 1e-6 &&
    near(a.tiltDeg, b.tiltDeg, 1e-6) &&
    near(a.distanceScale, b.distanceScale, 1e-9) &&
    a.target.every((t, i) => near(t, b.target[i], 1e-6))
  );
}
