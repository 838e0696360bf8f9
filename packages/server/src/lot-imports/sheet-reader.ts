import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { AppError } from '../common/app-error';

/** The most lots one import registers. */
export const MAX_IMPORT_ROWS = 500;
/** The largest spreadsheet file accepted, in bytes. */
export const MAX_SHEET_BYTES = 5 * 1024 * 1024;

/** A spreadsheet as text cells: the header row and the data rows (blank rows left out). */
export interface Sheet {
  headers: string[];
  rows: string[][];
}

const ZIP = Buffer.from([0x50, 0x4b, 0x03, 0x04]);

function cellText(v: ExcelJS.CellValue): string {
  if (v === null || v === undefined) return '';
  if (v instanceof Date) return v.toISOString().slice(0, 10);
  if (typeof v === 'object') {
    if ('result' in v) return cellText(v.result as ExcelJS.CellValue);
    if ('richText' in v) return v.richText.map((r) => r.text).join('');
    if ('text' in v) return String(v.text);
    return '';
  }
  return String(v);
}

async function readXlsx(bytes: Buffer): Promise<string[][]> {
  const book = new ExcelJS.Workbook();
  try {
    await book.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch {
    throw AppError.validation([{ field: 'file', reason: 'is not a readable XLSX workbook' }]);
  }
  const sheet = book.worksheets[0];
  if (!sheet) return [];
  const out: string[][] = [];
  sheet.eachRow({ includeEmpty: false }, (row) => {
    const cells: string[] = [];
    row.eachCell({ includeEmpty: true }, (cell, col) => {
      cells[col - 1] = cellText(cell.value);
    });
    out.push(Array.from(cells, (c) => c ?? ''));
  });
  return out;
}

function readCsv(bytes: Buffer): string[][] {
  const text = bytes.toString('utf8').replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: 'greedy' });
  return parsed.data;
}

/**
 * Reads a CSV (UTF-8, any delimiter papaparse detects) or XLSX file (first worksheet) into text
 * cells. Refuses an empty sheet and more than {@link MAX_IMPORT_ROWS} data rows.
 */
export async function readSheet(bytes: Buffer, name: string): Promise<Sheet> {
  const xlsx = bytes.subarray(0, 4).equals(ZIP) || /\.xlsx$/i.test(name);
  const all = (xlsx ? await readXlsx(bytes) : readCsv(bytes)).filter((r) => r.some((c) => c.trim() !== ''));
  if (all.length < 2)
    throw AppError.validation([{ field: 'file', reason: 'has no rows below its header row' }]);
  const [headers, ...rows] = all;
  if (rows.length > MAX_IMPORT_ROWS)
    throw AppError.validation([
      {
        field: 'file',
        reason: `holds ${rows.length} lots; one import takes up to ${MAX_IMPORT_ROWS} (split the file)`,
      },
    ]);
  return { headers: headers!.map((h) => h.trim()), rows };
}
