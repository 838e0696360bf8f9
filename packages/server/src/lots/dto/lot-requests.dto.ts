import { ApiProperty, ApiPropertyOptional, IntersectionType, OmitType } from '@nestjs/swagger';
import {
  LIMITS,
  LOT_FORMS,
  ORIGINS,
  TECHNIQUES,
  type LotForm,
  type LotStatus,
  type Origin,
  type Technique,
} from '@beadroll/core';
import { Transform, Type } from 'class-transformer';
import { IsBoolean, IsInt, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { LotDescriptionDto } from './lot-description.dto';
import { ObservationsDto } from './observations.dto';
import { SealedDetailsDto } from './sealed-details.dto';
import { NestedField, OptionalChoice } from '../../common/validation';
import { ExportFormatQueryDto } from '../../export/export-query.dto';

/** Registers a new lot: a `registered` entry (and an `observed` one when observations are given). */
export class CreateLotDto {
  @NestedField(LotDescriptionDto)
  description: LotDescriptionDto;

  @NestedField(ObservationsDto, { optional: true })
  observations?: ObservationsDto;

  @NestedField(SealedDetailsDto, { optional: true, description: 'visible only to the registering dealer' })
  sealed?: SealedDetailsDto;
}

/** Names the earlier entry a new description or observation corrects, and why. */
export class CorrectionDto {
  @ApiProperty({ description: 'seq of the earlier entry (a description, or an observation)', example: 0 })
  @IsInt({ message: 'Choose the entry this corrects' })
  @Min(0, { message: 'Choose the entry this corrects' })
  seq: number;

  @ApiProperty({ maxLength: LIMITS.longText, example: 'The colour was written wrong' })
  @IsString()
  @MinLength(1, { message: 'Say what was wrong' })
  @MaxLength(LIMITS.longText)
  reason: string;
}

/** A full new description (a `described` entry), optionally with new sealed details. */
export class DescribeLotDto {
  @NestedField(CorrectionDto, {
    optional: true,
    description: 'when this description corrects an earlier one',
  })
  corrects?: CorrectionDto;

  @NestedField(LotDescriptionDto)
  description: LotDescriptionDto;

  @NestedField(SealedDetailsDto, { optional: true })
  sealed?: SealedDetailsDto;
}

/** New observations (an `observed` entry). */
export class ObserveLotDto {
  @NestedField(CorrectionDto, { optional: true, description: 'when these observations correct earlier ones' })
  corrects?: CorrectionDto;

  @NestedField(ObservationsDto)
  observations: ObservationsDto;
}

/** Lists or unlists a lot: written on the roll as a `described` entry. */
export class SetListingDto {
  @ApiProperty()
  @IsBoolean()
  listed: boolean;
}

const STATUSES: readonly LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];
export const LOT_SORTS = [
  'registered',
  'updated',
  'title',
  'code',
  'form',
  'count',
  'origin',
  'period',
  'technique',
  'status',
  'listed',
] as const;

const toBool = ({ value }: { value: unknown }) =>
  value === 'true' ? true : value === 'false' ? false : value;

/** Paging, sorting, filters and text search of the lot list. */
export class ListLotsQueryDto {
  @ApiPropertyOptional({ minimum: 1, default: 1 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(100000)
  page?: number;

  @ApiPropertyOptional({ minimum: 1, maximum: 100, default: 20 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(100)
  pageSize?: number;

  @OptionalChoice(LOT_SORTS, { default: 'registered' }) sort?: (typeof LOT_SORTS)[number];

  @OptionalChoice(['asc', 'desc'], { default: 'desc' }) order?: 'asc' | 'desc';

  @OptionalChoice(STATUSES) status?: LotStatus;

  @OptionalChoice(LOT_FORMS) form?: LotForm;

  @OptionalChoice(ORIGINS, { description: 'origin of the attribution on record' }) origin?: Origin;

  @ApiPropertyOptional({ type: Boolean })
  @IsOptional()
  @Transform(toBool)
  @IsBoolean()
  listed?: boolean;

  @ApiPropertyOptional({ type: Boolean, description: 'only lots the signed-in account holds' })
  @IsOptional()
  @Transform(toBool)
  @IsBoolean()
  mine?: boolean;

  @OptionalChoice(TECHNIQUES, { description: 'technique of the attribution on record' })
  technique?: Technique;

  @ApiPropertyOptional({
    maxLength: 200,
    description:
      'words or the start of a code (with or without hyphens) to find in the code, title, description, attribution on record and your own storage place',
  })
  @IsOptional()
  @IsString()
  @MaxLength(200)
  q?: string;
}

/** The inventory as a file: the list's filters, search and sort, every page. */
export class ExportLotsQueryDto extends IntersectionType(
  OmitType(ListLotsQueryDto, ['page', 'pageSize'] as const),
  ExportFormatQueryDto,
) {}
