import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import {
  MACHINE_PROFILE_KINDS,
  MATERIAL_FAMILIES,
  type MachineProfileKind,
  type MaterialFamily,
} from '@kerfwright/contracts';
import { IsRowVersion, MAX_ROW_VERSION } from '../../common/validation/row-version';
import { OptionalNotNull } from '../../common/validation/optional';

export class NoticeFilterQuery {
  @ApiPropertyOptional({ enum: MACHINE_PROFILE_KINDS })
  @IsOptional()
  @IsIn(MACHINE_PROFILE_KINDS)
  machineKind?: MachineProfileKind;
  @ApiPropertyOptional({ enum: MATERIAL_FAMILIES })
  @IsOptional()
  @IsIn(MATERIAL_FAMILIES)
  materialFamily?: MaterialFamily;
}

export class LocalRulesDto {
  @ApiProperty({ maxLength: 20000, description: 'Markdown; shown with every notice' })
  @IsString()
  @MinLength(1)
  @MaxLength(20000)
  body: string;

  @ApiPropertyOptional({
    minimum: 0,
    description:
      'The version of the rules the text was written over (0: there were none); a newer one gets 409 ' +
      'SAFETY.STALE_RULES, so one supervisor never replaces another’s rules unseen. Left out: not compared.',
  })
  @OptionalNotNull()
  @IsInt()
  @Min(0)
  @Max(MAX_ROW_VERSION)
  version?: number;
}

export class NoticeVersionRefDto {
  @ApiProperty() @IsString() @Matches(/^[a-z0-9]+(-[a-z0-9]+)*$/) @MaxLength(80) id: string;
  @ApiProperty() @IsRowVersion() version: number;
}

export class AcknowledgeSafetyDto {
  @ApiProperty({ type: [NoticeVersionRefDto] })
  @IsArray()
  @ArrayMaxSize(100)
  @ValidateNested({ each: true })
  @Type(() => NoticeVersionRefDto)
  notices: NoticeVersionRefDto[];
  @ApiProperty({ nullable: true, type: Number })
  @ValidateIf((_o, v) => v !== null)
  @IsRowVersion()
  localRulesVersion: number | null;
  @ApiProperty({
    pattern: '^[1-9][0-9]{0,17}$',
    description:
      'The preparationId of the safety view that was read; a job prepared again since gets 409 ' +
      'SAFETY.PREPARATION_CHANGED, so an acknowledgement never counts for a preparation it did not see',
  })
  @IsString()
  @Matches(/^[1-9][0-9]{0,17}$/, {
    message: 'preparationId must be the preparationId of the job’s safety view',
  })
  preparationId: string;
}
