import { ApiProperty } from '@nestjs/swagger';
import { type AuthResponse } from '@kerfwright/contracts';
import { UserResponse } from '../../users/dto/user.response';

/** OpenAPI shape of the sign-in answer (the type itself lives in @kerfwright/contracts). */
export class AuthTokenResponse implements AuthResponse {
  @ApiProperty({ description: 'Send it as `Authorization: Bearer <token>`' }) accessToken: string;
  @ApiProperty({ type: UserResponse }) user: UserResponse;
}
