import { buildWithLayout } from '../layout/build-with-layout';
import { SolidError } from '../solids/polyhedron';
import { SpecValidationError } from '../spec/validate-spec';
import { pieceToDxf } from '../writers/dxf';
import { pieceToSvg } from '../writers/svg';
import { type CliRun, UsageError, parseArgs, removeStaleOutputs } from './command';
import { readJsonArg } from './read-json';

/**
 * `build SPEC.json --out DIR [--json]`: builds a design (with its layout when the spec gives stock.sheet,
 * and fit scales searched: buildWithLayout), writes DIR/report.json and, when the design has no errors,
 * one DXF and one SVG per piece (DIR/P1.dxf, DIR/P1.svg, …). Exit codes: 0 built; 1 the design
 * has errors (report written, no cut files); 2 unreadable or invalid spec or solid (nothing written).
 */
export const runBuild: CliRun = (args, io, usage) => {
  const { positional, options } = parseArgs(args, ['out'], ['json']);
  const [specPath, extra] = positional;
  if (!specPath || extra !== undefined) throw new UsageError(`usage: ${usage}`);
  const outDir = options.get('out');
  const json = options.get('json') === true;
  if (typeof outDir !== 'string' && !json) throw new UsageError('give --out DIR, --json or both');

  const input = readJsonArg(io, specPath);
  if (!input) return 2;
  let model;
  try {
    model = buildWithLayout(input.value).model;
  } catch (e) {
    if (e instanceof SpecValidationError) io.err(`error: ${e.message}`);
    else if (e instanceof SolidError) io.err(`error: bad solid (${e.code}): ${e.message}`);
    else throw e;
    return 2;
  }
  const { report } = model;
  const reportText = JSON.stringify(report, null, 2) + '\n';
  if (typeof outDir === 'string') {
    io.makeDir(outDir);
    // Piece files of an earlier build that this one does not write (all of them when this design has errors)
    // are removed, so no one cuts them beside a report that refuses the design.
    const written = new Set(
      report.errors.length === 0 ? model.pieces.flatMap((p) => [`${p.id}.dxf`, `${p.id}.svg`]) : [],
    );
    removeStaleOutputs(io, outDir, /^P\d+\.(dxf|svg)$/, written);
    io.writeText(io.joinPath(outDir, 'report.json'), reportText);
    if (report.errors.length === 0) {
      for (const p of model.pieces) {
        io.writeText(io.joinPath(outDir, `${p.id}.dxf`), pieceToDxf(p));
        io.writeText(io.joinPath(outDir, `${p.id}.svg`), pieceToSvg(p));
      }
    }
  }
  if (json) io.out(reportText);
  if (report.errors.length > 0) {
    // A fit scale that found no size says why in one sentence: that leads, before the errors of the last size tried.
    const first = report.errors.find((e) => e.code === 'SCALE.NO_FIT') ?? report.errors[0];
    io.err(
      `error: the design has ${report.errors.length} error(s), no cut files written; first: ` +
        `${first?.code}: ${first?.message}`,
    );
    return 1;
  }
  return 0;
};
