import { HttpStatus } from '@nestjs/common';
import {
  type DesignPreview,
  type DesignSpec,
  type FieldError,
  type SolidTextFormat,
} from '@kerfwright/contracts';
import { DesignTooHeavyError, SolidError, SpecValidationError } from '@kerfwright/geometry';
import { AppError } from '../common/errors';
import { type GeometryThreads } from '../geometry/geometry-threads';

/** A design's spec field as the request body names it: `spec.piece.sides`. */
const inSpec = (field: string) => `spec.${field}`;

/**
 * 400 DESIGN.INVALID_SPEC with the engine's field errors, each named as the request that carried it names it
 * (`requestField`; by default the body's `spec`).
 */
export function invalidSpec(
  errors: FieldError[],
  requestField: (specField: string) => string = inSpec,
): AppError {
  const details = errors.map((e) => ({ field: requestField(e.field), messages: e.messages }));
  return new AppError(
    HttpStatus.BAD_REQUEST,
    'DESIGN.INVALID_SPEC',
    `Invalid design: ${details.map((d) => `${d.field} (${d.messages.join('; ')})`).join(', ')}`,
    details,
  );
}

export function badSolid(err: SolidError): AppError {
  return new AppError(
    HttpStatus.BAD_REQUEST,
    'DESIGN.INVALID_SOLID',
    `The uploaded solid was refused: ${err.message}`,
    {
      reason: err.code,
    },
  );
}

/** A design refused before it is built: building it would take too long (422, as a deadline's tooSlow). */
export function tooHeavy(err: DesignTooHeavyError): AppError {
  const message = err.message.charAt(0).toUpperCase() + err.message.slice(1);
  return new AppError(HttpStatus.UNPROCESSABLE_ENTITY, 'DESIGN.TOO_HEAVY', message, {
    reason: 'estimate',
    work: err.work,
    limit: err.limit,
  });
}

/**
 * Checks a spec with the geometry engine (in a worker thread) and returns its preview figures. A malformed
 * spec or an unusable solid is a 400; a well-formed design with geometric errors is kept, with `valid: false`.
 */
export async function previewDesign(
  threads: GeometryThreads,
  spec: unknown,
): Promise<{ spec: DesignSpec; preview: DesignPreview }> {
  try {
    return { spec: spec as DesignSpec, preview: await threads.previewDesign(spec) };
  } catch (err) {
    throw engineError(err);
  }
}

/**
 * Validates uploaded solid text with the engine (in a worker thread: the hull of a 20,000-vertex upload takes
 * about half a second): convex hull, merged faces, limits.
 */
export async function checkSolidText(
  threads: GeometryThreads,
  format: SolidTextFormat,
  text: string,
  name: string,
): Promise<{ name: string; vertexCount: number; faceCount: number }> {
  try {
    return await threads.checkSolid(format, text, name);
  } catch (err) {
    throw engineError(err);
  }
}

/** The engine's refusals as API errors (400); anything else is passed on as it is. */
function engineError(err: unknown): unknown {
  if (err instanceof SpecValidationError) return invalidSpec(err.fieldErrors);
  if (err instanceof SolidError) return badSolid(err);
  if (err instanceof DesignTooHeavyError) return tooHeavy(err);
  return err;
}
