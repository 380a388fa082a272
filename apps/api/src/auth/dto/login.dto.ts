import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import { type LoginRequest, PASSWORD_MAX_LENGTH } from '@kerfwright/contracts';

export class LoginDto implements LoginRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' }) @MaxLength(254) email: string;
  @IsString() @MinLength(1) @MaxLength(PASSWORD_MAX_LENGTH) password: string;
}
