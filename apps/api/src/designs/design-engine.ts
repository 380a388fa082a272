import { HttpStatus } from '@nestjs/common';
import {
  type DesignPreview,
  type DesignSpec,
  type FieldError,
  type SolidTextFormat,
} from '@kerfwright/contracts';
import {
  buildModel,
  designPreview,
  parseSolidText,
  SolidError,
  SpecValidationError,
  validateSpec,
} from '@kerfwright/geometry';
import { AppError } from '../common/errors';

/** Field errors of the engine's spec check, named from the request body (`spec.piece.sides`). */
function specFieldErrors(errors: FieldError[]): FieldError[] {
  return errors.map((e) => ({ field: `spec.${e.field}`, messages: e.messages }));
}

export function invalidSpec(errors: FieldError[]): AppError {
  const details = specFieldErrors(errors);
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

/**
 * Checks a spec with the geometry engine and returns its preview figures. A malformed spec or an unusable
 * solid is a 400; a well-formed design with geometric errors is kept, with `valid: false`.
 */
export function previewDesign(spec: unknown): { spec: DesignSpec; preview: DesignPreview } {
  const checked = validateSpec(spec);
  if (!checked.ok) throw invalidSpec(checked.errors);
  try {
    const { report } = buildModel(spec);
    return { spec: spec as DesignSpec, preview: designPreview(report) };
  } catch (err) {
    if (err instanceof SpecValidationError) throw invalidSpec(err.fieldErrors);
    if (err instanceof SolidError) throw badSolid(err);
    throw err;
  }
}

/** Validates uploaded solid text with the engine: convex hull, merged faces, limits. */
export function checkSolidText(format: SolidTextFormat, text: string, name: string) {
  try {
    const solid = parseSolidText(format, text, name);
    return { name: solid.name, vertexCount: solid.vertices.length, faceCount: solid.faces.length };
  } catch (err) {
    if (err instanceof SolidError) throw badSolid(err);
    throw err;
  }
}
