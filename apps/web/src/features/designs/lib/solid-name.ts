import { type UploadedSolid } from '@kerfwright/contracts';
import { listSolids } from '@kerfwright/geometry';

const CATALOGUE_NAMES = new Map(listSolids().map((s) => [s.id, s.name]));

/**
 * A design's base solid as people read it: a catalogue solid by its name ("rhombic-dodecahedron" →
 * "Rhombic dodecahedron"), an uploaded solid by its own name.
 */
export function solidName(solid: string | UploadedSolid): string {
  if (typeof solid !== 'string') return solid.name ?? `uploaded ${solid.format.toUpperCase()} file`;
  return CATALOGUE_NAMES.get(solid) ?? solid;
}
