import { EXHIBIT_KINDS, type ExhibitKind } from '@beadroll/core';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';

/** The text fields sent with an exhibit file (multipart/form-data). */
export class AddExhibitDto {
  @ApiProperty({ enum: EXHIBIT_KINDS })
  @IsIn(EXHIBIT_KINDS as unknown as string[], { message: `must be one of ${EXHIBIT_KINDS.join(', ')}` })
  kind: ExhibitKind;

  @ApiPropertyOptional({ maxLength: 1000 })
  @IsOptional()
  @IsString()
  @MaxLength(1000, { message: 'must be at most 1000 characters' })
  caption?: string;

  /** "true" keeps the whole exhibit sealed (receipts always are). */
  @ApiPropertyOptional({ enum: ['true', 'false'] })
  @IsOptional()
  @IsIn(['true', 'false'], { message: 'must be true or false' })
  sealed?: 'true' | 'false';
}

/** The binary file field, for the OpenAPI document. */
export class AddExhibitBodyDoc extends AddExhibitDto {
  @ApiProperty({ type: 'string', format: 'binary' })
  file: unknown;
}
