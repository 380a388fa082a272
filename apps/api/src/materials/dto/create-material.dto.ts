import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsIn,
  IsNotEmpty,
  IsNumber,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
  ValidateNested,
} from 'class-validator';
import {
  type CreateMaterialRequest,
  MATERIAL_FAMILIES,
  MATERIAL_LIMITS as L,
  type MaterialFamily,
  type StockSheet,
} from '@kerfwright/contracts';
import { NoControlCharacters } from '../../common/text';
import { FINITE, OptionalNotNull, OptionalNullable } from '../../common/validation/optional';

const trim = ({ value }: { value: unknown }): unknown => (typeof value === 'string' ? value.trim() : value);

export class StockSheetDto implements StockSheet {
  @ApiProperty({ minimum: L.sheetSideMm.min, maximum: L.sheetSideMm.max, example: 600 })
  @IsNumber(FINITE)
  @Min(L.sheetSideMm.min)
  @Max(L.sheetSideMm.max)
  widthMm: number;

  @ApiProperty({ minimum: L.sheetSideMm.min, maximum: L.sheetSideMm.max, example: 400 })
  @IsNumber(FINITE)
  @Min(L.sheetSideMm.min)
  @Max(L.sheetSideMm.max)
  heightMm: number;

  @ApiProperty({ minimum: L.pricePerSheet.min, maximum: L.pricePerSheet.max, example: 6.5 })
  @IsNumber(FINITE)
  @Min(L.pricePerSheet.min)
  @Max(L.pricePerSheet.max)
  pricePerSheet: number;

  @ApiProperty({ description: 'ISO 4217 code', example: 'EUR', pattern: '^[A-Z]{3}$' })
  @IsString()
  @Matches(/^[A-Z]{3}$/, { message: 'currency must be an ISO 4217 code such as EUR' })
  currency: string;
}

export class CreateMaterialDto implements CreateMaterialRequest {
  @ApiProperty({ maxLength: L.nameLength, example: 'Birch plywood 3 mm' })
  @Transform(trim)
  @IsString()
  @IsNotEmpty()
  @MaxLength(L.nameLength)
  @NoControlCharacters()
  name: string;

  @ApiProperty({ enum: MATERIAL_FAMILIES, example: 'plywood' })
  @IsIn(MATERIAL_FAMILIES)
  family: MaterialFamily;

  @ApiProperty({ minimum: L.thicknessMm.min, maximum: L.thicknessMm.max, example: 3 })
  @IsNumber(FINITE)
  @Min(L.thicknessMm.min)
  @Max(L.thicknessMm.max)
  nominalThicknessMm: number;

  @ApiPropertyOptional({
    type: Number,
    nullable: true,
    minimum: L.thicknessMm.min,
    maximum: L.thicknessMm.max,
    description: 'Thickness measured on the stock on hand; null clears it',
  })
  @OptionalNullable()
  @IsNumber(FINITE)
  @Min(L.thicknessMm.min)
  @Max(L.thicknessMm.max)
  measuredThicknessMm?: number | null;

  @ApiPropertyOptional({ default: false })
  @OptionalNotNull()
  @IsBoolean()
  flexible?: boolean;

  @ApiPropertyOptional({ type: [String], maxItems: L.maxColours, example: ['natural', 'black'] })
  @OptionalNotNull()
  @IsArray()
  @ArrayMaxSize(L.maxColours)
  @ArrayUnique()
  @IsString({ each: true })
  @IsNotEmpty({ each: true })
  @MaxLength(L.colourLength, { each: true })
  colours?: string[];

  @ApiPropertyOptional({ type: [StockSheetDto], maxItems: L.maxStockSheets })
  @OptionalNotNull()
  @IsArray()
  @ArrayMaxSize(L.maxStockSheets)
  @ValidateNested({ each: true })
  @Type(() => StockSheetDto)
  stockSheets?: StockSheetDto[];

  @ApiPropertyOptional({
    description:
      'Defaults to what the material hazard table allows for the family; true is refused for a prohibited family',
  })
  @OptionalNotNull()
  @IsBoolean()
  laserAllowed?: boolean;

  @ApiPropertyOptional({
    maxLength: L.hazardNoteLength,
    description: 'Why the material is not cut on a laser (filled from the hazard table when left empty)',
  })
  @OptionalNotNull()
  @IsString()
  @MaxLength(L.hazardNoteLength)
  hazardNote?: string;

  @ApiPropertyOptional({ maxLength: L.notesLength })
  @OptionalNotNull()
  @IsString()
  @MaxLength(L.notesLength)
  notes?: string;
}
