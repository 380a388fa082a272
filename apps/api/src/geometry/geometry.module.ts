import { Module } from '@nestjs/common';
import { GeometryThreads } from './geometry-threads';

/** One worker-thread pool for the engine's heavy work, shared by job preparation and the cut-pack queue. */
@Module({ providers: [GeometryThreads], exports: [GeometryThreads] })
export class GeometryModule {}
