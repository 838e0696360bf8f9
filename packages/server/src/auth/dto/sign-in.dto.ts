import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';

export class SignInDto {
  @ApiProperty({ example: 'dealer@example.invalid' })
  @IsEmail({}, { message: 'must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @ApiProperty()
  @IsString()
  @MinLength(1, { message: 'is required' })
  @MaxLength(200)
  password: string;
}
