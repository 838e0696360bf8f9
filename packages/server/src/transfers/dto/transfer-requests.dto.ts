import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { LIMITS } from '@beadroll/core';
import { Transform } from 'class-transformer';
import {
  IsEmail,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
  ValidateIf,
} from 'class-validator';
import { PageQueryDto } from '../../common/page-query.dto';
import { MoneyDto } from '../../lots/dto/sealed-details.dto';
import { OFFER_STATUSES, type OfferStatus } from '../entities/transfer-offer.entity';
import { NestedField, OptionalChoice, OptionalText } from '../../common/validation';
import { trim } from '../../common/text-fields';

/**
 * Offers a lot to a verified dealer (by account id, from the dealer search) or to an e-mail
 * address (an invitation when no verified dealer has it). Exactly one of the two.
 */
export class CreateOfferDto {
  @ApiProperty({ description: 'lot code, with or without hyphens', example: '7K2Q-M9XA-T' })
  @IsString()
  @MaxLength(20)
  lot: string;

  @ApiPropertyOptional({ description: 'account id of a verified dealer (from the dealer search)' })
  @ValidateIf((o: CreateOfferDto) => o.email === undefined || o.recipient !== undefined)
  @IsUUID('all', { message: 'recipient must be a dealer chosen from the search, or give an e-mail address' })
  recipient?: string;

  @ApiPropertyOptional({ description: 'e-mail address of a dealer who may not have an account yet' })
  @ValidateIf((o: CreateOfferDto) => o.email !== undefined)
  @Transform(trim)
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email?: string;

  @ApiPropertyOptional({
    maxLength: LIMITS.longText,
    description: 'shown on the roll to everyone who reads it',
  })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  note?: string;

  @NestedField(MoneyDto, { optional: true, description: 'sealed: visible to the two dealers only' })
  price?: MoneyDto;
}

/** Accepts, declines or withdraws an offer, optionally with a note (public on the roll). */
export class AnswerOfferDto {
  @OptionalText(LIMITS.longText)
  note?: string;
}

/** Voids the lot's sale recorded by mistake (`sale-voided`), within 24 hours of it. */
export class VoidSaleDto {
  @ApiPropertyOptional({ maxLength: LIMITS.longText, example: 'Recorded on the wrong lot' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  reason?: string;
}

/** Records a sale to a private buyer (`sold`). */
export class RecordSaleDto {
  @ApiProperty({ description: 'lot code, with or without hyphens' })
  @IsString()
  @MaxLength(20)
  lot: string;

  @ApiProperty({ example: '2026-05-16', description: 'day of the sale, YYYY-MM-DD' })
  @IsString({ message: 'date must be a date YYYY-MM-DD' })
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'date must be a date YYYY-MM-DD' })
  date: string;

  @NestedField(MoneyDto, {
    missing: 'price is required: the amount and its currency',
    description: 'sealed: visible to the seller only',
  })
  price: MoneyDto;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, description: 'sealed: visible to the seller only' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  buyerNote?: string;

  @ApiPropertyOptional({
    description: 'used once to send the buyer a receipt with the public page; never stored',
  })
  @IsOptional()
  @Transform(trim)
  @IsEmail({}, { message: 'buyerEmail must be an e-mail address' })
  @MaxLength(254)
  buyerEmail?: string;
}

export const OFFER_BOXES = ['incoming', 'outgoing'] as const;

/** The signed-in dealer's incoming or outgoing offers. */
export class ListOffersQueryDto extends PageQueryDto {
  @ApiProperty({ enum: OFFER_BOXES })
  @IsIn(OFFER_BOXES, { message: `box must be one of ${OFFER_BOXES.join(', ')}` })
  box: (typeof OFFER_BOXES)[number];

  @OptionalChoice(OFFER_STATUSES, { message: `status must be one of ${OFFER_STATUSES.join(', ')}` })
  status?: OfferStatus;

  @ApiPropertyOptional({ description: 'only offers of this lot (code, with or without hyphens)' })
  @IsOptional()
  @IsString()
  @MaxLength(20)
  lot?: string;
}

/** The signed-in dealer's sales. */
export class ListSalesQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ description: 'sold on or after, YYYY-MM-DD' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'from must be a date YYYY-MM-DD' })
  from?: string;

  @ApiPropertyOptional({ description: 'sold on or before, YYYY-MM-DD' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'to must be a date YYYY-MM-DD' })
  to?: string;

  @ApiPropertyOptional({ enum: ['sent', 'none'], description: 'whether a receipt went to the buyer' })
  @IsOptional()
  @IsIn(['sent', 'none'], { message: 'receipt must be sent or none' })
  receipt?: 'sent' | 'none';
}

/** Searches verified dealers by name, handle or business. */
export class DealerSearchQueryDto {
  @ApiProperty({ minLength: 2, maxLength: 80 })
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'q must be at least 2 characters' })
  @MaxLength(80)
  q: string;
}
