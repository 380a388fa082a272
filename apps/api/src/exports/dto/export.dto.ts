import { ApiProperty } from '@nestjs/swagger';
import {
  CUT_PACK_FILE_ROLES,
  type CutPackFileRole,
  EXPORT_STATES,
  type ExportRequested,
  type ExportState,
  type ExportView,
} from '@kerfwright/contracts';

/** OpenAPI shapes of the export answers (the types themselves live in @kerfwright/contracts). */
export class ExportRequestedDto implements ExportRequested {
  @ApiProperty({ format: 'uuid', description: 'Follow it at /api/exports/{exportId}' }) exportId: string;
}

export class ExportFileDto {
  @ApiProperty() name: string;
  @ApiProperty({ enum: CUT_PACK_FILE_ROLES }) role: CutPackFileRole;
  @ApiProperty() contentType: string;
  @ApiProperty() bytes: number;
  @ApiProperty({ description: 'SHA-256 of the stored bytes, hex' }) sha256: string;
}

export class ExportViewDto implements ExportView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ format: 'uuid' }) jobId: string;
  @ApiProperty({ enum: EXPORT_STATES }) state: ExportState;
  @ApiProperty({ minimum: 0, maximum: 100 }) progress: number;
  @ApiProperty() attempts: number;
  @ApiProperty({ type: String, nullable: true }) errorCode: string | null;
  @ApiProperty({ type: String, nullable: true }) errorMessage: string | null;
  @ApiProperty({ type: [ExportFileDto], description: 'Listed only once the export is done' })
  files: ExportFileDto[];
  @ApiProperty() createdAt: string;
  @ApiProperty({ type: String, nullable: true }) finishedAt: string | null;
  @ApiProperty({
    description:
      'Built for a preparation the job has replaced since (returned and prepared again); its files are refused (EXPORT.PREPARATION_REPLACED). Always false in the job’s list, which holds only the packs of its preparation in effect',
  })
  replaced: boolean;
  @ApiProperty({
    required: false,
    description:
      'Staff, done exports: the safety notices or workshop rules changed since the build; the setup sheet and ZIP are refused (EXPORT.SAFETY_CHANGED) until it is built again',
  })
  safetyChanged?: boolean;
}
