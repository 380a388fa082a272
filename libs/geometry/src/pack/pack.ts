/**
 * The cut pack (Node only): per sheet a DXF and an SVG, the fit-test coupon, the setup sheet and the
 * assembly guide (PDF), manifest.json with SHA-256 checksums, and optionally one ZIP of it all. See
 * README.md beside this file for the contents and formats.
 */
import { createHash } from 'node:crypto';
import JSZip from 'jszip';
import type {
  CutPackEstimate,
  CutPackFile,
  CutPackInput,
  CutPackManifest,
  CutPackResult,
  DesignSpec,
} from '@kerfwright/contracts';
import {
  geometryMachineKind,
  MACHINE_PROFILE_KINDS,
  type MachineProfileKind,
  toEstimateMachine,
} from '@kerfwright/contracts';
import { type BuiltModel, buildModel } from '../build';
import { gapRaisedNote, layoutModel, marginRaisedNote } from '../layout/plan-layout';
import { clashingColourNames, engravedColourName, printableColourName, slug } from './slug';
import { assemblyStepsOfReport } from './assembly';
import { type Coupon, buildCoupon } from './coupon';
import { assemblyGuidePdf, setupSheetPdf } from './documents';
import { sheetToDxf, sheetToSvg } from './sheet-files';
import { PackSheetsError, drawPackSheets, sheetsEstimate } from './pack-sheets';
import { withCutter } from '../estimate';
import { unitLengthText, unitSizeText } from '../math/length-text';

/** Thrown when a pack cannot be made; `code` reads AREA.REASON. */
export class CutPackError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly details: string[] = [],
  ) {
    super(message);
  }
}

const CONTENT_TYPES = {
  dxf: 'application/dxf',
  svg: 'image/svg+xml',
  pdf: 'application/pdf',
  json: 'application/json',
  zip: 'application/zip',
} as const;

const enc = new TextEncoder();

function checkInput(input: CutPackInput): void {
  const m = input.machine;
  const bad = (
    [
      ['machine.cutSpeedMmS', m.cutSpeedMmS],
      ['machine.markSpeedMmS', m.markSpeedMmS],
      ['machine.rapidSpeedMmS', m.rapidSpeedMmS],
    ] as const
  )
    .filter(([, v]) => !(v > 0))
    .map(([k]) => k);
  if (!(m.pierceTimeS >= 0)) bad.push('machine.pierceTimeS' as never);
  if (bad.length)
    throw new CutPackError('PACK.BAD_MACHINE', `machine speeds must be positive: ${bad.join(', ')}`, bad);
  if (input.units !== 'mm' && input.units !== 'in')
    throw new CutPackError('PACK.BAD_UNITS', 'units must be "mm" or "in"');
  if (input.colours.length < 1)
    throw new CutPackError('PACK.NO_COLOURS', 'at least one colour of stock is needed');
  const clash = clashingColourNames(input.colours);
  if (clash)
    throw new CutPackError(
      'PACK.SAME_COLOUR_NAMES',
      `the colours "${clash[0]}" and "${clash[1]}" would get the same file names and engraving; name them apart`,
      clash,
    );
}

function buildChecked(spec: DesignSpec): BuiltModel {
  let model: BuiltModel;
  try {
    model = buildModel(spec);
  } catch (e) {
    // A malformed spec (SpecValidationError) or an unusable uploaded solid (SolidError).
    throw new CutPackError('PACK.SPEC_INVALID', (e as Error).message);
  }
  if (model.report.errors.length > 0) {
    throw new CutPackError(
      'PACK.DESIGN_INVALID',
      `the design has errors: ${model.report.errors.map((e) => e.message).join('; ')}`,
      model.report.errors.map((e) => e.code),
    );
  }
  return model;
}

const sha256 = (data: Uint8Array) => createHash('sha256').update(data).digest('hex');

async function finish(
  input: Pick<CutPackInput, 'job' | 'createdAt' | 'units' | 'archive'> &
    Partial<Pick<CutPackInput, 'notices' | 'localRulesVersion'>>,
  files: CutPackFile[],
  sheetCount: number,
  estimate: CutPackEstimate,
  warnings: string[],
  archiveName: string,
): Promise<CutPackResult> {
  const manifest: CutPackManifest = {
    jobId: input.job.id,
    createdAt: input.createdAt,
    units: input.units,
    sheetCount,
    estimate,
    files: files.map((f) => ({
      name: f.name,
      role: f.role,
      contentType: f.contentType,
      bytes: f.data.byteLength,
      sha256: sha256(f.data),
    })),
    warnings,
    ...(input.notices
      ? {
          safety: {
            notices: input.notices.map((n) => ({ id: n.id, version: n.version })),
            localRulesVersion: input.localRulesVersion ?? null,
          },
        }
      : {}),
  };
  const all: CutPackFile[] = [
    ...files,
    {
      name: 'manifest.json',
      role: 'manifest',
      contentType: CONTENT_TYPES.json,
      data: enc.encode(JSON.stringify(manifest, null, 2) + '\n'),
    },
  ];
  if (input.archive) {
    const zip = new JSZip();
    const when = new Date(input.createdAt);
    const date = Number.isNaN(when.getTime()) ? new Date(0) : when;
    for (const f of all) zip.file(f.name, f.data, { date, binary: true });
    const data = await zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE', platform: 'UNIX' });
    all.push({ name: archiveName, role: 'archive', contentType: CONTENT_TYPES.zip, data });
  }
  return { files: all, manifest };
}

function couponFiles(coupon: Coupon, units: CutPackInput['units']): CutPackFile[] {
  return [
    {
      name: 'coupon.dxf',
      role: 'coupon-dxf',
      contentType: CONTENT_TYPES.dxf,
      data: enc.encode(sheetToDxf(coupon.drawing, units)),
    },
    {
      name: 'coupon.svg',
      role: 'coupon-svg',
      contentType: CONTENT_TYPES.svg,
      data: enc.encode(sheetToSvg(coupon.drawing, units)),
    },
  ];
}

/**
 * Builds the cut pack of a prepared job. Throws CutPackError (PACK.DESIGN_INVALID, PACK.LAYOUT_FAILED,
 * PACK.BAD_MACHINE…) when no pack can be made. `onProgress` gets fractions 0…1.
 */
export async function createCutPack(
  input: CutPackInput,
  onProgress?: (fraction: number) => void,
): Promise<CutPackResult> {
  const progress = (f: number) => onProgress?.(Math.min(1, Math.max(0, f)));
  checkInput(input);
  const nameNotes = colourNameNotes(input.colours);
  // From here on every file shows a colour under the name the fonts can print.
  input = { ...input, colours: input.colours.map(printableColourName) };
  progress(0.02);
  const model = buildChecked(input.spec);
  progress(0.15);
  const rule = input.colourRule;
  const layout = layoutModel(model, {
    sheet: input.sheet,
    marginMm: input.marginMm,
    gapMm: input.gapMm,
    colours: { count: input.colours.length, ...(rule ? { rule } : {}) },
    quantity: input.quantity,
  });
  if (!layout.ok) throw new CutPackError('PACK.LAYOUT_FAILED', layout.message, layout.pieces);
  progress(0.35);
  const machine = withCutter(toEstimateMachine(input.machine, input.machine), model.spec.machine);
  let drawn: ReturnType<typeof drawPackSheets>;
  try {
    drawn = drawPackSheets(model, layout, {
      colours: input.colours,
      sheet: input.sheet,
      units: input.units,
      machine,
    });
  } catch (e) {
    if (e instanceof PackSheetsError) throw new CutPackError('PACK.LAYOUT_FAILED', e.message);
    throw e;
  }
  const sheets = drawn.sheets;
  const warnings: string[] = [...nameNotes, ...designWarnings(model), ...drawn.labelWarnings];
  const used = new Set(Object.values(layout.pieceColour));
  const unused = input.colours.filter((_, i) => !used.has(i));
  if (unused.length > 0)
    warnings.push(
      `${unused.length} of the ${input.colours.length} colours get no pieces under the colour rule ` +
        `(${unused.join(', ')}): no sheets of them are needed`,
    );
  // Lengths in the pack's units, as the setup sheet gives them (the design's own findings stay in mm).
  const len = (mm: number) => unitLengthText(mm, input.units);
  const gapNote = gapRaisedNote(model.spec.machine, input.gapMm, layout.gapMm, input.units);
  if (gapNote) warnings.push(gapNote);
  const marginNote = marginRaisedNote(model.spec.machine, input.marginMm, layout.marginMm, input.units);
  if (marginNote) warnings.push(marginNote);
  const bedNote = sheetOverBedNote(input);
  if (bedNote) warnings.push(bedNote);
  if (Math.abs(input.material.thicknessMm - model.spec.stock.thicknessMm) > 0.01) {
    warnings.push(
      `the material is ${len(input.material.thicknessMm)} thick but the design was built for ` +
        `${len(model.spec.stock.thicknessMm)} stock: slot widths follow the design`,
    );
  }
  if (cutterKind(input.machine.kind) !== model.spec.machine.kind) {
    warnings.push(
      `the machine profile is a ${input.machine.kind} but the design is compensated for a ${model.spec.machine.kind}`,
    );
  }
  warnings.push(...sheets.flatMap((s) => s.warnings));
  progress(0.55);
  const coupon = buildCoupon(model, input.units, machine, { bed: bedOf(input.machine) });
  warnings.push(...coupon.warnings);
  const estimate = sheetsEstimate(sheets, machine, input.material.pricePerSheet, input.machine.currency);
  const files: CutPackFile[] = [];
  for (const s of sheets) {
    files.push({
      name: `${s.name}.dxf`,
      role: 'sheet-dxf',
      contentType: CONTENT_TYPES.dxf,
      data: enc.encode(sheetToDxf(s, input.units)),
    });
    files.push({
      name: `${s.name}.svg`,
      role: 'sheet-svg',
      contentType: CONTENT_TYPES.svg,
      data: enc.encode(sheetToSvg(s, input.units)),
    });
  }
  files.push(...couponFiles(coupon, input.units));
  progress(0.7);
  files.push({
    name: 'setup-sheet.pdf',
    role: 'setup-sheet',
    contentType: CONTENT_TYPES.pdf,
    // The spacing the pieces really have (the cutter's width can widen the gap and margin asked for).
    data: await setupSheetPdf({
      input: { ...input, gapMm: layout.gapMm, marginMm: layout.marginMm },
      model,
      sheets,
      estimate,
      coupon,
      warnings,
    }),
  });
  progress(0.82);
  const steps = assemblyStepsOfReport(model.report);
  files.push({
    name: 'assembly-guide.pdf',
    role: 'assembly-guide',
    contentType: CONTENT_TYPES.pdf,
    data: await assemblyGuidePdf({ input, model, pieceColour: layout.pieceColour, steps }),
  });
  progress(0.92);
  const result = await finish(
    input,
    files,
    sheets.length,
    estimate,
    warnings,
    archiveName('cut-pack', input.job),
  );
  progress(1);
  return result;
}

/**
 * The ZIP's name. A job of the workshop (its id a UUID) is named by its title and the id's first eight digits,
 * so that it reads in a downloads folder and two jobs of one design still differ
 * ("cut-pack-felt-honeycomb-ball-0390947a.zip"); the whole UUID used to be cut off partway by the slug's length
 * limit. An id given by hand (the command line's "cli") names it as it is ("cut-pack-cli.zip").
 */
export function archiveName(kind: 'cut-pack' | 'coupon', job: { id: string; title: string }): string {
  const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(job.id);
  const parts = uuid ? [slug(job.title, ''), job.id.slice(0, 8).toLowerCase()] : [slug(job.id, '')];
  return `${[kind, ...parts].filter(Boolean).join('-')}.zip`;
}

/** A note for each colour name the PDF fonts or the engraving font cannot show as given. */
function colourNameNotes(names: readonly string[]): string[] {
  return names.flatMap((name, i) => {
    const printed = printableColourName(name, i);
    const engraved = engravedColourName(name, i);
    if (printed === name && engraved === asciiUpper(name)) return [];
    return [
      `the colour name "${name}" has letters the pack's fonts lack: it is printed as "${printed}" and engraved as "${engraved}"`,
    ];
  });
}

const asciiUpper = (s: string) => s.toUpperCase().replace(/\s+/g, ' ').trim();

/** A note when the stock sheet fits the machine's bed neither way round (else null). */
export function sheetOverBedNote(input: Pick<CutPackInput, 'sheet' | 'machine' | 'units'>): string | null {
  const { widthMm: w, heightMm: h } = input.sheet;
  const { bedWidthMm: bw, bedHeightMm: bh } = input.machine;
  const fits = (a: number, b: number) => a <= bw + 1e-9 && b <= bh + 1e-9;
  if (!(bw > 0 && bh > 0) || fits(w, h) || fits(h, w)) return null;
  const size = (a: number, b: number) => unitSizeText(a, b, input.units).replace(/ x /g, ' × ');
  return (
    `the ${size(w, h)} sheet does not fit the machine's ${size(bw, bh)} bed: ` +
    `cut the stock down to the bed first, or lay out on sheets the bed takes`
  );
}

/** The machine's bed, which the coupon must fit. */
const bedOf = (m: CutPackInput['machine']) => ({ widthMm: m.bedWidthMm, heightMm: m.bedHeightMm });

/**
 * The geometry's machine kind of a profile's kind ("co2-laser" compensates like a "laser"); a geometry kind
 * (the CLI's) as it is.
 */
function cutterKind(kind: string): string {
  return (MACHINE_PROFILE_KINDS as readonly string[]).includes(kind)
    ? geometryMachineKind(kind as MachineProfileKind)
    : kind;
}

/** What the coupon alone needs. */
export type CouponInput = Pick<CutPackInput, 'spec' | 'units' | 'createdAt' | 'machine' | 'job'> & {
  archive?: boolean;
  /** Slot width offsets, mm (default −0.15 … +0.15 in 0.05 steps). */
  offsetsMm?: number[];
};

/** The fit-test coupon alone: coupon.dxf, coupon.svg and manifest.json (and optionally a ZIP). */
export async function createCoupon(
  input: CouponInput,
  onProgress?: (fraction: number) => void,
): Promise<CutPackResult> {
  const model = buildChecked(input.spec);
  onProgress?.(0.4);
  const machine = withCutter(toEstimateMachine(input.machine, input.machine), model.spec.machine);
  const coupon = buildCoupon(model, input.units, machine, {
    bed: bedOf(input.machine),
    ...(input.offsetsMm ? { offsetsMm: input.offsetsMm } : {}),
  });
  const files = couponFiles(coupon, input.units);
  // The coupon is cut from offcuts: machine time only.
  const estimate = sheetsEstimate([coupon.drawing], machine, 0, input.machine.currency);
  const result = await finish(
    { ...input, archive: input.archive ?? false },
    files,
    1,
    estimate,
    coupon.warnings,
    archiveName('coupon', input.job),
  );
  onProgress?.(1);
  return result;
}

/**
 * The design report's warnings for the operator, one line per kind: how many, the code, and the first
 * message (the studio lists them all). Collisions through the stock's thickness come first, as in the report.
 */
function designWarnings(model: BuiltModel): string[] {
  const byCode = new Map<string, { count: number; first: string }>();
  for (const w of model.report.warnings) {
    const e = byCode.get(w.code);
    if (e) e.count++;
    else byCode.set(w.code, { count: 1, first: w.message });
  }
  return [...byCode].map(
    ([code, { count, first }]) =>
      `design: ${code}${count > 1 ? ` (${count} findings; the first)` : ''}: ${first}`,
  );
}
