/**
 * Pack and coupon for the command line: take the parsed JSON spec (which may carry the issue-4 fields
 * `stock.sheet`, `stock.marginMm`, `stock.gapMm` and `colours: {count, rule}`), fill what a workshop would
 * otherwise supply from its machine profile and materials library with stated defaults, and build the
 * files. The CLI entry writes the returned files to --out.
 */
import type { ColourRuleName, CutPackInput, CutPackResult, DesignSpec } from '@kerfwright/contracts';
import { buildModel, solveModelColourPlan } from '../build';
import { buildWithLayout } from '../layout/build-with-layout';
import { validateSpec } from '../spec/validate-spec';
import { CutPackError, createCoupon, createCutPack } from './pack';

export interface PackCommandOptions {
  sheet?: { widthMm: number; heightMm: number };
  marginMm?: number;
  gapMm?: number;
  /** Colour names, or a count (named colour-1, colour-2 …). */
  colours?: string[] | number;
  colourRule?: ColourRuleName;
  quantity?: number;
  units?: 'mm' | 'in';
  archive?: boolean;
  machine?: Partial<CutPackInput['machine']>;
  material?: Partial<CutPackInput['material']>;
  job?: Partial<CutPackInput['job']>;
  notices?: CutPackInput['notices'];
  /** Time stamp printed in the files; default the Unix epoch (the library reads no clock). */
  createdAt?: string;
}

const isObj = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** Splits the layout fields off a spec; returns the design spec buildModel accepts and the extras. */
export function splitSpec(raw: unknown): {
  spec: DesignSpec;
  sheet?: { widthMm: number; heightMm: number };
  marginMm?: number;
  gapMm?: number;
  colours?: { count?: number; rule?: ColourRuleName; names?: string[] };
} {
  if (!isObj(raw)) return { spec: raw as DesignSpec };
  const { colours, ...rest } = raw;
  const out: ReturnType<typeof splitSpec> = { spec: rest as unknown as DesignSpec };
  if (isObj(rest.stock)) {
    const { sheet, marginMm, gapMm, ...stock } = rest.stock;
    out.spec = { ...(rest as unknown as DesignSpec), stock: stock as unknown as DesignSpec['stock'] };
    if (isObj(sheet)) out.sheet = { widthMm: Number(sheet.widthMm), heightMm: Number(sheet.heightMm) };
    if (typeof marginMm === 'number') out.marginMm = marginMm;
    if (typeof gapMm === 'number') out.gapMm = gapMm;
  }
  if (isObj(colours)) {
    out.colours = {};
    if (typeof colours.count === 'number') out.colours.count = colours.count;
    if (typeof colours.rule === 'string') out.colours.rule = colours.rule as ColourRuleName;
    if (Array.isArray(colours.names)) out.colours.names = colours.names.map(String);
  }
  return out;
}

/** Defaults for a run without a machine profile: a 60 W CO2 laser on 3 mm ply (REFERENCES starting values). */
export const CLI_DEFAULT_MACHINE: CutPackInput['machine'] = {
  profileName: 'command-line defaults',
  profileVersion: 0,
  kind: 'laser',
  bedWidthMm: 600,
  bedHeightMm: 400,
  cutSpeedMmS: 15,
  markSpeedMmS: 100,
  pierceTimeS: 0.2,
  rapidSpeedMmS: 300,
  passes: 1,
  hourlyRate: 0,
  currency: 'EUR',
};

/**
 * Starting values for a router's estimates when the command line gives none (from memory, for a 3.175 mm
 * two-flute bit in plywood: feed about 1,200 mm/min, a second to plunge, rapids at 6 m/min): calibrate for
 * your machine. No power setting: the spindle is the router's own.
 */
export const CLI_DEFAULT_ROUTER: CutPackInput['machine'] = {
  profileName: 'command-line defaults (router)',
  profileVersion: 0,
  kind: 'router',
  bedWidthMm: 600,
  bedHeightMm: 400,
  cutSpeedMmS: 20,
  markSpeedMmS: 20,
  pierceTimeS: 1,
  rapidSpeedMmS: 100,
  passes: 1,
  hourlyRate: 0,
  currency: 'EUR',
};

/** The sheet a pack is laid out on when the spec gives none (and its margin). */
export const PACK_DEFAULT_SHEET = { widthMm: 600, heightMm: 400 };
export const PACK_DEFAULT_MARGIN_MM = 5;

export function packInputFrom(rawSpec: unknown, o: PackCommandOptions = {}): CutPackInput {
  const s = splitSpec(rawSpec);
  const sheet = o.sheet ?? s.sheet ?? PACK_DEFAULT_SHEET;
  const count =
    typeof o.colours === 'number' ? o.colours : (s.colours?.count ?? s.colours?.names?.length ?? 1);
  const colours = Array.isArray(o.colours)
    ? o.colours
    : (s.colours?.names ?? Array.from({ length: Math.max(1, count) }, (_, i) => `colour-${i + 1}`));
  const rule = o.colourRule ?? s.colours?.rule;
  const machineKind = s.spec.machine?.kind ?? 'laser';
  // The spec's bed, when it gives one, is the machine's; else the machine is taken to take the sheet.
  const bed = s.spec.bed
    ? { bedWidthMm: s.spec.bed.widthMm, bedHeightMm: s.spec.bed.heightMm }
    : { bedWidthMm: sheet.widthMm, bedHeightMm: sheet.heightMm };
  const defaults = machineKind === 'router' ? CLI_DEFAULT_ROUTER : CLI_DEFAULT_MACHINE;
  return {
    spec: s.spec,
    sheet,
    marginMm: o.marginMm ?? s.marginMm ?? PACK_DEFAULT_MARGIN_MM,
    gapMm: o.gapMm ?? s.gapMm ?? 3,
    colours,
    ...(rule ? { colourRule: rule } : {}),
    quantity: o.quantity ?? 1,
    machine: { ...defaults, kind: machineKind, ...bed, ...o.machine },
    material: {
      name: 'stock',
      family: 'unspecified',
      thicknessMm: s.spec.stock?.thicknessMm ?? 0,
      pricePerSheet: 0,
      currency: 'EUR',
      ...o.material,
    },
    job: { id: 'cli', title: 'command-line pack', requester: 'command line', ...o.job },
    notices: o.notices ?? [],
    localRulesVersion: null,
    units: o.units ?? 'mm',
    archive: o.archive ?? false,
    createdAt: o.createdAt ?? '1970-01-01T00:00:00.000Z',
  };
}

/**
 * Checks a parsed spec and turns a fit scale (`fitSheets`, `fitBed`) into the fixed diameter it resolves
 * to (buildWithLayout), so the pack is cut at that size. Throws CutPackError PACK.SPEC_INVALID for an
 * invalid spec, PACK.LAYOUT_FAILED when no colour plan meets the rule and PACK.DESIGN_INVALID when the fitted
 * design has other errors.
 */
export function resolveSpecForPack(rawSpec: unknown): unknown {
  const v = validateSpec(rawSpec);
  if (!v.ok) {
    const text = v.errors.map((e) => (e.field ? `${e.field}: ` : '') + e.messages.join('; ')).join(' | ');
    throw new CutPackError(
      'PACK.SPEC_INVALID',
      `invalid spec: ${text}`,
      v.errors.map((e) => e.field),
    );
  }
  if (v.spec.colours?.count === 1 && v.spec.colours.rule) {
    // The layout solves plans for two colours or more; one colour meets a rule only when it separates no
    // pieces, as `build` reports (COLOUR.NO_PLAN).
    const plan = solveModelColourPlan(buildModel(rawSpec));
    if (!plan.feasible)
      throw new CutPackError('PACK.LAYOUT_FAILED', plan.message ?? 'no colour plan exists for one colour');
  }
  if (v.spec.scale.by !== 'fitSheets' && v.spec.scale.by !== 'fitBed') return rawSpec;
  // A fit is found on the sheet the pack will be laid out on: the spec's, or the pack's default one.
  const raw = rawSpec as { stock?: Record<string, unknown> };
  const fitSpec =
    raw.stock && !raw.stock.sheet
      ? {
          ...raw,
          stock: {
            ...raw.stock,
            sheet: PACK_DEFAULT_SHEET,
            marginMm: raw.stock.marginMm ?? PACK_DEFAULT_MARGIN_MM,
          },
        }
      : rawSpec;
  let built;
  try {
    built = buildWithLayout(fitSpec);
  } catch (e) {
    throw new CutPackError('PACK.SPEC_INVALID', (e as Error).message);
  }
  const errors = built.model.report.errors;
  // No colour plan is a layout failure, as at a fixed scale (the fit search reports it as a design error).
  if (errors.length > 0 && errors.every((e) => e.code === 'COLOUR.NO_PLAN')) {
    throw new CutPackError('PACK.LAYOUT_FAILED', errors.map((e) => e.message).join('; '));
  }
  if (errors.length > 0) {
    // A fit scale that found no size says why in one sentence: that leads, before the last size's errors.
    const noFit = errors.filter((e) => e.code === 'SCALE.NO_FIT');
    const ordered = [...noFit, ...errors.filter((e) => e.code !== 'SCALE.NO_FIT')];
    throw new CutPackError(
      'PACK.DESIGN_INVALID',
      `the design has errors: ${ordered.map((e) => `${e.code}: ${e.message}`).join('; ')}`,
      errors.map((e) => e.code),
    );
  }
  return built.resolvedSpec;
}

/** `pack SPEC.json --out DIR`: the whole cut pack for a parsed spec (fit scales resolved first). */
export async function runPackCommand(
  rawSpec: unknown,
  options: PackCommandOptions = {},
): Promise<CutPackResult> {
  return createCutPack(packInputFrom(resolveSpecForPack(rawSpec), options));
}

/** `coupon SPEC.json --out DIR`: the fit-test coupon alone. */
export async function runCouponCommand(
  rawSpec: unknown,
  options: Pick<PackCommandOptions, 'units' | 'archive' | 'machine' | 'job' | 'createdAt'> = {},
): Promise<CutPackResult> {
  const input = packInputFrom(resolveSpecForPack(rawSpec), options);
  return createCoupon({
    spec: input.spec,
    units: input.units,
    createdAt: input.createdAt,
    machine: input.machine,
    job: input.job,
    archive: input.archive,
  });
}
