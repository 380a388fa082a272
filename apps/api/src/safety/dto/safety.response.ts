import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  APPLIES_TO_ALL,
  type JobSafetyView,
  LASER_ALLOWANCES,
  type LaserAllowance,
  type LocalRulesView,
  MACHINE_PROFILE_KINDS,
  MATERIAL_FAMILIES,
  type MachineProfileKind,
  type MaterialFamily,
  type MaterialHazard,
  NOTICE_SEVERITIES,
  type NoticeAppliesTo,
  type NoticeSeverity,
  type SafetyNotice,
} from '@kerfwright/contracts';

/** OpenAPI shapes of the safety answers (the types themselves live in @kerfwright/contracts). */
export class NoticeAppliesToResponse implements NoticeAppliesTo {
  @ApiProperty({
    enum: [...MACHINE_PROFILE_KINDS, APPLIES_TO_ALL],
    isArray: true,
    description: '"*" means every machine kind',
  })
  machineKinds: (MachineProfileKind | typeof APPLIES_TO_ALL)[];
  @ApiProperty({
    enum: [...MATERIAL_FAMILIES, APPLIES_TO_ALL],
    isArray: true,
    description: '"*" means every material family',
  })
  materialFamilies: (MaterialFamily | typeof APPLIES_TO_ALL)[];
}

export class SafetyNoticeResponse implements SafetyNotice {
  @ApiProperty({ description: 'Stable kebab-case id, shared by all versions of the notice' }) id: string;
  @ApiProperty({ minimum: 1, description: 'The highest version of an id is the current one' })
  version: number;
  @ApiProperty() title: string;
  @ApiProperty({ type: NoticeAppliesToResponse }) appliesTo: NoticeAppliesToResponse;
  @ApiProperty({ enum: NOTICE_SEVERITIES }) severity: NoticeSeverity;
  @ApiProperty({ description: 'Markdown' }) body: string;
  @ApiProperty({ type: [String], description: 'The outside sources of the notice’s facts, in words' })
  sources: string[];
}

export class MaterialHazardResponse implements MaterialHazard {
  @ApiProperty({ enum: MATERIAL_FAMILIES }) family: MaterialFamily;
  @ApiProperty({ type: [String], description: 'Everyday names of materials in this family' })
  examples: string[];
  @ApiPropertyOptional({
    type: [String],
    description:
      'On refused rows: words that, whole in a material’s name, say it is of this family (a material so named is kept off the laser whatever family it is filed under)',
  })
  nameWords?: string[];
  @ApiProperty({ enum: LASER_ALLOWANCES }) laser: LaserAllowance;
  @ApiProperty({ description: 'What goes wrong, in a sentence or two' }) hazard: string;
  @ApiPropertyOptional({ description: 'For laser "conditional": what must be true before cutting' })
  condition?: string;
  @ApiProperty({ description: 'Where the fact comes from' }) source: string;
}

export class LocalRulesResponse implements LocalRulesView {
  @ApiProperty({ minimum: 1 }) version: number;
  @ApiProperty({ description: 'Markdown' }) body: string;
  @ApiProperty({ type: String, nullable: true }) authorName: string | null;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}

export class JobSafetyResponse implements JobSafetyView {
  @ApiProperty({ format: 'uuid' }) jobId: string;
  @ApiProperty({ enum: MACHINE_PROFILE_KINDS, nullable: true }) machineKind: MachineProfileKind | null;
  @ApiProperty({ enum: MATERIAL_FAMILIES, nullable: true }) materialFamily: MaterialFamily | null;
  @ApiProperty({ type: [SafetyNoticeResponse] }) notices: SafetyNoticeResponse[];
  @ApiProperty({ type: LocalRulesResponse, nullable: true }) localRules: LocalRulesResponse | null;
  @ApiProperty({
    type: String,
    nullable: true,
    description:
      'The job’s preparation in effect (its latest prepare), opaque; an acknowledgement names it. Null before the job is prepared',
  })
  preparationId: string | null;
  @ApiProperty({
    description:
      'Whether the caller has acknowledged exactly these notice versions and local rules for this preparation',
  })
  acknowledged: boolean;
  @ApiProperty({ type: String, format: 'date-time', nullable: true }) acknowledgedAt: string | null;
}
