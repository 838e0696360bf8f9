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
import { NestedObject } from '../../common/validation';

/** A label sheet: paper, grid and spacing in millimetres. */
export class SheetDto {
  @ApiProperty({ enum: Object.keys(PAPERS) })
  @IsIn(Object.keys(PAPERS))
  paper: Paper;

  @ApiPropertyOptional({ description: 'columns of labels; omitted: as many as fit' })
  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(GRID_LIMITS.maxCells)
  columns?: number;

  @ApiPropertyOptional({ description: 'rows of labels; omitted: as many as fit' })
  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(GRID_LIMITS.maxCells)
  rows?: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxMarginMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxMarginMm)
  marginTopMm: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxMarginMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxMarginMm)
  marginRightMm: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxMarginMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxMarginMm)
  marginBottomMm: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxMarginMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxMarginMm)
  marginLeftMm: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxGapMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxGapMm)
  gapXMm: number;

  @ApiProperty({ minimum: 0, maximum: GRID_LIMITS.maxGapMm })
  @IsNumber()
  @Min(0)
  @Max(GRID_LIMITS.maxGapMm)
  gapYMm: number;

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

  @ApiPropertyOptional({ type: SheetDto, description: 'omitted: one label per page, for a label printer' })
  @NestedObject(() => SheetDto, { optional: true })
  sheet?: SheetDto;
}

/** Unlisted lots the holder confirms should get a public page. */
export class ListLotsDto extends PickType(PrintTagsDto, ['lots'] as const) {}
