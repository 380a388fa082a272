import { IsBoolean, IsIn, IsOptional } from 'class-validator';
import { ROLES, type Role, type UpdateUserRequest } from '@kerfwright/contracts';

export class UpdateUserDto implements UpdateUserRequest {
  @IsOptional() @IsIn(ROLES) role?: Role;
  @IsOptional() @IsBoolean() active?: boolean;
}
