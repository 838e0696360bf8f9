import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  BASE_GLASS,
  beadSizeProblem,
  BOUNDS,
  countProblem,
  DECORATIONS,
  strandLengthProblem,
  LIMITS,
  LOT_FORMS,
  type BaseGlass,
  type Decoration,
  type LotForm,
} from '@beadroll/core';
import {
  ArrayMaxSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  MaxLength,
  MinLength,
  registerDecorator,
  type ValidationArguments,
} from 'class-validator';
import { NestedField, OptionalText } from '../../common/validation';
import { Plausible } from '../../common/plausible';

/** A count of beads, exact or estimated. */
export class CountDto {
  @ApiProperty({ minimum: BOUNDS.count.min, maximum: BOUNDS.count.max, example: 120 })
  @Plausible(countProblem)
  value: number;

  @ApiProperty({ description: 'true when the count is an estimate' })
  @IsBoolean()
  estimated: boolean;
}

function MinNotAboveMax() {
  return (target: object, propertyName: string) =>
    registerDecorator({
      name: 'minNotAboveMax',
      target: target.constructor,
      propertyName,
      validator: {
        validate: (value: unknown, args: ValidationArguments) => {
          const o = args.object as { max?: unknown };
          return typeof value !== 'number' || typeof o.max !== 'number' || value <= o.max;
        },
        defaultMessage: () => 'Enter a smallest bead size that is not larger than the largest',
      },
    });
}

/** Bead diameter range in mm. */
export class DiameterDto {
  @ApiProperty({ minimum: BOUNDS.beadSizeMm.min, maximum: BOUNDS.beadSizeMm.max, example: 6 })
  @Plausible(beadSizeProblem)
  @MinNotAboveMax()
  min: number;

  @ApiProperty({ minimum: BOUNDS.beadSizeMm.min, maximum: BOUNDS.beadSizeMm.max, example: 9.5 })
  @Plausible(beadSizeProblem)
  max: number;
}

/** The public description of a lot: each registration or new description holds a full one. */
export class LotDescriptionDto {
  @ApiProperty({ maxLength: LIMITS.title, example: 'Venetian wound beads with pink roses' })
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.title)
  title: string;

  @ApiPropertyOptional({ maxLength: LIMITS.longText, description: 'free-text description' })
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(LIMITS.longText)
  summary?: string;

  @ApiProperty({ enum: LOT_FORMS })
  @IsIn(LOT_FORMS)
  form: LotForm;

  @NestedField(CountDto)
  count: CountDto;

  @NestedField(DiameterDto, { optional: true })
  diameterMm?: DiameterDto;

  @ApiPropertyOptional({
    description: 'strand length in mm (1 in = 25.4 mm)',
    minimum: BOUNDS.strandLengthMm.min,
    maximum: BOUNDS.strandLengthMm.max,
  })
  @IsOptional()
  @Plausible(strandLengthProblem)
  strandLengthMm?: number;

  @ApiProperty({ type: [String], maxItems: LIMITS.listItems, example: ['white', 'pink'] })
  @IsArray()
  @ArrayMaxSize(LIMITS.listItems)
  @IsString({ each: true })
  @MinLength(1, { each: true })
  @MaxLength(LIMITS.shortText, { each: true })
  colours: string[];

  @ApiProperty({ enum: BASE_GLASS, isArray: true })
  @IsArray()
  @ArrayUnique()
  @IsIn(BASE_GLASS, { each: true })
  baseGlass: BaseGlass[];

  @ApiProperty({ enum: DECORATIONS, isArray: true })
  @IsArray()
  @ArrayUnique()
  @IsIn(DECORATIONS, { each: true })
  decoration: Decoration[];

  @OptionalText(LIMITS.longText)
  decorationNote?: string;

  @OptionalText(LIMITS.longText)
  condition?: string;

  @ApiProperty({ description: 'true: the lot has a public page' })
  @IsBoolean()
  listed: boolean;
}
