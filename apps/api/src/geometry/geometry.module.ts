import { Module } from '@nestjs/common';
import { GeometryThreads } from './geometry-threads';

/** One worker-thread pool for the engine's work, shared by designs, job preparation and the cut-pack queue. */
@Module({ providers: [GeometryThreads], exports: [GeometryThreads] })
export class GeometryModule {}
