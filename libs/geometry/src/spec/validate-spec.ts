import type {
  BedSpec,
  ColourPlanRule,
  DesignSpec,
  DesignSpecInput,
  FieldError,
  MachineSpec,
  ScaleBy,
  UploadedSolid,
} from '@kerfwright/contracts';
import { isSolidId } from '../solids/catalogue';
import { MAX_SOLID_TEXT_LENGTH } from '../solids/parse';
import { checkPieceShape, type PieceShape } from '../pieces/shape';

/** A spec with every default filled in; what buildModel works from. */
export interface ResolvedSpec {
  solid: string | UploadedSolid;
  piece: PieceShape;
  scale: ResolvedScale;
  stock: { thicknessMm: number; flexible: boolean };
  /** Sheet of stock with margin and gap; null when the spec gives no sheet. */
  sheet: { widthMm: number; heightMm: number; marginMm: number; gapMm: number } | null;
  colours: { count: number; rule: ColourPlanRule; names?: string[] } | null;
  machine: MachineSpec;
  fitMm: number;
  depthClearanceMm: number;
  minWebMm: number;
  bed: BedSpec | null;
}

export type ResolvedScale =
  { by: ScaleBy; mm: number } | { by: 'fitSheets'; sheets: number } | { by: 'fitBed' };

export type SpecValidation = { ok: true; spec: ResolvedSpec } | { ok: false; errors: FieldError[] };

/** Largest piece size accepted (circumradius ÷ plane distance). */
export const MAX_PIECE_SIZE = 50;
/** Largest model dimension accepted, mm. */
export const MAX_SCALE_MM = 10_000;
/** Most sheets a fitSheets scale may ask for. */
export const MAX_FIT_SHEETS = 50;
/** Most colours of stock. */
export const MAX_COLOURS = 12;
/** Largest sheet side accepted, mm. */
export const MAX_SHEET_MM = 10_000;
/** Margin and gap used when the spec gives a sheet but not these, mm. */
export const DEFAULT_SHEET_MARGIN_MM = 5;
export const DEFAULT_SHEET_GAP_MM = 3;
const COLOUR_RULE_NAMES: readonly ColourPlanRule[] = [
  'neighbour-distinct',
  'vertex-distinct',
  'opposite-match',
];

class Collector {
  readonly errors: FieldError[] = [];
  add(field: string, message: string): void {
    const e = this.errors.find((x) => x.field === field);
    if (e) e.messages.push(message);
    else this.errors.push({ field, messages: [message] });
  }
}

const isObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

function allowOnly(
  c: Collector,
  obj: Record<string, unknown>,
  prefix: string,
  keys: readonly string[],
): void {
  for (const k of Object.keys(obj)) {
    if (!keys.includes(k)) c.add(prefix + k, `unknown field "${prefix}${k}"`);
  }
}

function num(
  c: Collector,
  obj: Record<string, unknown>,
  key: string,
  prefix: string,
  opts: { min?: number; minExclusive?: number; max?: number; integer?: boolean; optional?: number },
): number {
  const field = prefix + key;
  const v = obj[key];
  if (v === undefined && opts.optional !== undefined) return opts.optional;
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    c.add(field, v === undefined ? `${field} is required` : `${field} must be a finite number`);
    return NaN;
  }
  if (opts.integer && !Number.isInteger(v)) c.add(field, `${field} must be a whole number`);
  if (opts.min !== undefined && v < opts.min) c.add(field, `${field} must be at least ${opts.min}`);
  if (opts.minExclusive !== undefined && v <= opts.minExclusive) {
    c.add(field, `${field} must be greater than ${opts.minExclusive}`);
  }
  if (opts.max !== undefined && v > opts.max) c.add(field, `${field} must be at most ${opts.max}`);
  return v;
}

function section(c: Collector, spec: Record<string, unknown>, key: string): Record<string, unknown> | null {
  const v = spec[key];
  if (!isObject(v)) {
    c.add(key, v === undefined ? `${key} is required` : `${key} must be an object`);
    return null;
  }
  return v;
}

/**
 * Checks a design spec (any JSON value) field by field. Returns the spec with defaults filled in, or the
 * list of field errors (field paths such as `piece.step` or `machine.kerfMm`). Unknown fields are errors.
 */
export function validateSpec(input: unknown): SpecValidation {
  const c = new Collector();
  if (!isObject(input))
    return { ok: false, errors: [{ field: '', messages: ['the spec must be a JSON object'] }] };
  allowOnly(c, input, '', [
    'solid',
    'piece',
    'scale',
    'stock',
    'machine',
    'fitMm',
    'depthClearanceMm',
    'minWebMm',
    'bed',
    'colours',
  ]);

  let solid: string | UploadedSolid = '';
  const s = input.solid;
  if (typeof s === 'string') {
    if (!isSolidId(s))
      c.add('solid', `unknown solid "${s}" (see listSolids(); prisms and antiprisms take 3 to 12 sides)`);
    solid = s;
  } else if (isObject(s)) {
    allowOnly(c, s, 'solid.', ['format', 'text', 'name']);
    if (s.format !== 'obj' && s.format !== 'off')
      c.add('solid.format', 'solid.format must be "obj" or "off"');
    if (typeof s.text !== 'string' || s.text.length === 0)
      c.add('solid.text', 'solid.text must be non-empty text');
    else if (s.text.length > MAX_SOLID_TEXT_LENGTH) {
      c.add('solid.text', `solid.text is longer than ${MAX_SOLID_TEXT_LENGTH} characters`);
    }
    if (s.name !== undefined && typeof s.name !== 'string') c.add('solid.name', 'solid.name must be text');
    solid = {
      format: s.format === 'off' ? 'off' : 'obj',
      text: typeof s.text === 'string' ? s.text : '',
      ...(typeof s.name === 'string' ? { name: s.name } : {}),
    };
  } else {
    c.add('solid', s === undefined ? 'solid is required' : 'solid must be a catalogue id or {format, text}');
  }

  const piece: PieceShape = { sides: NaN, step: 1, rotationDeg: 0, size: NaN };
  const p = section(c, input, 'piece');
  if (p) {
    allowOnly(c, p, 'piece.', ['sides', 'step', 'rotationDeg', 'size']);
    piece.sides = num(c, p, 'sides', 'piece.', { integer: true, min: 3 });
    piece.step = num(c, p, 'step', 'piece.', { integer: true, min: 1, optional: 1 });
    piece.rotationDeg = num(c, p, 'rotationDeg', 'piece.', { optional: 0, min: -3600, max: 3600 });
    piece.size = num(c, p, 'size', 'piece.', { minExclusive: 0, max: MAX_PIECE_SIZE });
    if (
      Number.isInteger(piece.sides) &&
      Number.isInteger(piece.step) &&
      piece.sides >= 3 &&
      piece.step >= 1
    ) {
      for (const m of checkPieceShape(piece.sides, piece.step))
        c.add(/sides/.test(m) && !/step/.test(m) ? 'piece.sides' : 'piece.step', m);
    }
  }

  let scale: ResolvedScale = { by: 'planeDistance', mm: NaN };
  const sc = section(c, input, 'scale');
  if (sc) {
    if (sc.by === 'planeDistance' || sc.by === 'diameter' || sc.by === 'pieceCircumradius') {
      allowOnly(c, sc, 'scale.', ['by', 'mm']);
      scale = { by: sc.by, mm: num(c, sc, 'mm', 'scale.', { minExclusive: 0, max: MAX_SCALE_MM }) };
    } else if (sc.by === 'fitSheets') {
      allowOnly(c, sc, 'scale.', ['by', 'sheets']);
      scale = {
        by: 'fitSheets',
        sheets: num(c, sc, 'sheets', 'scale.', { integer: true, min: 1, max: MAX_FIT_SHEETS }),
      };
      if (!isObject(input.stock) || input.stock.sheet === undefined)
        c.add('stock.sheet', 'stock.sheet is required when scale.by is "fitSheets"');
    } else if (sc.by === 'fitBed') {
      allowOnly(c, sc, 'scale.', ['by']);
      scale = { by: 'fitBed' };
      if (input.bed === undefined) c.add('bed', 'bed is required when scale.by is "fitBed"');
    } else {
      if (sc.mm !== undefined) num(c, sc, 'mm', 'scale.', { minExclusive: 0, max: MAX_SCALE_MM });
      c.add(
        'scale.by',
        'scale.by must be "planeDistance", "diameter", "pieceCircumradius", "fitSheets" or "fitBed"',
      );
    }
  }

  const stock = { thicknessMm: NaN, flexible: false };
  let sheet: ResolvedSpec['sheet'] = null;
  const st = section(c, input, 'stock');
  if (st) {
    allowOnly(c, st, 'stock.', ['thicknessMm', 'flexible', 'sheet', 'marginMm', 'gapMm']);
    stock.thicknessMm = num(c, st, 'thicknessMm', 'stock.', { minExclusive: 0, max: 100 });
    if (st.flexible !== undefined && typeof st.flexible !== 'boolean') {
      c.add('stock.flexible', 'stock.flexible must be true or false');
    }
    stock.flexible = st.flexible === true;
    if (st.sheet !== undefined) {
      const sh = st.sheet;
      if (!isObject(sh)) c.add('stock.sheet', 'stock.sheet must be {"widthMm", "heightMm"}');
      else {
        allowOnly(c, sh, 'stock.sheet.', ['widthMm', 'heightMm']);
        const opts = { minExclusive: 0, max: MAX_SHEET_MM };
        const widthMm = num(c, sh, 'widthMm', 'stock.sheet.', opts);
        const heightMm = num(c, sh, 'heightMm', 'stock.sheet.', opts);
        const marginMm = num(c, st, 'marginMm', 'stock.', {
          min: 0,
          max: 1000,
          optional: DEFAULT_SHEET_MARGIN_MM,
        });
        const gapMm = num(c, st, 'gapMm', 'stock.', { min: 0, max: 1000, optional: DEFAULT_SHEET_GAP_MM });
        if (widthMm > 0 && heightMm > 0 && 2 * marginMm >= Math.min(widthMm, heightMm))
          c.add('stock.marginMm', 'stock.marginMm leaves no room on the sheet');
        sheet = { widthMm, heightMm, marginMm, gapMm };
      }
    } else {
      for (const k of ['marginMm', 'gapMm'])
        if (st[k] !== undefined) c.add(`stock.${k}`, `stock.${k} needs stock.sheet`);
    }
  }

  let machine: MachineSpec = { kind: 'laser', kerfMm: 0 };
  const m = section(c, input, 'machine');
  if (m) {
    if (m.kind === 'laser') {
      allowOnly(c, m, 'machine.', ['kind', 'kerfMm']);
      machine = { kind: 'laser', kerfMm: num(c, m, 'kerfMm', 'machine.', { min: 0, max: 5 }) };
    } else if (m.kind === 'router') {
      allowOnly(c, m, 'machine.', ['kind', 'toolDiameterMm']);
      machine = {
        kind: 'router',
        toolDiameterMm: num(c, m, 'toolDiameterMm', 'machine.', { minExclusive: 0, max: 50 }),
      };
    } else c.add('machine.kind', 'machine.kind must be "laser" or "router"');
  }

  const fitMm = num(c, input, 'fitMm', '', { optional: 0, min: -10, max: 10 });
  const depthClearanceMm = num(c, input, 'depthClearanceMm', '', { optional: 0, min: 0, max: 100 });
  const minWebMm = num(c, input, 'minWebMm', '', {
    optional: 2 * (stock.thicknessMm || 0),
    min: 0,
    max: 1000,
  });
  let bed: BedSpec | null = null;
  if (input.bed !== undefined) {
    const b = section(c, input, 'bed');
    if (b) {
      allowOnly(c, b, 'bed.', ['widthMm', 'heightMm']);
      bed = {
        widthMm: num(c, b, 'widthMm', 'bed.', { minExclusive: 0, max: 100_000 }),
        heightMm: num(c, b, 'heightMm', 'bed.', { minExclusive: 0, max: 100_000 }),
      };
    }
  }
  let colours: ResolvedSpec['colours'] = null;
  if (input.colours !== undefined) {
    const co = section(c, input, 'colours');
    if (co) {
      allowOnly(c, co, 'colours.', ['count', 'rule', 'names']);
      let names: string[] | undefined;
      if (co.names !== undefined) {
        const ok =
          Array.isArray(co.names) &&
          co.names.length >= 1 &&
          co.names.length <= MAX_COLOURS &&
          co.names.every((x) => typeof x === 'string' && x.trim().length > 0 && x.length <= 60);
        if (ok) names = co.names as string[];
        else c.add('colours.names', `colours.names must be 1 to ${MAX_COLOURS} names of 1 to 60 characters`);
      }
      const count = num(c, co, 'count', 'colours.', {
        integer: true,
        min: 1,
        max: MAX_COLOURS,
        ...(names ? { optional: names.length } : {}),
      });
      if (names && count !== names.length)
        c.add('colours.names', `colours.names has ${names.length} names but colours.count is ${count}`);
      let rule: ColourPlanRule = 'neighbour-distinct';
      if (co.rule !== undefined) {
        if (COLOUR_RULE_NAMES.includes(co.rule as ColourPlanRule)) rule = co.rule as ColourPlanRule;
        else
          c.add(
            'colours.rule',
            `colours.rule must be one of ${COLOUR_RULE_NAMES.map((r) => `"${r}"`).join(', ')}`,
          );
      }
      // One colour with no rule asked for needs no plan (the default rule would only fail it).
      colours = count === 1 && co.rule === undefined ? null : { count, rule, ...(names ? { names } : {}) };
    }
  }
  if (scale.by === 'fitSheets' && colours && scale.sheets < colours.count) {
    c.add(
      'scale.sheets',
      `scale.sheets must be at least colours.count (${colours.count}): each colour is cut from its own sheets`,
    );
  }
  // A router's bit runs outside each piece: its path is one bit diameter wider than the outline, and the layout
  // keeps the pieces a bit diameter from the sheet's edges. A bed or sheet with no room left for that has no size
  // that fits (fitBed would search an empty rectangle).
  if (machine.kind === 'router') {
    const d = machine.toolDiameterMm;
    if (scale.by === 'fitBed' && bed && d > 0 && Math.min(bed.widthMm, bed.heightMm) <= d)
      c.add(
        'bed',
        `the bed leaves no room for a piece: the ${d} mm router bit runs outside each piece, so the bed must be ` +
          'wider and taller than the bit',
      );
    if (sheet && d > 0 && 2 * Math.max(sheet.marginMm, d) >= Math.min(sheet.widthMm, sheet.heightMm))
      c.add(
        'stock.sheet',
        `the sheet leaves no room for a piece: a router keeps its bit's diameter (${d} mm) from the sheet's edges`,
      );
  }
  if (c.errors.length) return { ok: false, errors: c.errors };
  return {
    ok: true,
    spec: { solid, piece, scale, stock, sheet, colours, machine, fitMm, depthClearanceMm, minWebMm, bed },
  };
}

/** Thrown by buildModel for a spec that fails validateSpec; carries the field errors. */
export class SpecValidationError extends Error {
  constructor(readonly fieldErrors: FieldError[]) {
    super(
      'invalid spec: ' +
        fieldErrors.map((e) => (e.field ? `${e.field}: ` : '') + e.messages.join('; ')).join(' | '),
    );
    this.name = 'SpecValidationError';
  }
}

/** The spec types accepted from callers (defaults optional). */
export type { DesignSpec, DesignSpecInput };
