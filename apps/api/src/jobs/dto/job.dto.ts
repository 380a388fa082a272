import { ApiProperty, ApiPropertyOptional, PickType } from '@nestjs/swagger';
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
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateBy,
  ValidateNested,
  type ValidationArguments,
} from 'class-validator';
import {
  type AnyScaleSpec,
  COLOUR_RULES,
  type ColourRuleName,
  FIT_SCALE_BY,
  type FitScaleBy,
  JOB_STATES,
  type JobState,
  MACHINE_PROFILE_LIMITS,
  SCALE_BY,
  type ScaleBy,
} from '@kerfwright/contracts';
import { MAX_FIT_SHEETS } from '@kerfwright/geometry';
import { PageQueryDto } from '../../common/paging';
import { IsReason } from '../../common/text';
import { OptionalNotNull } from '../../common/validation/optional';
import { IsRowVersion } from '../../common/validation/row-version';
import { IsId } from '../../common/validation/id';

export class CreateJobDto {
  @ApiProperty() @IsId() designId: string;
  @ApiPropertyOptional({ minimum: 1, maximum: 100, default: 1 })
  @OptionalNotNull()
  @IsInt()
  @Min(1)
  @Max(100)
  quantity?: number;
  @ApiPropertyOptional({ maxLength: 2000 }) @OptionalNotNull() @IsString() @MaxLength(2000) notes?: string;
}

/** Every action names the job version the caller read, so concurrent actions cannot both win. */
export class JobActionDto {
  @ApiProperty({ description: 'The job version you read; a stale one gets 409' })
  @IsRowVersion()
  version: number;
}

/** Changing a draft's request: how many copies, and the requester's notes (each optional, as at creation). */
export class UpdateJobDto extends PickType(CreateJobDto, ['quantity', 'notes'] as const) {
  @ApiProperty({ description: 'The job version you read; a stale one gets 409' })
  @IsRowVersion()
  version: number;
}

/** Queueing a cut pack: the job version read, optional (a job action that leaves it out is not compared). */
export class RequestExportDto {
  @ApiPropertyOptional({
    description: 'The job version you read; a stale one gets 409 (left out: not compared)',
  })
  @OptionalNotNull()
  @IsRowVersion()
  version?: number;
}

export class SheetSizeDto {
  @ApiProperty() @IsNumber() @IsPositive() @Max(5000) widthMm: number;
  @ApiProperty() @IsNumber() @IsPositive() @Max(5000) heightMm: number;
}

const ANY_SCALE_BY = [...SCALE_BY, ...FIT_SCALE_BY] as const;

/** Which fields each kind of scale takes: a fixed scale `mm`, fitSheets `sheets`, fitBed neither. */
function fieldsOf(by: unknown): { mm: boolean; sheets: boolean } {
  return { mm: (SCALE_BY as readonly unknown[]).includes(by), sheets: by === 'fitSheets' };
}

/** Checks on `by` that `mm` and `sheets` are given exactly when that kind of scale takes them. */
const MatchingScaleFields = () =>
  ValidateBy({
    name: 'matchingScaleFields',
    validator: {
      validate: (by: unknown, args?: ValidationArguments) => {
        const o = (args?.object ?? {}) as { mm?: unknown; sheets?: unknown };
        const want = fieldsOf(by);
        return want.mm === (o.mm !== undefined) && want.sheets === (o.sheets !== undefined);
      },
      defaultMessage: (args?: ValidationArguments) => {
        const want = fieldsOf(args?.value);
        if (want.mm)
          return 'a fixed scale (planeDistance, diameter, pieceCircumradius) takes mm and no sheets';
        if (want.sheets) return 'scale.by "fitSheets" takes sheets and no mm';
        return 'scale.by "fitBed" takes neither mm nor sheets';
      },
    },
  });

/**
 * The size of the model, as in the design spec and the geometry CLI: a fixed scale `{ by, mm }`, the
 * largest model on N sheets `{ by: "fitSheets", sheets }`, or the largest that fits the machine's bed
 * `{ by: "fitBed" }`.
 */
export class ScaleDto {
  @ApiProperty({ enum: ANY_SCALE_BY })
  @IsIn(ANY_SCALE_BY)
  @MatchingScaleFields()
  by: ScaleBy | FitScaleBy;
  @ApiPropertyOptional({ description: 'Fixed scales only: the size in mm' })
  @OptionalNotNull()
  @IsNumber()
  @IsPositive()
  @Max(10000)
  mm?: number;
  @ApiPropertyOptional({ minimum: 1, maximum: MAX_FIT_SHEETS, description: 'fitSheets only: most sheets' })
  @OptionalNotNull()
  @IsInt()
  @Min(1)
  @Max(MAX_FIT_SHEETS)
  sheets?: number;
}

/** The scale as the geometry library takes it (the DTO has been validated). */
export function toScaleSpec(dto: ScaleDto): AnyScaleSpec {
  if (dto.by === 'fitSheets') return { by: 'fitSheets', sheets: dto.sheets! };
  if (dto.by === 'fitBed') return { by: 'fitBed' };
  return { by: dto.by, mm: dto.mm! };
}

export class PrepareJobDto extends JobActionDto {
  @ApiProperty() @IsId() materialId: string;
  @ApiProperty({ description: 'An approved machine profile version' }) @IsId() profileVersionId: string;
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
  @OptionalNotNull()
  @ValidateNested()
  @Type(() => SheetSizeDto)
  sheet?: SheetSizeDto;
  @ApiPropertyOptional({ type: ScaleDto, description: 'Overrides the design’s scale' })
  @OptionalNotNull()
  @ValidateNested()
  @Type(() => ScaleDto)
  scale?: ScaleDto;
  @ApiPropertyOptional({
    enum: COLOUR_RULES,
    description: 'How pieces are shared among the colours (default neighbour-distinct)',
  })
  @OptionalNotNull()
  @IsIn(COLOUR_RULES)
  colourRule?: ColourRuleName;
  @ApiPropertyOptional({ minimum: 0, maximum: 100 })
  @OptionalNotNull()
  @IsNumber()
  @Min(0)
  @Max(100)
  marginMm?: number;
  @ApiPropertyOptional({ minimum: 0, maximum: 100 })
  @OptionalNotNull()
  @IsNumber()
  @Min(0)
  @Max(100)
  gapMm?: number;
}

export class ReturnJobDto extends JobActionDto {
  @ApiProperty({ maxLength: 2000, description: 'Why the job goes back: at least 3 characters once trimmed' })
  @IsReason()
  reason: string;
}

export class RecordCutDto extends JobActionDto {
  @ApiProperty({ description: 'Machine time actually taken, minutes' })
  @IsNumber()
  @Min(0)
  @Max(10000)
  actualMinutes: number;
  @ApiProperty() @IsInt() @Min(0) @Max(1000) sheetsUsed: number;
  @ApiPropertyOptional({
    description: `Kerf measured on the cut, mm; also kept as a kerf record. ${MACHINE_PROFILE_LIMITS.kerfMm.min}–${MACHINE_PROFILE_LIMITS.kerfMm.max} mm on lasers and blade cutters; on a router the measured cut width (${MACHINE_PROFILE_LIMITS.toolDiameterMm.min}–${MACHINE_PROFILE_LIMITS.toolDiameterMm.max} mm)`,
    minimum: MACHINE_PROFILE_LIMITS.kerfMm.min,
    maximum: MACHINE_PROFILE_LIMITS.toolDiameterMm.max,
  })
  @OptionalNotNull()
  @IsNumber()
  // The widest range of any machine kind (the kerf records' DTO); the job's own kind is checked by the service.
  // The column keeps 0.001 mm, so a smaller kerf would be stored as 0.
  @Min(MACHINE_PROFILE_LIMITS.kerfMm.min)
  @Max(MACHINE_PROFILE_LIMITS.toolDiameterMm.max)
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
