import { ApiProperty, PartialType } from '@nestjs/swagger';
import { type UpdateMaterialRequest } from '@kerfwright/contracts';
import { CreateMaterialDto } from './create-material.dto';
import { IsRowVersion } from '../../common/validation/row-version';

/** Fields to change, plus the version the client read (a stale version is refused with 409). */
export class UpdateMaterialDto
  extends PartialType(CreateMaterialDto, { skipNullProperties: false })
  implements UpdateMaterialRequest
{
  @ApiProperty({ minimum: 1, description: 'The version the client read (optimistic locking)' })
  @IsRowVersion()
  version: number;
}
