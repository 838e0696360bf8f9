import { ApiProperty } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsString,
  MaxLength,
  ValidateNested,
  IsObject,
} from 'class-validator';
import { CountDto, LotDescriptionDto } from '../../lots/dto/lot-description.dto';
import { NestedField } from '../../common/validation';

/** The largest number of lots one split makes (the ledger format allows 500 children). */
export const MAX_SPLIT_CHILDREN = 500;
/** The largest number of lots one combination takes from. */
export const MAX_COMBINED_PARTS = 100;

/** One new lot of a split: its full description, whose count is the beads it takes. */
export class SplitChildDto {
  @NestedField(LotDescriptionDto, { description: 'the count is the beads this child takes' })
  description: LotDescriptionDto;
}

/** Divides a lot into two or more new lots; what the children do not take stays with the lot. */
export class SplitLotDto {
  @ApiProperty({ type: [SplitChildDto], minItems: 2, maxItems: MAX_SPLIT_CHILDREN })
  @IsArray()
  @ArrayMinSize(2, { message: 'a split makes at least two lots' })
  @ArrayMaxSize(MAX_SPLIT_CHILDREN)
  @IsObject({ each: true })
  @ValidateNested({ each: true })
  @Type(() => SplitChildDto)
  children: SplitChildDto[];
}

/** Beads taken from one lot for a combination: a count, or the whole remaining lot when left out. */
export class CombinedPartDto {
  @ApiProperty({ description: 'lot code (hyphens and case as typed are fine)', example: '7K2Q-M9XA-T' })
  @IsString()
  @MaxLength(20)
  lot: string;

  @NestedField(CountDto, { optional: true, description: 'left out: every bead the lot still holds' })
  count?: CountDto;
}

/** Makes a new lot from beads of several lots the dealer holds. */
export class CombineLotsDto {
  @ApiProperty({ type: [CombinedPartDto], minItems: 2, maxItems: MAX_COMBINED_PARTS })
  @IsArray()
  @ArrayMinSize(2, {
    message: 'a combination takes beads from at least two lots (to divide one lot, split it)',
  })
  @ArrayMaxSize(MAX_COMBINED_PARTS)
  @IsObject({ each: true })
  @ValidateNested({ each: true })
  @Type(() => CombinedPartDto)
  parts: CombinedPartDto[];

  @NestedField(LotDescriptionDto, {
    description: 'the new lot; its count is the sum of the beads taken (estimated if any part is)',
  })
  description: LotDescriptionDto;
}
