import { ApiProperty } from '@nestjs/swagger';
import { type HealthView } from '@kerfwright/contracts';

/** OpenAPI shape of the health answer (the type itself lives in @kerfwright/contracts). */
export class HealthResponse implements HealthView {
  @ApiProperty({ enum: ['ok', 'degraded'] }) status: 'ok' | 'degraded';
  @ApiProperty({ enum: ['up', 'down'], description: 'PostgreSQL' }) database: 'up' | 'down';
  @ApiProperty({ enum: ['up', 'down'] }) redis: 'up' | 'down';
  @ApiProperty() version: string;
}
