import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import {
  type ListMachineProfilesQuery,
  MACHINE_PROFILE_KINDS,
  type MachineProfileKind,
  PROFILE_SORT_FIELDS,
  PROFILE_VERSION_STATES,
  type ProfileSortField,
  type ProfileVersionState,
} from '@kerfwright/contracts';
import { MAX_PAGE, PageQueryDto } from '../../common/paging';
import { IsId } from '../../common/validation/id';

const SORTS = [...PROFILE_SORT_FIELDS, ...PROFILE_SORT_FIELDS.map((f) => `-${f}` as const)];

export class ListMachineProfilesQueryDto extends PageQueryDto implements ListMachineProfilesQuery {
  @ApiPropertyOptional({ enum: MACHINE_PROFILE_KINDS })
  @IsOptional()
  @IsIn(MACHINE_PROFILE_KINDS)
  kind?: MachineProfileKind;

  @ApiPropertyOptional({ enum: PROFILE_VERSION_STATES, description: 'State of the latest version' })
  @IsOptional()
  @IsIn(PROFILE_VERSION_STATES)
  state?: ProfileVersionState;

  @ApiPropertyOptional({ maxLength: 100, description: 'Searched in the name' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;

  @ApiPropertyOptional({ enum: SORTS, default: 'name', description: "A field; prefix '-' for descending" })
  @IsOptional()
  @IsIn(SORTS)
  sort?: ProfileSortField | `-${ProfileSortField}`;
}

export class ListKerfRecordsQueryDto {
  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsId()
  materialId?: string;

  @ApiPropertyOptional({ minimum: 1, maximum: MAX_PAGE, default: 1 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAX_PAGE)
  page?: number;

  @ApiPropertyOptional({ minimum: 1, maximum: 1000, default: 200 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(1000)
  pageSize?: number;
}
