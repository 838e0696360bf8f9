import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { LIMITS } from '@beadroll/core';
import {
  IsInt,
  IsISO4217CurrencyCode,
  IsOptional,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
} from 'class-validator';
import { NestedObject } from '../../common/validation';

/** Money in integer minor units of an ISO 4217 currency. */
export class MoneyDto {
  @ApiProperty({ description: 'integer minor units (cents, pence…)', minimum: 0, example: 4500 })
  @IsInt()
  @Min(0)
  @Max(Number.MAX_SAFE_INTEGER)
  amount: number;

  // The list of codes is validator.js's copy of ISO 4217; the pattern keeps them in capitals.
  @ApiProperty({ description: 'ISO 4217 code', example: 'EUR' })
  @IsISO4217CurrencyCode({ message: 'currency must be an ISO 4217 currency code' })
  @Matches(/^[A-Z]{3}$/, { message: 'currency must be written in capitals, as in EUR' })
  currency: string;
}

/** How a dealer acquired a lot: sealed, visible only to that dealer. */
export class AcquisitionDto {
  @ApiPropertyOptional({ example: '2026-05-14', description: 'YYYY-MM-DD' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'date must be a date YYYY-MM-DD' })
  date?: string;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, example: 'estate sale' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  source?: string;

  @ApiPropertyOptional({ type: MoneyDto })
  @NestedObject(() => MoneyDto, { optional: true })
  cost?: MoneyDto;
}

/** The sealed details a dealer may record with a registration or a new description. */
export class SealedDetailsDto {
  @ApiPropertyOptional({ maxLength: LIMITS.longText, description: 'where the lot is kept (sealed)' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  storageLocation?: string;

  @ApiPropertyOptional({ type: AcquisitionDto, description: 'sealed' })
  @NestedObject(() => AcquisitionDto, { optional: true })
  acquisition?: AcquisitionDto;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, description: 'private note (sealed)' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  privateNote?: string;
}
