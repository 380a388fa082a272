import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsInt, IsObject, IsOptional, IsString, MaxLength, Min, MinLength } from 'class-validator';
import { PageQueryDto } from '../../common/paging';
import { type CreateDesignRequest, type DesignSpec, type UpdateDesignRequest } from '@kerfwright/contracts';

const SPEC_DOC = {
  description:
    'The design spec (same shape as the geometry CLI): solid, piece {sides, step, rotationDeg, size}, scale {by, mm}, stock {thicknessMm, flexible}, machine {kind, kerfMm | toolDiameterMm}, fitMm',
  example: {
    solid: 'octahedron',
    piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
    scale: { by: 'diameter', mm: 240 },
    stock: { thicknessMm: 3, flexible: false },
    machine: { kind: 'laser', kerfMm: 0.15 },
    fitMm: -0.05,
  },
};

export class CreateDesignDto implements CreateDesignRequest {
  @ApiProperty({ maxLength: 120 }) @IsString() @MinLength(1) @MaxLength(120) name: string;
  @ApiPropertyOptional({ maxLength: 2000 }) @IsOptional() @IsString() @MaxLength(2000) description?: string;
  @ApiProperty({ type: 'object', additionalProperties: true, ...SPEC_DOC }) @IsObject() spec: DesignSpec;
}

export class UpdateDesignDto implements UpdateDesignRequest {
  @ApiPropertyOptional({ maxLength: 120 })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  name?: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) description?: string;
  @ApiPropertyOptional({ type: 'object', additionalProperties: true, ...SPEC_DOC })
  @IsOptional()
  @IsObject()
  spec?: DesignSpec;
  @ApiProperty({ description: 'The version you read; a stale one is refused with 409' })
  @IsInt()
  @Min(1)
  version: number;
}

export const DESIGN_SORT_FIELDS = ['name', 'createdAt', 'updatedAt'] as const;

export class ListDesignsQuery extends PageQueryDto {
  @ApiPropertyOptional({ enum: [...DESIGN_SORT_FIELDS, ...DESIGN_SORT_FIELDS.map((f) => `-${f}`)] })
  @IsOptional()
  @IsIn([...DESIGN_SORT_FIELDS, ...DESIGN_SORT_FIELDS.map((f) => `-${f}`)])
  sort?: string;
  @ApiPropertyOptional({ description: 'Text in the name or description' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;
  @ApiPropertyOptional({
    enum: ['mine', 'all'],
    description: 'Staff see all designs by default; hobbyists only their own',
  })
  @IsOptional()
  @IsIn(['mine', 'all'])
  scope?: 'mine' | 'all';
}

export class DesignPreviewDto {
  @ApiProperty() valid: boolean;
  @ApiProperty() pieceCount: number;
  @ApiProperty() crossingCount: number;
  @ApiProperty() diameterMm: number;
  @ApiProperty() planeDistanceMm: number;
  @ApiProperty({ type: 'array', items: { type: 'object' } }) errors: {
    code: string;
    message: string;
    pieces: string[];
  }[];
  @ApiProperty({ type: 'array', items: { type: 'object' } }) warnings: {
    code: string;
    message: string;
    pieces: string[];
  }[];
}

export class DesignViewDto {
  @ApiProperty() id: string;
  @ApiProperty() ownerId: string;
  @ApiProperty() ownerName: string;
  @ApiProperty() name: string;
  @ApiProperty() description: string;
  @ApiProperty({ type: 'object', additionalProperties: true }) spec: DesignSpec;
  @ApiProperty({ nullable: true, type: String }) solidFileName: string | null;
  @ApiProperty({ type: DesignPreviewDto }) preview: DesignPreviewDto;
  @ApiProperty() version: number;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

export class SolidCheckDto {
  @ApiProperty() name: string;
  @ApiProperty() format: string;
  @ApiProperty() vertexCount: number;
  @ApiProperty() faceCount: number;
}
