import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsNotEmpty, IsString, MaxLength } from 'class-validator';
import {
  type CreateMachineProfileRequest,
  MACHINE_PROFILE_KINDS,
  MACHINE_PROFILE_LIMITS as L,
  type MachineProfileKind,
} from '@kerfwright/contracts';
import { NoControlCharacters } from '../../common/text';
import { ProfileVersionContentDto } from './profile-version-content.dto';

/** A new profile; its content becomes version 1, a draft. */
export class CreateMachineProfileDto extends ProfileVersionContentDto implements CreateMachineProfileRequest {
  @ApiProperty({ maxLength: L.nameLength, example: 'Bay 2 CO2 laser' })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @IsNotEmpty()
  @MaxLength(L.nameLength)
  @NoControlCharacters()
  name: string;

  @ApiProperty({ enum: MACHINE_PROFILE_KINDS })
  @IsIn(MACHINE_PROFILE_KINDS)
  kind: MachineProfileKind;
}
