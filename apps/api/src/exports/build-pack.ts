import { type GeometryThreads } from '../geometry/geometry-threads';
import { type PackBuilder } from './exports.processor';

/**
 * The geometry library builds the pack, in a worker thread so the process keeps serving requests and renewing
 * its queue locks meanwhile; the API only stores it.
 */
export const buildPack =
  (threads: GeometryThreads): PackBuilder =>
  (input, onProgress) =>
    threads.cutPack(input, onProgress);
