import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { IsBoolean } from 'class-validator';
import {
  type ApproveProfileVersionRequest,
  type CreateProfileVersionRequest,
  MACHINE_PROFILE_LIMITS as L,
  type ProfileDecisionRequest,
  type ProfileTransitionRequest,
  type RetireProfileVersionRequest,
  type ReturnProfileVersionRequest,
  type UpdateProfileVersionRequest,
} from '@kerfwright/contracts';
import { IsReason } from '../../common/text';
import { OptionalNotNull } from '../../common/validation/optional';
import { ProfileVersionContentDto } from './profile-version-content.dto';
import { IsRowVersion } from '../../common/validation/row-version';

/** Changes applied to a copy of the profile's latest version, giving a new draft. */
export class CreateProfileVersionDto
  extends PartialType(ProfileVersionContentDto, { skipNullProperties: false })
  implements CreateProfileVersionRequest {}

/** Changes to a draft, with the lockVersion the client read. */
export class UpdateProfileVersionDto
  extends PartialType(ProfileVersionContentDto, { skipNullProperties: false })
  implements UpdateProfileVersionRequest
{
  @ApiProperty({ minimum: 1, description: 'The lockVersion the client read (optimistic locking)' })
  @IsRowVersion()
  lockVersion: number;
}

/** Retiring: optionally the lockVersion the client read (taking a version out of use is never held up). */
export class ProfileTransitionDto implements ProfileTransitionRequest {
  @ApiPropertyOptional({ minimum: 1, description: 'The lockVersion the client read; a stale one gets 409' })
  @OptionalNotNull()
  @IsRowVersion()
  lockVersion?: number;
}

/** Retiring a version: optionally the lockVersion the client read, and why (kept and mailed). */
export class RetireProfileVersionDto extends ProfileTransitionDto implements RetireProfileVersionRequest {
  @ApiPropertyOptional({
    maxLength: L.reasonLength,
    description:
      'Why the version is taken out of use; kept on the version and, when it is the approved one, mailed to fabricators and operators',
  })
  @OptionalNotNull()
  @IsReason(L.reasonLength)
  reason?: string;
}

/**
 * Submitting, approving or sending back a version: the lockVersion of the content the caller read is required,
 * so nobody decides on content they never saw (400 without it, 409 when it is stale).
 */
export class ProfileDecisionDto implements ProfileDecisionRequest {
  @ApiProperty({
    minimum: 1,
    description: 'The lockVersion of the version as the caller read it; a stale one gets 409',
  })
  @IsRowVersion()
  lockVersion: number;
}

export class ApproveProfileVersionDto extends ProfileDecisionDto implements ApproveProfileVersionRequest {
  @ApiPropertyOptional({
    description:
      'True when the approver has checked the laser condition of every material that carries one (laserCondition in the version’s settings); required for such a laser version',
  })
  @OptionalNotNull()
  @IsBoolean()
  conditionsChecked?: boolean;
}

export class ReturnProfileVersionDto extends ProfileDecisionDto implements ReturnProfileVersionRequest {
  @ApiProperty({
    maxLength: L.reasonLength,
    description: 'What must change before approval: at least 3 characters once trimmed',
  })
  @IsReason(L.reasonLength)
  reason: string;
}
