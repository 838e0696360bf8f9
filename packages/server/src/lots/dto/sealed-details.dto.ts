import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { amountProblem, currencyProblem, dateProblem, LIMITS, type Money } from '@beadroll/core';
import { IsOptional, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { NestedField } from '../../common/validation';
import { nowIso, Plausible } from '../../common/plausible';

/** Money in integer minor units of an ISO 4217 currency: core's `Money`, in requests and answers alike. */
export class MoneyDto implements Money {
  @ApiProperty({
    description: 'integer minor units of the currency (cents, pence…)',
    minimum: 1,
    example: 4500,
  })
  @Plausible((v, o) => amountProblem(v, o.currency))
  amount: number;

  // The list of codes is core's (ISO 4217 from the currency-codes package).
  @ApiProperty({ description: 'ISO 4217 code', example: 'EUR' })
  @Plausible(currencyProblem)
  currency: string;
}

/** How a dealer acquired a lot: sealed, visible only to that dealer. */
export class AcquisitionDto {
  @ApiPropertyOptional({ example: '2026-05-14', description: 'YYYY-MM-DD' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'Enter the date as YYYY-MM-DD' })
  @Plausible((v) => dateProblem(v, nowIso()))
  date?: string;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, example: 'estate sale' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  source?: string;

  @NestedField(MoneyDto, { optional: true })
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

  @NestedField(AcquisitionDto, { optional: true, description: 'sealed' })
  acquisition?: AcquisitionDto;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, description: 'private note (sealed)' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  privateNote?: string;
}
