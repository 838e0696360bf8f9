import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional } from 'class-validator';
import { EXPORT_FORMATS, type ExportFormat } from '../../export/sheet-export';

/** Which file the stock export writes. */
export class StockExportQueryDto {
  @ApiPropertyOptional({ enum: EXPORT_FORMATS, default: 'csv' })
  @IsOptional()
  @IsIn(EXPORT_FORMATS, { message: 'format must be csv or xlsx' })
  format?: ExportFormat;
}
