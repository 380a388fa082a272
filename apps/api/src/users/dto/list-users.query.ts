import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { ROLES, type Role } from '@kerfwright/contracts';
import { Transform } from 'class-transformer';
import { PageQueryDto } from '../../common/paging';

export const USER_SORT_FIELDS = ['email', 'displayName', 'role', 'createdAt'] as const;

export class ListUsersQuery extends PageQueryDto {
  /** A field name, optionally prefixed with '-' for descending order. */
  @ApiPropertyOptional({ enum: [...USER_SORT_FIELDS, ...USER_SORT_FIELDS.map((f) => `-${f}`)] })
  @IsOptional()
  @IsIn([...USER_SORT_FIELDS, ...USER_SORT_FIELDS.map((f) => `-${f}`)])
  sort?: string;
  @ApiPropertyOptional({ enum: ROLES }) @IsOptional() @IsIn(ROLES) role?: Role;
  @ApiPropertyOptional()
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
  @ApiPropertyOptional({ description: 'Text in the e-mail or display name' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;
}
