import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsIn, IsOptional } from 'class-validator';
import { ROLES, type Role, type UpdateUserRequest } from '@kerfwright/contracts';

export class UpdateUserDto implements UpdateUserRequest {
  @ApiPropertyOptional({ enum: ROLES }) @IsOptional() @IsIn(ROLES) role?: Role;
  @ApiPropertyOptional({ description: 'false deactivates the user' })
  @IsOptional()
  @IsBoolean()
  active?: boolean;
}
