import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { EXPORT_FORMATS, type ExportFormat } from '../../export/sheet-export';

/** The multipart fields beside the file: how the sheet's columns map to a lot's fields. */
export class ImportFormDto {
  @ApiPropertyOptional({
    description: 'JSON object: field key → 0-based column index (left out: the suggested mapping)',
    example: '{"title":0,"form":1,"count":2}',
  })
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  mapping?: string;
}

export class TemplateQueryDto {
  @ApiProperty({ enum: EXPORT_FORMATS })
  @IsIn(EXPORT_FORMATS)
  format: ExportFormat;
}

export class ImportFieldResponse {
  @ApiProperty() key: string;
  @ApiProperty() header: string;
  @ApiProperty() required: boolean;
  @ApiProperty() hint: string;
}

export class SheetResponse {
  @ApiProperty({ type: [String] }) headers: string[];
  @ApiProperty({
    description: 'the first rows, for the preview',
    type: 'array',
    items: { type: 'array', items: { type: 'string' } },
  })
  preview: string[][];
  @ApiProperty() total: number;
  @ApiProperty({
    type: 'object',
    additionalProperties: { type: 'integer' },
    description: 'field key → column index suggested by the header row',
  })
  suggested: Record<string, number>;
  @ApiProperty({ type: [ImportFieldResponse] }) fields: ImportFieldResponse[];
}

/** One problem of a row: the column and what is wrong with its value. */
export class CellProblemResponse {
  @ApiProperty() column: string;
  @ApiProperty() message: string;
}

export class RowProblemResponse {
  @ApiProperty({ description: 'row number as a spreadsheet shows it (the header is row 1)' }) row: number;
  @ApiProperty({ type: [CellProblemResponse] }) problems: CellProblemResponse[];
}

export class CheckResponse {
  @ApiProperty() total: number;
  @ApiProperty() valid: number;
  @ApiProperty({ type: [RowProblemResponse] }) rows: RowProblemResponse[];
}

/** A field a refused import names, and why. */
export class ImportFieldProblem {
  @ApiProperty() field: string;
  @ApiProperty() reason: string;
}

/** A refused import's reason, as the stream's last line once lines have been sent. */
export class ImportErrorResponse {
  @ApiProperty() code: string;
  @ApiProperty() message: string;
  @ApiPropertyOptional({ type: [ImportFieldProblem] }) fields?: ImportFieldProblem[];
}

/**
 * One line of the import's answer: first `total`, then `done` with `total` as lots are written,
 * then either `codes` (every new lot, in sheet order) or `error` (nothing was imported).
 */
export class ImportLineResponse {
  @ApiPropertyOptional({ description: 'rows to register' }) total?: number;
  @ApiPropertyOptional({ description: 'rows registered so far' }) done?: number;
  @ApiPropertyOptional({ type: [String], description: 'the new lots’ codes: the import is complete' })
  codes?: string[];
  @ApiPropertyOptional({ type: ImportErrorResponse }) error?: ImportErrorResponse;
}
