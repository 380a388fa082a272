import { IsBoolean, IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { ROLES, type Role } from '@kerfwright/contracts';
import { Transform } from 'class-transformer';
import { PageQueryDto } from '../../common/paging';

export const USER_SORT_FIELDS = ['email', 'displayName', 'role', 'createdAt'] as const;

export class ListUsersQuery extends PageQueryDto {
  /** A field name, optionally prefixed with '-' for descending order. */
  @IsOptional()
  @IsIn([...USER_SORT_FIELDS, ...USER_SORT_FIELDS.map((f) => `-${f}`)])
  sort?: string;
  @IsOptional() @IsIn(ROLES) role?: Role;
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
  @IsOptional() @IsString() @MaxLength(100) q?: string;
}
