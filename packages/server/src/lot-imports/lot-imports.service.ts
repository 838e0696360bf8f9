import { Injectable } from '@nestjs/common';
import { plainToInstance } from 'class-transformer';
import { validate } from 'class-validator';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { flatten } from '../common/validation';
import { CreateLotDto } from '../lots/dto/lot-requests.dto';
import { LotsService } from '../lots/lots.service';
import type { CheckResponse, SheetResponse } from './dto/lot-import.dto';
import {
  columnOf,
  IMPORT_FIELDS,
  rowToRequest,
  suggestMapping,
  type CellProblem,
  type ColumnMapping,
} from './import-columns';
import { exportFile, type ExportFile, type ExportFormat } from '../export/sheet-export';
import { readSheet, type Sheet } from './sheet-reader';

/** One uploaded file as the import steps receive it. */
export interface SheetFile {
  buffer: Buffer;
  originalname: string;
}

interface CheckedRow {
  row: number;
  problems: CellProblem[];
  dto: CreateLotDto | null;
}

/**
 * Importing lots from a spreadsheet: the template, reading a sheet with its suggested column
 * mapping, a dry run that checks every row as a registration, and the import itself, which
 * registers every lot in one transaction (all or none). The file is sent with each step; the
 * server keeps nothing between them.
 */
@Injectable()
export class LotImportsService {
  constructor(private readonly lots: LotsService) {}

  /** The template: the header row and one example row, and in XLSX a sheet of hints. */
  template(format: ExportFormat): Promise<ExportFile> {
    const lots = IMPORT_FIELDS.map((f) => ({ key: f.key, header: f.header, width: 22 }));
    const example = Object.fromEntries(IMPORT_FIELDS.map((f) => [f.key, f.example]));
    const hints = IMPORT_FIELDS.map((f) => ({
      column: f.header,
      hint: `${f.required ? 'required; ' : ''}${f.hint}`,
    }));
    const help = [
      { key: 'column', header: 'Column', width: 40 },
      { key: 'hint', header: 'What to enter', width: 40 },
    ];
    return exportFile(
      format,
      'beadroll-lots',
      [
        { name: 'Lots', columns: lots, rows: [example] },
        { name: 'How to fill in', columns: help, rows: hints },
      ],
      { bom: true },
    );
  }

  async sheet(file: SheetFile | undefined): Promise<SheetResponse> {
    const sheet = await this.read(file);
    return {
      headers: sheet.headers,
      preview: sheet.rows.slice(0, 5),
      total: sheet.rows.length,
      suggested: suggestMapping(sheet.headers) as Record<string, number>,
      fields: IMPORT_FIELDS.map((f) => ({
        key: f.key,
        header: f.header,
        required: !!f.required,
        hint: f.hint,
      })),
    };
  }

  /** The dry run: every row's problems, nothing written. */
  async check(file: SheetFile | undefined, mappingText: string | undefined): Promise<CheckResponse> {
    const sheet = await this.read(file);
    const rows = await this.checkRows(sheet, this.mapping(mappingText, sheet));
    const bad = rows.filter((r) => r.problems.length > 0);
    return {
      total: rows.length,
      valid: rows.length - bad.length,
      rows: bad.map((r) => ({ row: r.row, problems: r.problems })),
    };
  }

  /**
   * Registers every row, all or none. A sheet with any problem is refused (400, each row's
   * problems in `fields` as "row N, Column") before anything is written. `progress` hears the
   * count written so far, and the total.
   */
  async run(
    me: Principal,
    file: SheetFile | undefined,
    mappingText: string | undefined,
    start: (total: number) => void,
    progress: (done: number, total: number) => void,
  ): Promise<string[]> {
    const sheet = await this.read(file);
    const rows = await this.checkRows(sheet, this.mapping(mappingText, sheet));
    const bad = rows.filter((r) => r.problems.length > 0);
    if (bad.length)
      throw AppError.validation(
        bad.flatMap((r) =>
          r.problems.map((p) => ({ field: `row ${r.row}, ${p.column}`, reason: p.message })),
        ),
      );
    start(rows.length);
    try {
      return await this.lots.registerMany(
        me,
        rows.map((r) => r.dto!),
        (done) => progress(done, rows.length),
      );
    } catch (e) {
      const index = (e as { index?: number }).index;
      if (e instanceof AppError && index !== undefined)
        throw new AppError(
          e.code,
          `Row ${index + 2}: ${e.message} Nothing was imported.`,
          e.fields?.map((f) => ({ field: `row ${index + 2}, ${columnOf(f.field)}`, reason: f.reason })),
        );
      throw e;
    }
  }

  private async read(file: SheetFile | undefined): Promise<Sheet> {
    if (!file) throw AppError.validation([{ field: 'file', reason: 'choose a CSV or XLSX file' }]);
    return readSheet(file.buffer, file.originalname);
  }

  private mapping(text: string | undefined, sheet: Sheet): ColumnMapping {
    if (text === undefined) return suggestMapping(sheet.headers);
    let m: unknown;
    try {
      m = JSON.parse(text);
    } catch {
      throw AppError.validation([{ field: 'mapping', reason: 'must be a JSON object' }]);
    }
    if (m === null || typeof m !== 'object' || Array.isArray(m))
      throw AppError.validation([{ field: 'mapping', reason: 'must be a JSON object' }]);
    const out: ColumnMapping = {};
    for (const [k, v] of Object.entries(m as Record<string, unknown>)) {
      if (!IMPORT_FIELDS.some((f) => f.key === k))
        throw AppError.validation([{ field: 'mapping', reason: `${k} is not a column of a lot` }]);
      if (v === null) continue;
      if (!Number.isInteger(v) || (v as number) < 0 || (v as number) >= sheet.headers.length)
        throw AppError.validation([{ field: 'mapping', reason: `${k} names no column of the sheet` }]);
      out[k] = v as number;
    }
    return out;
  }

  private async checkRows(sheet: Sheet, mapping: ColumnMapping): Promise<CheckedRow[]> {
    const out: CheckedRow[] = [];
    for (const [i, row] of sheet.rows.entries()) {
      const { request, problems } = rowToRequest(row, mapping);
      let dto: CreateLotDto | null = null;
      if (request) {
        dto = plainToInstance(CreateLotDto, request);
        const errors = await validate(dto, {
          whitelist: true,
          forbidNonWhitelisted: true,
          stopAtFirstError: true,
        });
        for (const f of flatten(errors)) problems.push({ column: columnOf(f.field), message: f.reason });
      }
      out.push({ row: i + 2, problems, dto: problems.length ? null : dto });
    }
    return out;
  }
}
