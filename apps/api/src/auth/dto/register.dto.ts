import { Transform } from 'class-transformer';
import { IsEmail, IsString, MaxLength, MinLength, ValidateBy } from 'class-validator';
import {
  DISPLAY_NAME_MAX_LENGTH,
  PASSWORD_MAX_LENGTH,
  PASSWORD_MIN_LENGTH,
  passwordLongEnough,
  type RegisterRequest,
} from '@kerfwright/contracts';
import { NoControlCharacters } from '../../common/text';

export class RegisterDto implements RegisterRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' }) @MaxLength(254) email: string;

  @Transform(({ value }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @MinLength(1, { message: 'displayName must not be empty' })
  @MaxLength(DISPLAY_NAME_MAX_LENGTH)
  @NoControlCharacters()
  displayName: string;

  @IsString()
  @MinLength(PASSWORD_MIN_LENGTH, { message: `password must be at least ${PASSWORD_MIN_LENGTH} characters` })
  @MaxLength(PASSWORD_MAX_LENGTH)
  // Spaces inside a passphrase count; ten spaces, or a short word padded with them, do not.
  @ValidateBy({
    name: 'passwordLongEnough',
    validator: {
      validate: (v: unknown) => typeof v === 'string' && passwordLongEnough(v),
      defaultMessage: () =>
        `password must be at least ${PASSWORD_MIN_LENGTH} characters besides leading and trailing spaces`,
    },
  })
  password: string;
}
