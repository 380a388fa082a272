/* eslint-disable @typescript-eslint/no-require-imports -- lazy loading, see below */
import { type CliCommand, type CliRun } from './command';

/** A table entry whose module is required on first run. */
function lazy(name: string, summary: string, usage: string, load: () => CliRun): CliCommand {
  return { name, summary, usage, run: (args, io) => load()(args, io, usage) };
}

/**
 * The subcommand table. Each command's module is required only when the command runs: loading the cut-pack
 * writers (PDF, ZIP) and the whole engine cost every `nest` call 0.3 s. To add a subcommand, export a CliRun
 * from its own file and list it here.
 */
export const COMMANDS: readonly CliCommand[] = [
  lazy(
    'build',
    'build a design spec into report.json and a DXF and an SVG per piece',
    'build SPEC.json --out DIR [--json]',
    () => (require('./build-command') as typeof import('./build-command')).runBuild,
  ),
  lazy(
    'nest',
    'nest part outlines onto sheets and print the placements as JSON',
    'nest PARTS.json',
    () => (require('./nest-command') as typeof import('./nest-command')).runNest,
  ),
  lazy(
    'pack',
    'write the cut pack of a design spec: sheets, coupon, setup sheet, assembly guide, manifest',
    'pack SPEC.json --out DIR [--units in] [--zip] [--json]',
    () => (require('./pack-command') as typeof import('./pack-command')).runPack,
  ),
  lazy(
    'coupon',
    'write the fit-test coupon of a design spec (DXF, SVG, manifest)',
    'coupon SPEC.json --out DIR [--units in] [--json]',
    () => (require('./pack-command') as typeof import('./pack-command')).runCoupon,
  ),
];
