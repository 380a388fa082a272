import { ApiProperty, PartialType } from '@nestjs/swagger';
import { IsInt, Min } from 'class-validator';
import { type UpdateMaterialRequest } from '@kerfwright/contracts';
import { CreateMaterialDto } from './create-material.dto';

/** Fields to change, plus the version the client read (a stale version is refused with 409). */
export class UpdateMaterialDto
  extends PartialType(CreateMaterialDto, { skipNullProperties: false })
  implements UpdateMaterialRequest
{
  @ApiProperty({ minimum: 1, description: 'The version the client read (optimistic locking)' })
  @IsInt()
  @Min(1)
  version: number;
}
