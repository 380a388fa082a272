import { createCutPack } from '@kerfwright/geometry/pack';
import { type PackBuilder } from './exports.processor';

/** The geometry library builds the pack; the API only stores it. */
export const buildPack: PackBuilder = (input, onProgress) => createCutPack(input, onProgress);
