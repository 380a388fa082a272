import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  COLOUR_RULES,
  type ColourRuleName,
  JOB_ACTIONS,
  JOB_STATES,
  type JobAction,
  type JobDetailView,
  type JobLayoutChoice,
  type JobPreparation,
  type JobState,
  type JobTransitionView,
  type JobView,
  type Page,
} from '@kerfwright/contracts';

/** OpenAPI shapes of the job answers (the types themselves live in @kerfwright/contracts). */
export class SheetDto {
  @ApiProperty() widthMm: number;
  @ApiProperty() heightMm: number;
}

/** The time and cost a preparation keeps: the cut pack's own figures (see JobPreparation.estimate). */
export class JobEstimateDto {
  @ApiProperty() cutLengthMm: number;
  @ApiProperty() markLengthMm: number;
  @ApiProperty() pierces: number;
  @ApiProperty({ description: 'Rapid travel between contours, mm' }) travelMm: number;
  @ApiProperty() minutes: number;
  @ApiProperty() machineCost: number;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Null when the material lists no price for the sheet in the machine’s currency',
  })
  materialCost: number | null;
  @ApiProperty() currency: string;
}

export class JobPreparationDto implements JobPreparation {
  @ApiProperty() thicknessMm: number;
  @ApiProperty({ enum: ['laser', 'router'] }) machineKind: 'laser' | 'router';
  @ApiPropertyOptional() kerfMm?: number;
  @ApiPropertyOptional() toolDiameterMm?: number;
  @ApiProperty() pieceCount: number;
  @ApiProperty() crossingCount: number;
  @ApiProperty() diameterMm: number;
  @ApiProperty() sheetCount: number;
  @ApiProperty({ type: SheetDto }) sheet: SheetDto;
  @ApiPropertyOptional() marginMm?: number;
  @ApiPropertyOptional() gapMm?: number;
  @ApiPropertyOptional({ enum: COLOUR_RULES }) colourRule?: ColourRuleName;
  @ApiProperty({ description: 'Pieces’ area over the sheets’ area, 0–1' }) utilisation: number;
  @ApiProperty({ type: [String] }) warnings: string[];
  @ApiPropertyOptional({
    type: Number,
    nullable: true,
    description:
      'One sheet’s price in the machine’s currency at preparation (null: not priced); the cut pack uses it',
  })
  pricePerSheet?: number | null;
  @ApiPropertyOptional({ type: JobEstimateDto }) estimate?: JobEstimateDto;
}

export class JobLayoutChoiceDto implements JobLayoutChoice {
  @ApiProperty({ type: SheetDto }) sheet: SheetDto;
  @ApiPropertyOptional({ enum: COLOUR_RULES }) colourRule?: ColourRuleName;
  @ApiPropertyOptional() marginMm?: number;
  @ApiPropertyOptional() gapMm?: number;
}

export class JobViewDto implements JobView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ enum: JOB_STATES }) state: JobState;
  @ApiProperty({ format: 'uuid' }) designId: string;
  @ApiProperty() designName: string;
  @ApiProperty({ format: 'uuid' }) requesterId: string;
  @ApiProperty() requesterName: string;
  @ApiProperty() quantity: number;
  @ApiProperty() notes: string;
  @ApiProperty({ type: String, format: 'uuid', nullable: true }) materialId: string | null;
  @ApiProperty({ type: String, nullable: true }) materialName: string | null;
  @ApiProperty({ type: [String] }) colours: string[];
  @ApiProperty({
    type: String,
    format: 'uuid',
    nullable: true,
    description: 'The exact approved version used',
  })
  profileVersionId: string | null;
  @ApiProperty({ type: String, nullable: true }) profileName: string | null;
  @ApiProperty({ type: Number, nullable: true }) profileVersionNumber: number | null;
  @ApiProperty({
    required: false,
    description: "True when the job's profile version is no longer the approved one: prepare the job again",
  })
  profileVersionRetired?: boolean;
  @ApiProperty({
    required: false,
    type: String,
    nullable: true,
    description:
      'Why a supervisor took the job’s profile version out of use, when they did (null when a newer approval retired it)',
  })
  profileRetireReason?: string | null;
  @ApiProperty({
    type: String,
    required: false,
    nullable: true,
    description:
      'Why the job’s material may not be cut on its machine now (taken off the laser since preparation: the ' +
      'message of 409 MATERIAL.LASER_PROHIBITED); approve, release and cut are then not offered',
  })
  materialRefusal?: string | null;
  @ApiProperty({
    required: false,
    description: 'True when the caller prepared the job (four eyes: no approval)',
  })
  preparedByCaller?: boolean;
  @ApiProperty({ type: String, nullable: true }) returnReason: string | null;
  @ApiProperty({ type: JobPreparationDto, nullable: true }) preparation: JobPreparationDto | null;
  @ApiPropertyOptional({
    type: JobLayoutChoiceDto,
    nullable: true,
    description: 'The sheet and colour rule of the last preparation; kept when a change of copies drops it',
  })
  layoutChoice?: JobLayoutChoiceDto | null;
  @ApiProperty({ type: Number, nullable: true }) actualMinutes: number | null;
  @ApiProperty({ type: Number, nullable: true }) sheetsUsed: number | null;
  @ApiProperty({ type: Number, nullable: true }) measuredKerfMm: number | null;
  @ApiProperty({ description: 'Send it back with every action (optimistic locking)' }) version: number;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
  @ApiProperty({ enum: JOB_ACTIONS, isArray: true, description: 'Actions the caller may take now' })
  actions: JobAction[];
}

export class JobTransitionViewDto implements JobTransitionView {
  @ApiProperty({ enum: JOB_STATES, nullable: true }) from: JobState | null;
  @ApiProperty({ enum: JOB_STATES }) to: JobState;
  @ApiProperty() action: string;
  @ApiProperty({ type: String, format: 'uuid', nullable: true }) actorId: string | null;
  @ApiProperty({ type: String, nullable: true }) actorName: string | null;
  @ApiProperty({ type: String, nullable: true }) reason: string | null;
  @ApiProperty({ format: 'date-time' }) at: string;
}

export class JobDetailViewDto extends JobViewDto implements JobDetailView {
  @ApiProperty({
    type: [JobTransitionViewDto],
    description: 'Every state change, and every change of copies or notes (action "change"), oldest first',
  })
  transitions: JobTransitionViewDto[];
}

export class JobPageDto implements Page<JobView> {
  @ApiProperty({ type: [JobViewDto] }) items: JobViewDto[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
