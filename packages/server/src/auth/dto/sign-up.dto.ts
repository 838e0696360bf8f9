import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsIn, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MAX, PASSWORD_MIN, PASSWORD_RULE } from './password.rule';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export const HANDLE_PATTERN = /^[a-z0-9][a-z0-9-]{1,30}[a-z0-9]$/;

export class SignUpDto {
  @ApiProperty({ enum: ['dealer', 'assessor'] })
  @IsIn(['dealer', 'assessor'], { message: 'must be dealer or assessor' })
  role: 'dealer' | 'assessor';

  @ApiProperty({ example: 'Mira Perlova' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(80, { message: 'must be at most 80 characters' })
  displayName: string;

  @ApiProperty({ example: 'mira-beads', description: 'Lower-case, unique, never changed' })
  @IsString()
  @Matches(HANDLE_PATTERN, {
    message:
      'must be 3 to 32 lower-case letters, digits or hyphens, starting and ending with a letter or digit',
  })
  handle: string;

  @ApiProperty({ example: 'Perlova Trade Beads' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(120, { message: 'must be at most 120 characters' })
  business: string;

  @ApiProperty({ example: 'Pulegoso Brook' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(80, { message: 'must be at most 80 characters' })
  town: string;

  @ApiProperty({ example: 'Punty Reach' })
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'is required' })
  @MaxLength(80, { message: 'must be at most 80 characters' })
  country: string;

  @ApiProperty({ example: 'mira@example.invalid' })
  @Transform(trim)
  @IsEmail({}, { message: 'must be an e-mail address' })
  @MaxLength(254, { message: 'must be at most 254 characters' })
  email: string;

  @ApiProperty({ description: PASSWORD_RULE })
  @IsString()
  @MinLength(PASSWORD_MIN, { message: PASSWORD_RULE })
  @MaxLength(PASSWORD_MAX, { message: PASSWORD_RULE })
  password: string;
}
