import { ApiProperty, ApiPropertyOptional, PickType } from '@nestjs/swagger';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
} from 'class-validator';
import { GRID_LIMITS, LABEL_LIMITS, PAPERS, TAG_DESIGNS, type Paper, type TagDesign } from '../tag-layout';
import { MAX_TAGS_PER_PDF } from '../tag-pdf.service';
import { NestedField } from '../../common/validation';
import { stacked } from '../../common/stacked';

/** A length on the sheet in millimetres, from 0 to `max`. */
const Millimetres = (max: number) =>
  stacked(ApiProperty({ minimum: 0, maximum: max }), IsNumber(), Min(0), Max(max));

/** How many labels across or down; omitted: as many as fit. */
const GridCells = (description: string) =>
  stacked(ApiPropertyOptional({ description }), IsOptional(), IsInt(), Min(1), Max(GRID_LIMITS.maxCells));

/** A label sheet: paper, grid and spacing in millimetres. */
export class SheetDto {
  @ApiProperty({ enum: Object.keys(PAPERS) })
  @IsIn(Object.keys(PAPERS))
  paper: Paper;

  @GridCells('columns of labels; omitted: as many as fit') columns?: number;
  @GridCells('rows of labels; omitted: as many as fit') rows?: number;

  @Millimetres(GRID_LIMITS.maxMarginMm) marginTopMm: number;
  @Millimetres(GRID_LIMITS.maxMarginMm) marginRightMm: number;
  @Millimetres(GRID_LIMITS.maxMarginMm) marginBottomMm: number;
  @Millimetres(GRID_LIMITS.maxMarginMm) marginLeftMm: number;
  @Millimetres(GRID_LIMITS.maxGapMm) gapXMm: number;
  @Millimetres(GRID_LIMITS.maxGapMm) gapYMm: number;

  @ApiPropertyOptional({ description: 'cells already used on the first sheet' })
  @IsOptional()
  @IsInt()
  @Min(0)
  skip?: number;

  @ApiPropertyOptional({ description: 'draw thin cutting lines around each cell' })
  @IsOptional()
  @IsBoolean()
  outline?: boolean;
}

/** Tags for one lot or a selection, in one design, on a label printer or a sheet. */
export class PrintTagsDto {
  @ApiProperty({ type: [String], description: 'lot codes the dealer holds' })
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(MAX_TAGS_PER_PDF)
  @IsString({ each: true })
  @MaxLength(20, { each: true })
  lots: string[];

  @ApiProperty({ enum: TAG_DESIGNS })
  @IsIn(TAG_DESIGNS)
  design: TagDesign;

  @IsOptional()
  @IsNumber()
  @Min(LABEL_LIMITS.minMm)
  @Max(LABEL_LIMITS.maxMm)
  labelWidthMm?: number;

  @IsOptional()
  @IsNumber()
  @Min(LABEL_LIMITS.minMm)
  @Max(LABEL_LIMITS.maxMm)
  labelHeightMm?: number;

  @NestedField(SheetDto, { optional: true, description: 'omitted: one label per page, for a label printer' })
  sheet?: SheetDto;
}

/** Unlisted lots the holder confirms should get a public page. */
export class ListLotsDto extends PickType(PrintTagsDto, ['lots'] as const) {}
