/**
 * `@kerfwright/geometry/worker` — the engine's heavy tasks for worker threads. A server runs them in a pool
 * (the API uses piscina with this file) so its event loop keeps answering requests while a job is fitted to
 * its stock, laid out or packed, or an uploaded solid is checked: a fit-to-sheets search takes 0.5–1.5 s, a
 * cut pack about as long, and the hull of a 20,000-vertex upload about 0.5 s.
 *
 * Each export is one task: plain data in, plain data out (structured clone). The engine's own errors come
 * back as values (ThreadError) and are rebuilt on the calling side by reviveThreadError, because an error
 * thrown across threads loses its class and its fields (code, fieldErrors).
 */
import type { MessagePort } from 'node:worker_threads';
import type {
  CutPackInput,
  CutPackResult,
  DesignIssue,
  DesignPreview,
  DesignSpec,
  DesignSpecInput,
  FieldError,
  JobPreparation,
  SolidTextFormat,
} from '@kerfwright/contracts';
import { buildModel, resolveSolid } from '../build';
import { designPreview } from '../layout/design-preview';
import { buildWithLayout } from '../layout/build-with-layout';
import { prepareCut } from '../layout/prepare-cut';
import { type LayoutOptions } from '../layout/plan-layout';
import { CutPackError, createCutPack } from '../pack/pack';
import { type PreparationEstimateOptions, preparationEstimate } from '../pack/pack-sheets';
import { parseSolidText } from '../solids/parse';
import { SolidError } from '../solids/polyhedron';
import { type ResolvedSpec, SpecValidationError, validateSpec } from '../spec/validate-spec';
import { assertDesignWork, DesignTooHeavyError } from '../spec/workload';

/** An engine error as data. */
export interface ThreadError {
  name: string;
  message: string;
  code?: string;
  fieldErrors?: FieldError[];
  details?: string[];
  /** DesignTooHeavyError: the design's work and the limit. */
  work?: number;
  limit?: number;
}

export type ThreadOutcome<T> = { ok: true; value: T } | { ok: false; error: ThreadError };

/** Rebuilds the engine error a task returned as data (a plain Error for anything unexpected). */
export function reviveThreadError(e: ThreadError): Error {
  if (e.name === 'SpecValidationError') return new SpecValidationError(e.fieldErrors ?? []);
  if (e.name === 'SolidError') return new SolidError(e.code ?? 'SOLID.INVALID', e.message);
  if (e.name === 'CutPackError') return new CutPackError(e.code ?? 'PACK.FAILED', e.message, e.details);
  if (e.name === 'DesignTooHeavyError') return new DesignTooHeavyError(e.work ?? 0, e.limit ?? 0, e.message);
  return new Error(e.message);
}

function asThreadError(err: unknown): ThreadError | null {
  if (err instanceof SpecValidationError)
    return { name: 'SpecValidationError', message: err.message, fieldErrors: err.fieldErrors };
  if (err instanceof SolidError) return { name: 'SolidError', message: err.message, code: err.code };
  if (err instanceof CutPackError)
    return { name: 'CutPackError', message: err.message, code: err.code, details: err.details };
  if (err instanceof DesignTooHeavyError)
    return { name: 'DesignTooHeavyError', message: err.message, work: err.work, limit: err.limit };
  return null;
}

/**
 * What every task may carry besides its data: a port on which the task says it has started, so that the
 * caller can give it a deadline of its own running time (not of its wait in the pool's queue).
 */
export interface TaskClock {
  started?: MessagePort;
}

/** Refuses at once a design too heavy to build in time (see assertDesignWork). */
function assertWorkable(spec: Pick<ResolvedSpec, 'solid'> & { piece: { sides: number } }): void {
  assertDesignWork(spec.piece.sides, resolveSolid(spec as ResolvedSpec).faces.length);
}

/** Runs fn; engine errors become values, anything else (a bug) is thrown as it is. */
async function settle<T>(clock: TaskClock, fn: () => T | Promise<T>): Promise<ThreadOutcome<T>> {
  clock.started?.postMessage('started');
  try {
    return { ok: true, value: await fn() };
  } catch (err) {
    const known = asThreadError(err);
    if (known) return { ok: false, error: known };
    throw err;
  }
}

export interface PrepareJobTask extends TaskClock {
  /** The design as it will be cut: real stock thickness and machine, the scale asked for. */
  input: DesignSpecInput;
  /**
   * For a fit scale (fitSheets, fitBed): the same design carrying the chosen sheet, margin, gap and colours,
   * for the search of the largest size. Null for a fixed scale.
   */
  fitSearch: DesignSpecInput | null;
  cut: LayoutOptions;
  /**
   * The machine's speeds and rate, the colour names and the sheet's price, for the time and cost of cutting
   * the sheets as the cut pack draws them. A null price: the sheet size has none (material cost unknown).
   */
  estimate?: Omit<PreparationEstimateOptions, 'sheet'>;
}

export type PreparedJob =
  /** The fit search found no size without design errors. */
  | { stage: 'fit'; errors: DesignIssue[] }
  /** The design at its final size: its errors, or the layout failure, or the preparation summary. */
  | {
      stage: 'cut';
      spec: DesignSpec;
      errors: DesignIssue[];
      layoutFailure: { code: string; message: string; pieces: string[] } | null;
      summary: JobPreparation | null;
    };

/**
 * Fits the design to its stock when the scale asks for it (fixing the diameter found), then builds and lays it
 * out for cutting (prepareCut): what a job keeps from its preparation.
 */
export function prepareJob(task: PrepareJobTask): Promise<ThreadOutcome<PreparedJob>> {
  return settle(task, (): PreparedJob => {
    let spec = task.input as DesignSpec;
    assertWorkable(spec);
    if (task.fitSearch) {
      const { model, resolvedSpec } = buildWithLayout(task.fitSearch);
      if (model.report.errors.length > 0) return { stage: 'fit', errors: model.report.errors };
      spec = { ...spec, scale: resolvedSpec.scale };
    }
    const { model, layout, summary } = prepareCut(spec, task.cut);
    if (summary && layout.ok && task.estimate) {
      summary.estimate = preparationEstimate(model, layout, { ...task.estimate, sheet: task.cut.sheet });
    }
    return {
      stage: 'cut',
      spec,
      errors: model.report.errors,
      layoutFailure: layout.ok ? null : { code: layout.code, message: layout.message, pieces: layout.pieces },
      summary,
    };
  });
}

export interface CutPackTask extends TaskClock {
  input: CutPackInput;
  /** Receives the build's progress as fractions 0…1 (transferred with the task). */
  progress?: MessagePort;
}

/** Builds a cut pack (createCutPack) and reports progress on the task's port. */
export function cutPack(task: CutPackTask): Promise<ThreadOutcome<CutPackResult>> {
  return settle(task, () => createCutPack(task.input, (f) => task.progress?.postMessage(f))).finally(() =>
    task.progress?.close(),
  );
}

/**
 * Checks a design spec and builds it: the preview figures a design keeps (a spec that does not validate is a
 * SpecValidationError, an unusable solid a SolidError; geometric errors are in the preview, valid false). A
 * fit-to-sheets design is built at the size the search finds.
 */
export function previewDesign(task: { spec: unknown } & TaskClock): Promise<ThreadOutcome<DesignPreview>> {
  return settle(task, () => {
    const checked = validateSpec(task.spec);
    if (!checked.ok) throw new SpecValidationError(checked.errors);
    assertWorkable(checked.spec);
    // Fit to sheets: the figures of the size found, not of the search's upper bound (buildModel's).
    const model =
      checked.spec.scale.by === 'fitSheets' ? buildWithLayout(task.spec).model : buildModel(task.spec);
    return designPreview(model.report);
  });
}

/** Parses uploaded solid text (hull, merged faces, limits) and returns what was found. */
export function checkSolid(
  task: {
    format: SolidTextFormat;
    text: string;
    name: string;
  } & TaskClock,
): Promise<ThreadOutcome<{ name: string; vertexCount: number; faceCount: number }>> {
  return settle(task, () => {
    const solid = parseSolidText(task.format, task.text, task.name);
    return { name: solid.name, vertexCount: solid.vertices.length, faceCount: solid.faces.length };
  });
}
