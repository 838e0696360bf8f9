import { StreamableFile } from '@nestjs/common';
import ExcelJS from 'exceljs';
import type { Response } from 'express';
import Papa from 'papaparse';

/** The two file formats every export offers. */
export const EXPORT_FORMATS = ['csv', 'xlsx'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** A cell: text, a number, or empty. */
export type ExportCell = string | number | null | undefined;

export interface ExportColumn {
  key: string;
  header: string;
  /** Column width in characters (XLSX only). */
  width?: number;
  /** Number format of the column's cells (XLSX only), e.g. '#,##0.00'. */
  numFmt?: string;
}

/** One sheet: its columns in order and one record per row, keyed by column key. */
export interface ExportSheet {
  name: string;
  columns: readonly ExportColumn[];
  rows: ReadonlyArray<Readonly<Record<string, ExportCell>>>;
}

/** A finished export, ready to be sent as an attachment. */
export interface ExportFile {
  body: Buffer;
  type: string;
  name: string;
}

const TYPES: Record<ExportFormat, string> = {
  csv: 'text/csv; charset=utf-8',
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
};

/**
 * A cell as text a spreadsheet shows and never runs: text starting with = + - @ or a tab or
 * carriage return gets a leading apostrophe (OWASP, "CSV Injection").
 */
export function inertText(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

function inert(cell: ExportCell): string | number {
  if (cell === null || cell === undefined) return '';
  return typeof cell === 'number' ? cell : inertText(cell);
}

function csv(sheet: ExportSheet, bom: boolean): Buffer {
  const rows = sheet.rows.map((r) => sheet.columns.map((c) => inert(r[c.key])));
  const text = Papa.unparse(
    { fields: sheet.columns.map((c) => inertText(c.header)), data: rows },
    { newline: '\r\n' },
  );
  // RFC 4180 §2: CRLF line ends, the last record ended too.
  return Buffer.from(`${bom ? '\uFEFF' : ''}${text}\r\n`, 'utf8');
}

async function xlsx(sheets: readonly ExportSheet[]): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  // A fixed creation time: the same data gives the same file.
  book.created = new Date(0);
  book.modified = new Date(0);
  for (const s of sheets) {
    const ws = book.addWorksheet(s.name);
    ws.columns = s.columns.map((c) => ({ header: inertText(c.header), key: c.key, width: c.width ?? 20 }));
    for (const r of s.rows)
      ws.addRow(Object.fromEntries(s.columns.map((c) => [c.key, inert(r[c.key])] as const)));
    for (const c of s.columns) if (c.numFmt) ws.getColumn(c.key).numFmt = c.numFmt;
    ws.getRow(1).font = { bold: true };
    ws.views = [{ state: 'frozen', ySplit: 1 }];
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}

/**
 * The one way the server writes a spreadsheet file. CSV holds the first sheet only (RFC 4180,
 * quoted by papaparse; `bom` starts it with a byte-order mark for spreadsheet programs); XLSX
 * holds every sheet, its header row bold and frozen. Every text cell, in both formats, goes
 * through `inertText`, so no cell is ever taken for a formula.
 */
export async function exportFile(
  format: ExportFormat,
  fileBase: string,
  sheets: readonly [ExportSheet, ...ExportSheet[]],
  opts: { bom?: boolean } = {},
): Promise<ExportFile> {
  const body = format === 'csv' ? csv(sheets[0], opts.bom ?? false) : await xlsx(sheets);
  return { body, type: TYPES[format], name: `${fileBase}.${format}` };
}

/** Sends an export as an attachment from a controller (with `@Res({ passthrough: true })`). */
export function attachment(res: Response, file: ExportFile): StreamableFile {
  res.setHeader('Content-Type', file.type);
  res.setHeader('Content-Disposition', `attachment; filename="${file.name}"`);
  return new StreamableFile(file.body);
}
