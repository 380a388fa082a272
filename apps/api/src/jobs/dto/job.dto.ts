import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsPositive,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  COLOUR_RULES,
  type ColourRuleName,
  JOB_STATES,
  type JobState,
  SCALE_BY,
  type ScaleBy,
} from '@kerfwright/contracts';
import { PageQueryDto } from '../../common/paging';

export class CreateJobDto {
  @ApiProperty() @IsUUID() designId: string;
  @ApiPropertyOptional({ minimum: 1, maximum: 100, default: 1 })
  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(100)
  quantity?: number;
  @ApiPropertyOptional({ maxLength: 2000 }) @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

/** Every action names the job version the caller read, so concurrent actions cannot both win. */
export class JobActionDto {
  @ApiProperty({ description: 'The job version you read; a stale one gets 409' })
  @IsInt()
  @Min(1)
  version: number;
}

export class SheetSizeDto {
  @ApiProperty() @IsNumber() @IsPositive() @Max(5000) widthMm: number;
  @ApiProperty() @IsNumber() @IsPositive() @Max(5000) heightMm: number;
}

export class ScaleDto {
  @ApiProperty({ enum: SCALE_BY }) @IsIn(SCALE_BY) by: ScaleBy;
  @ApiProperty() @IsNumber() @IsPositive() @Max(10000) mm: number;
}

export class PrepareJobDto extends JobActionDto {
  @ApiProperty() @IsUUID() materialId: string;
  @ApiProperty({ description: 'An approved machine profile version' }) @IsUUID() profileVersionId: string;
  @ApiProperty({
    type: [String],
    description: 'Colours of the material to cut from (one sheet set per colour)',
  })
  @IsArray()
  @ArrayMaxSize(12)
  @IsString({ each: true })
  @MinLength(1, { each: true })
  @MaxLength(60, { each: true })
  colours: string[];
  @ApiPropertyOptional({
    type: SheetSizeDto,
    description: 'Stock sheet; defaults to the material’s first sheet size',
  })
  @IsOptional()
  @ValidateNested()
  @Type(() => SheetSizeDto)
  sheet?: SheetSizeDto;
  @ApiPropertyOptional({ type: ScaleDto, description: 'Overrides the design’s scale' })
  @IsOptional()
  @ValidateNested()
  @Type(() => ScaleDto)
  scale?: ScaleDto;
  @ApiPropertyOptional({
    enum: COLOUR_RULES,
    description: 'How pieces are shared among the colours (default neighbour-distinct)',
  })
  @IsOptional()
  @IsIn(COLOUR_RULES)
  colourRule?: ColourRuleName;
  @ApiPropertyOptional({ minimum: 0, maximum: 100 })
  @IsOptional()
  @IsNumber()
  @Min(0)
  @Max(100)
  marginMm?: number;
  @ApiPropertyOptional({ minimum: 0, maximum: 100 })
  @IsOptional()
  @IsNumber()
  @Min(0)
  @Max(100)
  gapMm?: number;
}

export class ReturnJobDto extends JobActionDto {
  @ApiProperty({ maxLength: 2000 }) @IsString() @MinLength(3) @MaxLength(2000) reason: string;
}

export class RecordCutDto extends JobActionDto {
  @ApiProperty({ description: 'Machine time actually taken, minutes' })
  @IsNumber()
  @Min(0)
  @Max(10000)
  actualMinutes: number;
  @ApiProperty() @IsInt() @Min(0) @Max(1000) sheetsUsed: number;
  @ApiPropertyOptional({ description: 'Kerf measured on the cut, mm; also kept as a kerf record' })
  @IsOptional()
  @IsNumber()
  @IsPositive()
  @Max(2)
  measuredKerfMm?: number;
}

export const JOB_SORT_FIELDS = ['createdAt', 'updatedAt', 'state'] as const;

export class ListJobsQuery extends PageQueryDto {
  @ApiPropertyOptional({ enum: [...JOB_SORT_FIELDS, ...JOB_SORT_FIELDS.map((f) => `-${f}`)] })
  @IsOptional()
  @IsIn([...JOB_SORT_FIELDS, ...JOB_SORT_FIELDS.map((f) => `-${f}`)])
  sort?: string;
  @ApiPropertyOptional({ enum: JOB_STATES }) @IsOptional() @IsIn(JOB_STATES) state?: JobState;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(100) q?: string;
  @ApiPropertyOptional({ enum: ['mine', 'all'] }) @IsOptional() @IsIn(['mine', 'all']) scope?: 'mine' | 'all';
}
