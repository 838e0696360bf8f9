import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { exportFile, inertText, type ExportSheet } from './sheet-export';

const sheet: ExportSheet = {
  name: 'Lots',
  columns: [
    { key: 'code', header: 'code' },
    { key: 'note', header: 'note' },
    { key: 'count', header: 'count', numFmt: '0' },
  ],
  rows: [
    { code: 'A', note: '=1+2', count: 3 },
    { code: 'B', note: '+Tray 3', count: -4 },
    { code: 'C', note: '-2', count: null },
    { code: 'D', note: '@SUM(A1)', count: 0 },
    { code: 'E', note: '\tcell', count: 1 },
    { code: 'F', note: '\rcell', count: 1 },
    { code: 'G', note: 'plain, "quoted"', count: 1 },
  ],
};

describe('sheet export', () => {
  // OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): a cell beginning
  // with = + - @, a tab or a carriage return is prefixed with an apostrophe so it stays text.
  it.each(['=1+2', '+1', '-1', '@SUM(A1)', '\t=1', '\r=1'])('makes %j inert', (v) => {
    expect(inertText(v)).toBe(`'${v}`);
  });

  it('leaves ordinary text alone', () => {
    expect(inertText('Venetian = wound')).toBe('Venetian = wound');
    expect(inertText('')).toBe('');
  });

  it('writes RFC 4180 CSV with CRLF line ends and every text cell inert', async () => {
    const file = await exportFile('csv', 'lots', [sheet]);
    expect(file).toMatchObject({ type: 'text/csv; charset=utf-8', name: 'lots.csv' });
    const text = file.body.toString('utf8');
    expect(text.endsWith('\r\n')).toBe(true);
    const rows = Papa.parse<string[]>(text.trimEnd(), { newline: '\r\n' }).data;
    expect(rows).toEqual([
      ['code', 'note', 'count'],
      ['A', "'=1+2", '3'],
      ['B', "'+Tray 3", '-4'],
      ['C', "'-2", ''],
      ['D', "'@SUM(A1)", '0'],
      ['E', "'\tcell", '1'],
      ['F', "'\rcell", '1'],
      ['G', 'plain, "quoted"', '1'],
    ]);
    // RFC 4180 §2.6-2.7: a field holding a comma or quote is quoted, inner quotes doubled.
    expect(text).toContain('G,"plain, ""quoted""",1');
  });

  it('starts the CSV with a byte-order mark when asked', async () => {
    const file = await exportFile('csv', 'lots', [sheet], { bom: true });
    expect(file.body.subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
  });

  it('writes XLSX whose cells are values, never formulas, with the same guard', async () => {
    const file = await exportFile('xlsx', 'lots', [sheet, { ...sheet, name: 'More' }]);
    expect(file.name).toBe('lots.xlsx');
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(file.body as never);
    expect(book.worksheets.map((w) => w.name)).toEqual(['Lots', 'More']);
    const ws = book.getWorksheet('Lots')!;
    expect(ws.getRow(2).values).toEqual([undefined, 'A', "'=1+2", 3]);
    expect(ws.getRow(3).getCell(3).value).toBe(-4);
    ws.eachRow((r) => r.eachCell((c) => expect(c.type).not.toBe(ExcelJS.ValueType.Formula)));
  });
});
