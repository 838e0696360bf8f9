import { ApiPropertyOptional } from '@nestjs/swagger';
import {
  DECORATIONS,
  ORIGINS,
  TECHNIQUES,
  type Decoration,
  type Origin,
  type Technique,
} from '@beadroll/core';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsIn,
  IsInt,
  IsOptional,
  Max,
  Min,
  ValidateNested,
  IsObject,
} from 'class-validator';
import { ObservationsDto } from '../../lots/dto/observations.dto';
import { YEAR_MAX, YEAR_MIN } from './opinion-requests.dto';

/** A drafted period for the plausibility checks (the approximate flag does not matter to them). */
export class AidPeriodDto {
  @ApiPropertyOptional({ minimum: YEAR_MIN, maximum: YEAR_MAX })
  @IsInt()
  @Min(YEAR_MIN)
  @Max(YEAR_MAX)
  from: number;

  @ApiPropertyOptional({ minimum: YEAR_MIN, maximum: YEAR_MAX })
  @IsInt()
  @Min(YEAR_MIN)
  @Max(YEAR_MAX)
  to: number;
}

/** The opinion being drafted, as far as it goes. */
export class AidDraftDto {
  @ApiPropertyOptional({ enum: ORIGINS })
  @IsOptional()
  @IsIn(ORIGINS)
  origin?: Origin;

  @ApiPropertyOptional({ enum: TECHNIQUES })
  @IsOptional()
  @IsIn(TECHNIQUES)
  technique?: Technique;

  @ApiPropertyOptional({ type: AidPeriodDto })
  @IsOptional()
  @IsObject()
  @ValidateNested()
  @Type(() => AidPeriodDto)
  period?: AidPeriodDto;
}

/** What the attribution aid reads: clues, decoration and a draft; every part optional. */
export class AttributionAidDto {
  @ApiPropertyOptional({ type: ObservationsDto })
  @IsOptional()
  @IsObject()
  @ValidateNested()
  @Type(() => ObservationsDto)
  observations?: ObservationsDto;

  @ApiPropertyOptional({ enum: DECORATIONS, isArray: true })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(DECORATIONS.length)
  @IsIn(DECORATIONS, { each: true })
  decoration?: Decoration[];

  @ApiPropertyOptional({ type: AidDraftDto })
  @IsOptional()
  @IsObject()
  @ValidateNested()
  @Type(() => AidDraftDto)
  draft?: AidDraftDto;
}
