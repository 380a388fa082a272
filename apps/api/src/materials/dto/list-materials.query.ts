import { ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsBoolean, IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import {
  type ListMaterialsQuery,
  MATERIAL_FAMILIES,
  MATERIAL_SORT_FIELDS,
  type MaterialFamily,
  type MaterialSortField,
} from '@kerfwright/contracts';
import { PageQueryDto } from '../../common/paging';

const SORTS = [...MATERIAL_SORT_FIELDS, ...MATERIAL_SORT_FIELDS.map((f) => `-${f}` as const)];

export class ListMaterialsQueryDto extends PageQueryDto implements ListMaterialsQuery {
  @ApiPropertyOptional({ enum: SORTS, default: 'name', description: "A field; prefix '-' for descending" })
  @IsOptional()
  @IsIn(SORTS)
  sort?: MaterialSortField | `-${MaterialSortField}`;

  @ApiPropertyOptional({ enum: MATERIAL_FAMILIES })
  @IsOptional()
  @IsIn(MATERIAL_FAMILIES)
  family?: MaterialFamily;

  @ApiPropertyOptional({ maxLength: 100, description: 'Searched in the name and notes' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;

  @ApiPropertyOptional({ type: Boolean })
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  laserAllowed?: boolean;
}
