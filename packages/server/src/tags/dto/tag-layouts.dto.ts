import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { type DesignFit, type Paper, TAG_DESIGNS, type TagDesign } from '../tag-layout';

/** A width and height in millimetres. */
export class SizeMm {
  @ApiProperty() widthMm: number;
  @ApiProperty() heightMm: number;
}

/** How one tag design fares with the service's public host at its default size. */
export class DesignFitResponse implements DesignFit {
  @ApiProperty({ enum: TAG_DESIGNS }) design: TagDesign;
  @ApiProperty({ description: 'whether a phone reads the QR symbol reliably at this size' }) fits: boolean;
  @ApiPropertyOptional({ description: 'the printed size of one QR module' }) moduleMm?: number;
  @ApiPropertyOptional({ description: 'why it does not fit, in words' }) reason?: string;
}

/** Each design's default tag size. */
export class DesignSizes implements Record<TagDesign, SizeMm> {
  @ApiProperty({ type: SizeMm }) string: SizeMm;
  @ApiProperty({ type: SizeMm }) barbell: SizeMm;
}

/** Each sheet paper's size. */
export class PaperSizes implements Record<Paper, SizeMm> {
  @ApiProperty({ type: SizeMm }) a4: SizeMm;
  @ApiProperty({ type: SizeMm }) letter: SizeMm;
}

/** Tag designs and sheets, and whether each design fits the public host's QR symbol. */
export class TagLayoutsResponse {
  @ApiProperty({ description: 'the public host the tags’ QR codes name' }) host: string;
  @ApiProperty({ description: 'the QR version that host needs' }) version: number;
  @ApiProperty({ type: [DesignFitResponse] }) designs: DesignFitResponse[];
  @ApiProperty({ type: DesignSizes }) defaults: DesignSizes;
  @ApiProperty({ type: PaperSizes }) papers: PaperSizes;
}
