import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { AccountEmail, NewPassword } from './password.rule';

const TOKEN = /^[A-Za-z0-9_-]{20,100}$/;

export class TokenDto {
  @ApiProperty({ description: 'The token from the e-mailed link' })
  @IsString()
  @Matches(TOKEN, { message: 'is not a valid link token' })
  token: string;
}

export class ForgotPasswordDto {
  @ApiProperty()
  @AccountEmail()
  email: string;
}

export class ResetPasswordDto extends TokenDto {
  @NewPassword()
  password: string;
}

export class ChangePasswordDto {
  @ApiProperty()
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(200)
  currentPassword: string;

  @NewPassword()
  newPassword: string;
}

export class MessageResponse {
  @ApiProperty() message: string;
}
