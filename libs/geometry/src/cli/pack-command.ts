import type { CutPackResult } from '@kerfwright/contracts';
import { CutPackError } from '../pack/pack';
import { type PackCommandOptions, runCouponCommand, runPackCommand } from '../pack/cli-commands';
import { type CliIo, type CliRun, UsageError, parseArgs, removeStaleOutputs } from './command';
import { readJsonArg } from './read-json';

/** Exit code for a pack failure: 2 for a spec that cannot be read as a design, 1 for a design or layout that fails. */
function exitCodeOf(e: CutPackError): number {
  return e.code === 'PACK.DESIGN_INVALID' || e.code === 'PACK.LAYOUT_FAILED' ? 1 : 2;
}

/** Names of the files pack and coupon write: an earlier run's that this one does not replace are removed. */
const PACK_OUTPUTS =
  /^(sheet-\d+(-[^/\\]*)?\.(dxf|svg)|coupon\.(dxf|svg)|setup-sheet\.pdf|assembly-guide\.pdf|manifest\.json|cut-pack-cli\.zip)$/;

/** Files only a whole pack writes: a folder holding one is a pack's. */
const PACK_ONLY = /^(sheet-\d+(-[^/\\]*)?\.(dxf|svg)|setup-sheet\.pdf|assembly-guide\.pdf)$/;

function writePack(io: CliIo, outDir: string, result: CutPackResult, wholePack: boolean): void {
  io.makeDir(outDir);
  // Sheets of an earlier, larger pack left beside this one's could be cut by mistake. (A coupon written
  // alone into a pack's folder leaves the pack as it is.)
  if (wholePack) removeStaleOutputs(io, outDir, PACK_OUTPUTS, new Set(result.files.map((f) => f.name)));
  for (const f of result.files) io.writeBytes(io.joinPath(outDir, f.name), f.data);
}

function summaryLine(result: CutPackResult, outDir: string): string {
  const m = result.manifest;
  const e = m.estimate;
  return (
    `wrote ${result.files.length} files to ${outDir}: ${m.sheetCount} sheet${m.sheetCount === 1 ? '' : 's'}, ` +
    `cut ${e.cutLengthMm} mm, ${e.pierces} pierces, about ${e.minutes} min` +
    (m.warnings?.length
      ? `; ${m.warnings.length} warning${m.warnings.length === 1 ? '' : 's'}: ${m.warnings.join('; ')}`
      : '')
  );
}

async function runPackLike(
  args: readonly string[],
  io: CliIo,
  usage: string,
  make: (spec: unknown, options: PackCommandOptions) => Promise<CutPackResult>,
  switches: readonly string[],
  /** A whole pack replaces an earlier one in the folder; a coupon alone leaves the folder's pack as it is. */
  wholePack: boolean,
): Promise<number> {
  const { positional, options } = parseArgs(args, ['out', 'units'], ['json', ...switches]);
  const [specPath, extra] = positional;
  const outDir = options.get('out');
  if (!specPath || extra !== undefined || typeof outDir !== 'string') throw new UsageError(`usage: ${usage}`);
  const units = options.get('units') ?? 'mm';
  if (units !== 'mm' && units !== 'in') throw new UsageError('--units must be "mm" or "in"');
  if (!wholePack && (io.listFiles?.(outDir) ?? []).some((n) => PACK_ONLY.test(n))) {
    // The coupon's manifest and coupon files would replace the pack's, leaving the pack's manifest wrong.
    io.err(
      `error: ${outDir} holds a cut pack, which already has its coupon: write the coupon alone to another folder`,
    );
    return 2;
  }
  const input = readJsonArg(io, specPath);
  if (!input) return 2;
  let result: CutPackResult;
  try {
    result = await make(input.value, { units, archive: options.get('zip') === true });
  } catch (e) {
    if (!(e instanceof CutPackError)) throw e;
    io.err(`error: ${e.code}: ${e.message}`.replace(/\s*\n\s*/g, ' '));
    return exitCodeOf(e);
  }
  writePack(io, outDir, result, wholePack);
  if (options.get('json') === true) io.out(JSON.stringify(result.manifest, null, 2));
  else io.out(summaryLine(result, outDir));
  return 0;
}

/**
 * `pack SPEC.json --out DIR [--units in] [--zip] [--json]`: the whole cut pack (sheets as DXF and SVG,
 * coupon, setup sheet and assembly guide PDFs, manifest; --zip adds one ZIP of all). The spec may carry
 * `stock.sheet`, `stock.marginMm`, `stock.gapMm` and `colours`; machine settings not in the spec come from
 * CLI_DEFAULT_MACHINE. Prints a summary line, or the manifest with --json. Exit codes: 0 written; 1 the
 * design has errors or does not lay out (nothing written); 2 unreadable JSON or invalid spec (nothing
 * written).
 */
export const runPack: CliRun = (args, io, usage) =>
  runPackLike(args, io, usage, runPackCommand, ['zip'], true);

/** `coupon SPEC.json --out DIR [--units in] [--json]`: the fit-test coupon alone (exit codes as pack). */
export const runCoupon: CliRun = (args, io, usage) =>
  runPackLike(args, io, usage, runCouponCommand, [], false);
