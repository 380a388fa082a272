import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  type KerfRecordView,
  MACHINE_PROFILE_KINDS,
  type MachineProfileDetailView,
  type MachineProfileKind,
  type MachineProfileSummaryView,
  type MachineProfileVersionView,
  type Page,
  PROFILE_VERSION_STATES,
  type ProfileSettingView,
  type ProfileVersionState,
} from '@kerfwright/contracts';

export class ProfileSettingResponse implements ProfileSettingView {
  @ApiProperty({ format: 'uuid' }) materialId: string;
  @ApiProperty() materialName: string;
  @ApiPropertyOptional({
    description:
      'The hazard table’s condition on the material’s family when a laser may cut it only on one (felt, an unlisted material)',
  })
  laserCondition?: string;
  @ApiPropertyOptional() kerfMm?: number;
  @ApiPropertyOptional() toolDiameterMm?: number;
  @ApiProperty() cutSpeedMmS: number;
  @ApiProperty() markSpeedMmS: number;
  @ApiPropertyOptional() powerPct?: number;
  @ApiProperty() passes: number;
  @ApiProperty() pierceTimeS: number;
  @ApiPropertyOptional() spindleRpm?: number;
}

export class MachineProfileVersionResponse implements MachineProfileVersionView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ format: 'uuid' }) profileId: string;
  @ApiProperty() number: number;
  @ApiProperty({ enum: PROFILE_VERSION_STATES }) state: ProfileVersionState;
  @ApiProperty() bedWidthMm: number;
  @ApiProperty() bedHeightMm: number;
  @ApiProperty() rapidSpeedMmS: number;
  @ApiProperty() hourlyRate: number;
  @ApiProperty() currency: string;
  @ApiProperty({ type: [ProfileSettingResponse] }) settings: ProfileSettingResponse[];
  @ApiProperty() notes: string;
  @ApiProperty({ type: String, nullable: true }) returnReason: string | null;
  @ApiProperty({ type: Number, nullable: true }) basedOnNumber: number | null;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) createdBy: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) submittedBy: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'date-time' }) submittedAt: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) approvedBy: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'date-time' }) approvedAt: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'date-time' }) retiredAt: string | null;
  @ApiProperty({
    type: String,
    nullable: true,
    description:
      'Why a supervisor took the version out of use; null when a newer approved version replaced it',
  })
  retireReason: string | null;
  @ApiProperty({ description: 'Send it back with PATCH and state changes (optimistic locking)' })
  lockVersion: number;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}

export class MachineProfileSummaryResponse implements MachineProfileSummaryView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() name: string;
  @ApiProperty({ enum: MACHINE_PROFILE_KINDS }) kind: MachineProfileKind;
  @ApiProperty({ type: MachineProfileVersionResponse, nullable: true })
  currentApproved: MachineProfileVersionResponse | null;
  @ApiProperty({ type: MachineProfileVersionResponse }) latest: MachineProfileVersionResponse;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}

export class MachineProfileDetailResponse
  extends MachineProfileSummaryResponse
  implements MachineProfileDetailView
{
  @ApiProperty({ type: [MachineProfileVersionResponse], description: 'Newest first' })
  versions: MachineProfileVersionResponse[];
}

export class MachineProfilePageResponse implements Page<MachineProfileSummaryView> {
  @ApiProperty({ type: [MachineProfileSummaryResponse] }) items: MachineProfileSummaryResponse[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}

export class KerfRecordResponse implements KerfRecordView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ format: 'uuid' }) profileId: string;
  @ApiProperty({ format: 'uuid' }) materialId: string;
  @ApiProperty() materialName: string;
  @ApiProperty() kerfMm: number;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) jobId: string | null;
  @ApiProperty() notes: string;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) recordedBy: string | null;
  @ApiProperty({ type: String, nullable: true, format: 'uuid' }) adoptedVersionId: string | null;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}

export class KerfRecordPageResponse implements Page<KerfRecordView> {
  @ApiProperty({ type: [KerfRecordResponse], description: 'Oldest first (for a chart)' })
  items: KerfRecordResponse[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
