import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  CONFIDENCES,
  LIMITS,
  ORIGINS,
  QUALIFIERS,
  TECHNIQUES,
  type Confidence,
  type Origin,
  type Qualifier,
  type Technique,
  BOUNDS,
  yearProblem,
} from '@beadroll/core';
import {
  ArrayMaxSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  Min,
  MinLength,
} from 'class-validator';
import { NestedField, OptionalText } from '../../common/validation';
import { nowIso, Plausible } from '../../common/plausible';

/** Earliest year a period may name (core's bounds); the latest is this year. */
export const YEAR_MIN = BOUNDS.year.min;
export const YEAR_MAX = 9999;

/** This year (UTC), the latest a period may reach. */
export function thisYear(): number {
  return new Date(nowIso()).getUTCFullYear();
}

/** A closed year range; `approximate` reads "about 1850–1900". */
export class PeriodDto {
  @ApiProperty({ minimum: YEAR_MIN, maximum: YEAR_MAX, example: 1850 })
  @Plausible((v) => yearProblem(v, thisYear()))
  from: number;

  @ApiProperty({ minimum: YEAR_MIN, maximum: YEAR_MAX, example: 1900 })
  @Plausible((v) => yearProblem(v, thisYear()))
  to: number;

  @ApiProperty()
  @IsBoolean()
  approximate: boolean;
}

/** The earlier opinion an opinion adopts: an entry on this lot or on one of its ancestors. */
export class AdoptedOpinionDto {
  @ApiProperty({ description: 'canonical code of the lot the earlier opinion is recorded on' })
  @IsString()
  @Matches(/^[0-9A-HJKMNP-TV-Z]{9}$/, { message: 'must be a lot code of 9 symbols, upper case, no dashes' })
  lot: string;

  @ApiProperty({ minimum: 0 })
  @IsInt()
  @Min(0)
  seq: number;

  @ApiProperty({ description: 'entry hash of the earlier opinion' })
  @IsString()
  @Matches(/^[0-9a-f]{64}$/, { message: 'must be an entry hash (64 lower-case hex digits)' })
  hash: string;
}

/** An attribution opinion (an `opinion` entry). */
export class RecordOpinionDto {
  @ApiProperty({ enum: ORIGINS })
  @IsIn(ORIGINS)
  origin: Origin;

  @ApiPropertyOptional({ maxLength: LIMITS.shortText, description: 'free text beside the region' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.shortText)
  originNote?: string;

  @NestedField(PeriodDto)
  period: PeriodDto;

  @ApiProperty({ enum: TECHNIQUES })
  @IsIn(TECHNIQUES)
  technique: Technique;

  @OptionalText(LIMITS.longText)
  decoration?: string;

  @ApiProperty({
    enum: QUALIFIERS,
    description: 'cataloguing certainty: by, attributed to, in the style of, later copy',
  })
  @IsIn(QUALIFIERS)
  qualifier: Qualifier;

  @ApiProperty({ enum: CONFIDENCES })
  @IsIn(CONFIDENCES)
  confidence: Confidence;

  @ApiProperty({ maxLength: LIMITS.longText })
  @IsString()
  @MaxLength(LIMITS.longText)
  rationale: string;

  @ApiProperty({
    type: [String],
    description: 'SHA-256 of the original of each cited exhibit, already on this lot’s roll',
  })
  @IsArray()
  @ArrayMaxSize(LIMITS.listItems)
  @ArrayUnique()
  @Matches(/^[0-9a-f]{64}$/, { each: true, message: 'each exhibit must be a SHA-256 in lower-case hex' })
  exhibits: string[];

  @NestedField(AdoptedOpinionDto, {
    optional: true,
    description: 'the earlier opinion, on this lot or an ancestor, whose attribution this one adopts',
  })
  adopts?: AdoptedOpinionDto;
}

/** Withdraws one's own opinion (an `opinion-withdrawn` entry). */
export class WithdrawOpinionDto {
  @OptionalText(LIMITS.longText)
  note?: string;
}

/** The holder's answer to an opinion (a `note` entry referring to it). */
export class ReplyDto {
  @ApiProperty({ minLength: 1, maxLength: LIMITS.longText })
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  text: string;
}
