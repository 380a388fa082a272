import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsNumber, IsString, Max, MaxLength, Min } from 'class-validator';
import { type CreateKerfRecordRequest, MACHINE_PROFILE_LIMITS as L } from '@kerfwright/contracts';
import { FINITE, OptionalNotNull } from '../../common/validation/optional';
import { IsId } from '../../common/validation/id';

export class CreateKerfRecordDto implements CreateKerfRecordRequest {
  @ApiProperty({ format: 'uuid' })
  @IsId()
  materialId: string;

  @ApiProperty({
    minimum: L.kerfMm.min,
    maximum: L.toolDiameterMm.max,
    description: `Measured kerf: ${L.kerfMm.min}–${L.kerfMm.max} mm on lasers and blade cutters; on a router the measured cut width (${L.toolDiameterMm.min}–${L.toolDiameterMm.max} mm)`,
  })
  @IsNumber(FINITE)
  @Min(L.kerfMm.min)
  @Max(L.toolDiameterMm.max)
  kerfMm: number;

  @ApiPropertyOptional({ format: 'uuid', description: 'The job whose cut was measured' })
  @OptionalNotNull()
  @IsId()
  jobId?: string;

  @ApiPropertyOptional({ maxLength: 2000 })
  @OptionalNotNull()
  @IsString()
  @MaxLength(2000)
  notes?: string;
}
