import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsInt,
  IsNumber,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
  ValidateNested,
} from 'class-validator';
import {
  MACHINE_PROFILE_LIMITS as L,
  type ProfileSetting,
  type ProfileVersionContent,
} from '@kerfwright/contracts';
import { FINITE, OptionalNotNull } from '../../common/validation/optional';
import { IsId } from '../../common/validation/id';

export class ProfileSettingDto implements ProfileSetting {
  @ApiProperty({ format: 'uuid' })
  @IsId()
  materialId: string;

  @ApiPropertyOptional({
    minimum: 0,
    maximum: L.kerfMm.max,
    description: `Lasers (${L.kerfMm.min}–${L.kerfMm.max} mm) and blade cutters (0–${L.kerfMm.max} mm)`,
  })
  @OptionalNotNull()
  @IsNumber(FINITE)
  @Min(0)
  @Max(L.kerfMm.max)
  kerfMm?: number;

  @ApiPropertyOptional({
    minimum: L.toolDiameterMm.min,
    maximum: L.toolDiameterMm.max,
    description: 'CNC routers',
  })
  @OptionalNotNull()
  @IsNumber(FINITE)
  @Min(L.toolDiameterMm.min)
  @Max(L.toolDiameterMm.max)
  toolDiameterMm?: number;

  @ApiProperty({ minimum: L.speedMmS.min, maximum: L.speedMmS.max, description: 'mm/s' })
  @IsNumber(FINITE)
  @Min(L.speedMmS.min)
  @Max(L.speedMmS.max)
  cutSpeedMmS: number;

  @ApiProperty({ minimum: L.speedMmS.min, maximum: L.speedMmS.max, description: 'mm/s' })
  @IsNumber(FINITE)
  @Min(L.speedMmS.min)
  @Max(L.speedMmS.max)
  markSpeedMmS: number;

  @ApiPropertyOptional({
    minimum: L.powerPct.min,
    maximum: L.powerPct.max,
    description: 'Lasers (required there)',
  })
  @OptionalNotNull()
  @IsNumber(FINITE)
  @Min(L.powerPct.min)
  @Max(L.powerPct.max)
  powerPct?: number;

  @ApiProperty({ minimum: L.passes.min, maximum: L.passes.max })
  @IsInt()
  @Min(L.passes.min)
  @Max(L.passes.max)
  passes: number;

  @ApiProperty({ minimum: L.pierceTimeS.min, maximum: L.pierceTimeS.max, description: 's' })
  @IsNumber(FINITE)
  @Min(L.pierceTimeS.min)
  @Max(L.pierceTimeS.max)
  pierceTimeS: number;

  @ApiPropertyOptional({ minimum: L.spindleRpm.min, maximum: L.spindleRpm.max, description: 'CNC routers' })
  @OptionalNotNull()
  @IsInt()
  @Min(L.spindleRpm.min)
  @Max(L.spindleRpm.max)
  spindleRpm?: number;
}

export class ProfileVersionContentDto implements ProfileVersionContent {
  @ApiProperty({ minimum: L.bedSideMm.min, maximum: L.bedSideMm.max, example: 600 })
  @IsNumber(FINITE)
  @Min(L.bedSideMm.min)
  @Max(L.bedSideMm.max)
  bedWidthMm: number;

  @ApiProperty({ minimum: L.bedSideMm.min, maximum: L.bedSideMm.max, example: 400 })
  @IsNumber(FINITE)
  @Min(L.bedSideMm.min)
  @Max(L.bedSideMm.max)
  bedHeightMm: number;

  @ApiProperty({
    minimum: L.speedMmS.min,
    maximum: L.speedMmS.max,
    description: 'Travel speed between cuts, mm/s',
  })
  @IsNumber(FINITE)
  @Min(L.speedMmS.min)
  @Max(L.speedMmS.max)
  rapidSpeedMmS: number;

  @ApiProperty({ minimum: L.hourlyRate.min, maximum: L.hourlyRate.max })
  @IsNumber(FINITE)
  @Min(L.hourlyRate.min)
  @Max(L.hourlyRate.max)
  hourlyRate: number;

  @ApiPropertyOptional({ default: 'EUR', pattern: '^[A-Z]{3}$' })
  @OptionalNotNull()
  @IsString()
  @Matches(/^[A-Z]{3}$/, { message: 'currency must be an ISO 4217 code such as EUR' })
  currency?: string;

  @ApiProperty({ type: [ProfileSettingDto], maxItems: L.maxSettings, description: 'One entry per material' })
  @IsArray()
  @ArrayMaxSize(L.maxSettings)
  @ValidateNested({ each: true })
  @Type(() => ProfileSettingDto)
  settings: ProfileSettingDto[];

  @ApiPropertyOptional({ maxLength: L.notesLength })
  @OptionalNotNull()
  @IsString()
  @MaxLength(L.notesLength)
  notes?: string;
}
