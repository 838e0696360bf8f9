import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsOptional, IsString, IsUrl, Length, Matches, MaxLength } from 'class-validator';
import { AccountEmail, NewPassword } from './password.rule';
import { TrimmedText, trim } from '../../common/text-fields';

export const HANDLE_PATTERN = /^[a-z0-9][a-z0-9-]{1,30}[a-z0-9]$/;

export class SignUpDto {
  @ApiProperty({ enum: ['dealer', 'assessor'] })
  @IsIn(['dealer', 'assessor'], { message: 'must be dealer or assessor' })
  role: 'dealer' | 'assessor';

  @ApiProperty({ example: 'Mira Perlova' })
  @TrimmedText(80, { length: 1, message: 'is required' })
  displayName: string;

  @ApiProperty({ example: 'mira-beads', description: 'Lower-case, unique, never changed' })
  @IsString()
  @Matches(HANDLE_PATTERN, {
    message:
      'must be 3 to 32 lower-case letters, digits or hyphens, starting and ending with a letter or digit',
  })
  handle: string;

  @ApiProperty({ example: 'Perlova Trade Beads' })
  @TrimmedText(120, { length: 1, message: 'is required' })
  business: string;

  @ApiProperty({ example: 'Pulegoso Brook' })
  @TrimmedText(80, { length: 1, message: 'is required' })
  town: string;

  @ApiProperty({ example: 'Punty Reach' })
  @TrimmedText(80, { length: 2, message: 'is required' })
  country: string;

  @ApiProperty({
    example: '4 Quay Lane, Pulegoso Brook',
    description: 'the business address, for the registrar',
  })
  @Transform(trim)
  @Length(5, 300, {
    message: 'is required: the street, number and town of your business, at most 300 characters',
  })
  address: string;

  @ApiPropertyOptional({ example: 'https://perlova.example', description: 'the business website, if any' })
  @Transform(({ value }: { value: unknown }) =>
    typeof value === 'string' ? value.trim() || undefined : value,
  )
  @IsOptional()
  @IsUrl(
    { protocols: ['http', 'https'], require_protocol: true, require_tld: true },
    { message: 'must be a web address starting with https:// (or leave it empty)' },
  )
  @MaxLength(200, { message: 'must be at most 200 characters' })
  website?: string;

  @ApiProperty({
    description: 'dealers, fairs or associations who know your trade, for the registrar',
    example: 'Stand 14 at the Pulegoso Brook bead fair since 2019; buys from Rue Lampwork Finds.',
  })
  @Transform(trim)
  @Length(10, 2000, {
    message:
      'is required: name at least one dealer, fair or association who knows your trade, in at most 2,000 characters',
  })
  tradeReferences: string;

  @ApiProperty({ example: 'mira@example.invalid' })
  @AccountEmail()
  email: string;

  @NewPassword()
  password: string;
}
