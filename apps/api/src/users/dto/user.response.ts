import { ApiProperty } from '@nestjs/swagger';
import { ROLES, type Page, type Role, type UserView } from '@kerfwright/contracts';

/** OpenAPI shapes of the users answers (the types themselves live in @kerfwright/contracts). */
export class UserResponse implements UserView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() email: string;
  @ApiProperty() displayName: string;
  @ApiProperty({ enum: ROLES }) role: Role;
  @ApiProperty({ description: 'An inactive user cannot sign in, and their tokens stop working' })
  active: boolean;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}

export class UserPageResponse implements Page<UserView> {
  @ApiProperty({ type: [UserResponse] }) items: UserResponse[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
