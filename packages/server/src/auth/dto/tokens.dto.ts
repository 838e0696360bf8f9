import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MAX, PASSWORD_MIN, PASSWORD_RULE } from './password.rule';

const TOKEN = /^[A-Za-z0-9_-]{20,100}$/;

export class TokenDto {
  @ApiProperty({ description: 'The token from the e-mailed link' })
  @IsString()
  @Matches(TOKEN, { message: 'is not a valid link token' })
  token: string;
}

export class ForgotPasswordDto {
  @ApiProperty()
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsEmail({}, { message: 'must be an e-mail address' })
  @MaxLength(254, { message: 'must be at most 254 characters' })
  email: string;
}

export class ResetPasswordDto extends TokenDto {
  @ApiProperty({ description: PASSWORD_RULE })
  @IsString()
  @MinLength(PASSWORD_MIN, { message: PASSWORD_RULE })
  @MaxLength(PASSWORD_MAX, { message: PASSWORD_RULE })
  password: string;
}

export class ChangePasswordDto {
  @ApiProperty()
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(200)
  currentPassword: string;

  @ApiProperty({ description: PASSWORD_RULE })
  @IsString()
  @MinLength(PASSWORD_MIN, { message: PASSWORD_RULE })
  @MaxLength(PASSWORD_MAX, { message: PASSWORD_RULE })
  newPassword: string;
}

export class MessageResponse {
  @ApiProperty() message: string;
}
