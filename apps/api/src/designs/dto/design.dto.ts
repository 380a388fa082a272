import { ApiProperty, ApiPropertyOptional, OmitType } from '@nestjs/swagger';
import { IsIn, IsObject, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { PageQueryDto } from '../../common/paging';
import { NoControlCharacters, Trimmed } from '../../common/text';
import {
  type CreateDesignRequest,
  type DesignIssue,
  type DesignPreview,
  type DesignSpec,
  type DesignSummary,
  type DesignView,
  type Page,
  type DesignSpecInput,
  type UpdateDesignRequest,
} from '@kerfwright/contracts';
import { OptionalNotNull } from '../../common/validation/optional';
import { IsRowVersion } from '../../common/validation/row-version';

const SPEC_DOC = {
  description:
    'The design spec, the same shape as the geometry CLI takes (checked by the engine; kept and returned as sent): ' +
    'solid (catalogue id or uploaded {format, text}), piece {sides, step, rotationDeg, size}, ' +
    'scale {by: planeDistance | diameter | pieceCircumradius, mm} or {by: "fitSheets", sheets} or {by: "fitBed"} (needs bed), ' +
    'stock {thicknessMm, flexible, sheet {widthMm, heightMm}, marginMm, gapMm}, machine {kind, kerfMm | toolDiameterMm}, ' +
    'colours {count, rule: neighbour-distinct | vertex-distinct | opposite-match, names}, bed {widthMm, heightMm}, ' +
    'fitMm, depthClearanceMm, minWebMm',
  example: {
    solid: 'octahedron',
    piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
    scale: { by: 'fitSheets', sheets: 2 },
    stock: { thicknessMm: 3, flexible: false, sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3 },
    machine: { kind: 'laser', kerfMm: 0.15 },
    colours: { count: 2, rule: 'neighbour-distinct' },
    fitMm: -0.05,
  },
};

export class CreateDesignDto implements CreateDesignRequest {
  @ApiProperty({ maxLength: 120, description: 'Trimmed; one line of text, not empty' })
  @Trimmed()
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  @NoControlCharacters()
  name: string;
  @ApiPropertyOptional({ maxLength: 2000 })
  @OptionalNotNull()
  @IsString()
  @MaxLength(2000)
  description?: string;
  @ApiProperty({ type: 'object', additionalProperties: true, ...SPEC_DOC }) @IsObject() spec: DesignSpecInput;
}

export class UpdateDesignDto implements UpdateDesignRequest {
  @ApiPropertyOptional({ maxLength: 120, description: 'Trimmed; one line of text, not empty' })
  @OptionalNotNull()
  @Trimmed()
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  @NoControlCharacters()
  name?: string;
  @ApiPropertyOptional() @OptionalNotNull() @IsString() @MaxLength(2000) description?: string;
  @ApiPropertyOptional({ type: 'object', additionalProperties: true, ...SPEC_DOC })
  @OptionalNotNull()
  @IsObject()
  spec?: DesignSpecInput;
  @ApiProperty({ description: 'The version you read; a stale one is refused with 409' })
  @IsRowVersion()
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

export class DesignIssueDto implements DesignIssue {
  @ApiProperty({ description: 'AREA.REASON, e.g. CROSSING.NOT_ASSEMBLABLE' }) code: string;
  @ApiProperty() message: string;
  @ApiProperty({ type: [String], description: 'Ids of the pieces concerned' }) pieces: string[];
}

export class DesignPreviewDto implements DesignPreview {
  @ApiProperty({ description: 'No errors: the design can be cut' }) valid: boolean;
  @ApiProperty() pieceCount: number;
  @ApiProperty() crossingCount: number;
  @ApiProperty({ description: 'Overall diameter, mm' }) diameterMm: number;
  @ApiProperty({ description: 'Distance from the centre to the nearest piece plane, mm' })
  planeDistanceMm: number;
  @ApiProperty({ type: [DesignIssueDto] }) errors: DesignIssueDto[];
  @ApiProperty({ type: [DesignIssueDto] }) warnings: DesignIssueDto[];
}

export class DesignViewDto implements DesignView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ format: 'uuid' }) ownerId: string;
  @ApiProperty() ownerName: string;
  @ApiProperty() name: string;
  @ApiProperty() description: string;
  @ApiProperty({ type: 'object', additionalProperties: true, ...SPEC_DOC }) spec: DesignSpec;
  @ApiProperty({ nullable: true, type: String, description: 'Original file name of an uploaded solid' })
  solidFileName: string | null;
  @ApiProperty({ type: DesignPreviewDto }) preview: DesignPreviewDto;
  @ApiProperty({ description: 'Send it back with PATCH (optimistic locking)' }) version: number;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}

/** A list row: the design without its spec (an uploaded solid can be large), with the solid's name. */
export class DesignSummaryDto extends OmitType(DesignViewDto, ['spec'] as const) implements DesignSummary {
  @ApiProperty({ description: 'Catalogue id or the uploaded solid’s name' }) solid: string;
}

export class DesignPageDto implements Page<DesignSummary> {
  @ApiProperty({ type: [DesignSummaryDto] }) items: DesignSummaryDto[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}

export class SolidCheckDto {
  @ApiProperty() name: string;
  @ApiProperty() format: string;
  @ApiProperty() vertexCount: number;
  @ApiProperty() faceCount: number;
}
