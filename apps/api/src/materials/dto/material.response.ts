import { ApiProperty } from '@nestjs/swagger';
import { MATERIAL_FAMILIES, type MaterialFamily, type MaterialView, type Page } from '@kerfwright/contracts';
import { StockSheetDto } from './create-material.dto';

export class MaterialResponse implements MaterialView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() name: string;
  @ApiProperty({ enum: MATERIAL_FAMILIES }) family: MaterialFamily;
  @ApiProperty() nominalThicknessMm: number;
  @ApiProperty({ type: Number, nullable: true }) measuredThicknessMm: number | null;
  @ApiProperty() flexible: boolean;
  @ApiProperty({ type: [String] }) colours: string[];
  @ApiProperty({ type: [StockSheetDto] }) stockSheets: StockSheetDto[];
  @ApiProperty() laserAllowed: boolean;
  @ApiProperty() hazardNote: string;
  @ApiProperty() notes: string;
  @ApiProperty({ description: 'Send it back with PATCH (optimistic locking)' }) version: number;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}

export class MaterialPageResponse implements Page<MaterialView> {
  @ApiProperty({ type: [MaterialResponse] }) items: MaterialResponse[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
