import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional } from 'class-validator';
import { EXPORT_FORMATS, type ExportFormat } from './sheet-export';

/** Which file an export writes (CSV when left out). */
export class ExportFormatQueryDto {
  @ApiPropertyOptional({ enum: EXPORT_FORMATS, default: 'csv' })
  @IsOptional()
  @IsIn(EXPORT_FORMATS, { message: 'format must be csv or xlsx' })
  format?: ExportFormat;
}
