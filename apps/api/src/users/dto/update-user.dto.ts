import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsIn } from 'class-validator';
import { ROLES, type Role, type UpdateUserRequest } from '@kerfwright/contracts';
import { OptionalNotNull } from '../../common/validation/optional';

export class UpdateUserDto implements UpdateUserRequest {
  @ApiPropertyOptional({ enum: ROLES }) @OptionalNotNull() @IsIn(ROLES) role?: Role;
  @ApiPropertyOptional({ description: 'false deactivates the user' })
  @OptionalNotNull()
  @IsBoolean()
  active?: boolean;
}
