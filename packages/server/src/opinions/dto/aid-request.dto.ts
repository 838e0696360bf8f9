import { ApiPropertyOptional } from '@nestjs/swagger';
import {
  DECORATIONS,
  LIMITS,
  ORIGINS,
  TECHNIQUES,
  type Decoration,
  type Origin,
  type Technique,
  yearProblem,
} from '@beadroll/core';
import { ArrayMaxSize, IsArray, IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { ObservationsDto } from '../../lots/dto/observations.dto';
import { thisYear, YEAR_MAX, YEAR_MIN } from './opinion-requests.dto';
import { Plausible } from '../../common/plausible';
import { NestedField, OptionalChoice } from '../../common/validation';

/** A drafted period for the plausibility checks (the approximate flag does not matter to them). */
export class AidPeriodDto {
  @ApiPropertyOptional({ minimum: YEAR_MIN, maximum: YEAR_MAX })
  @Plausible((v) => yearProblem(v, thisYear()))
  from: number;

  @ApiPropertyOptional({ minimum: YEAR_MIN, maximum: YEAR_MAX })
  @Plausible((v) => yearProblem(v, thisYear()))
  to: number;
}

/** The opinion being drafted, as far as it goes. */
export class AidDraftDto {
  @OptionalChoice(ORIGINS) origin?: Origin;

  @OptionalChoice(TECHNIQUES) technique?: Technique;

  @NestedField(AidPeriodDto, { optional: true })
  period?: AidPeriodDto;
}

/** What the attribution aid reads: clues, decoration, words written on the lot and a draft; every part optional. */
export class AttributionAidDto {
  @NestedField(ObservationsDto, { optional: true })
  observations?: ObservationsDto;

  @ApiPropertyOptional({ enum: DECORATIONS, isArray: true })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(DECORATIONS.length)
  @IsIn(DECORATIONS, { each: true })
  decoration?: Decoration[];

  @ApiPropertyOptional({
    type: [String],
    maxItems: 50,
    description:
      'what is written on the lot (title, description, notes); brings the uranium and lead cautions when they name such glass',
    example: ['Uranium glass pressed beads'],
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @IsString({ each: true })
  @MaxLength(LIMITS.longText, { each: true })
  words?: string[];

  @ApiPropertyOptional({
    enum: ORIGINS,
    isArray: true,
    description: 'origins named by opinions already on the record',
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(ORIGINS.length)
  @IsIn(ORIGINS, { each: true })
  recordedOrigins?: Origin[];

  @NestedField(AidDraftDto, { optional: true })
  draft?: AidDraftDto;
}
