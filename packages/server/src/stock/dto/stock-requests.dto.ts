import { ExportFormatQueryDto } from '../../export/export-query.dto';

/** Which file the stock export writes. */
export class StockExportQueryDto extends ExportFormatQueryDto {}
