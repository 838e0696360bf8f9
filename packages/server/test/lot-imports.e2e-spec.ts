import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { DataSource } from 'typeorm';
import { IMPORT_FIELDS } from '../src/lot-imports/import-columns';
import { useAccount } from './support/accounts';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };
const HEADERS = IMPORT_FIELDS.map((f) => f.header);

/** One good row per lot, in the template's column order. */
function goodRow(i: number): string[] {
  const v: Record<string, string> = {
    Title: `Estate strand ${i}`,
    Form: 'strand',
    'Number of beads': String(40 + (i % 20)),
    'Count is an estimate': 'yes',
    'Bead size smallest (mm)': '6',
    'Bead size largest (mm)': '8.5',
    'Strand length (mm)': '406.4',
    Colours: 'white, rose pink',
    'Base glass': 'opaque',
    Decoration: 'roses, trailing',
    Listed: 'no',
    'Acquired on': '2026-03-14',
    'Acquired from': 'estate sale at Quillmere',
    Cost: '12.50',
    Currency: 'EUR',
  };
  return HEADERS.map((h) => v[h] ?? '');
}

function csv(rows: string[][]): Buffer {
  return Buffer.from(Papa.unparse([HEADERS, ...rows]), 'utf8');
}

describe('importing lots from a spreadsheet', () => {
  let db: DataSource;
  const lotCount = async () =>
    Number(((await db.query('SELECT count(*)::int AS n FROM "lots"')) as Array<{ n: number }>)[0]!.n);

  const t = useTestApp();
  const dealer = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    db = t.app.get(DataSource);
  });

  /** Sends a CSV with the column mapping to `path`: the dry run (`checks`) or the import itself. */
  const sendCsv = (path: 'checks' | '', mapping: string, file: Buffer) =>
    dealer.agent
      .post(path ? `/api/lot-imports/${path}` : '/api/lot-imports')
      .set(W)
      .field('mapping', mapping)
      .attach('file', file, 'lots.csv');

  it('offers the template as CSV and XLSX, with every column', async () => {
    const c = await dealer.agent.get('/api/lot-imports/template?format=csv');
    expect(c.status).toBe(200);
    expect(c.headers['content-type']).toMatch(/text\/csv/);
    expect(Papa.parse<string[]>(c.text.replace(/^\uFEFF/, '')).data[0]).toEqual(HEADERS);
    const x = await dealer.agent
      .get('/api/lot-imports/template?format=xlsx')
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (d: Buffer) => chunks.push(d));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(x.body as ArrayBuffer);
    expect(book.worksheets[0]!.getRow(1).values).toEqual([undefined, ...HEADERS]);
  });

  it('a 500-row file with 3 bad rows: the dry run names them, the import writes nothing; fixed, all 500 are registered', async () => {
    const rows = Array.from({ length: 500 }, (_, i) => goodRow(i + 1));
    const col = (h: string) => HEADERS.indexOf(h);
    rows[9]![col('Bead size largest (mm)')] = '99999'; // sheet row 11
    rows[199]![col('Currency')] = 'ZZZ'; // sheet row 201
    rows[449]![col('Title')] = ''; // sheet row 451
    const file = csv(rows);

    const sheet = await dealer.agent.post('/api/lot-imports/sheets').set(W).attach('file', file, 'lots.csv');
    expect(sheet.status).toBe(200);
    expect(sheet.body.total).toBe(500);
    expect(sheet.body.suggested.title).toBe(0);
    const mapping = JSON.stringify(sheet.body.suggested);

    const before = await lotCount();
    const check = await sendCsv('checks', mapping, file);
    expect(check.status).toBe(200);
    expect(check.body.valid).toBe(497);
    expect(check.body.rows).toEqual([
      {
        row: 11,
        problems: [
          {
            column: 'Bead size largest (mm)',
            message: 'Enter a bead size between 0.5 and 100 mm, to at most one decimal place',
          },
        ],
      },
      { row: 201, problems: [{ column: 'Currency', message: expect.stringMatching(/ISO 4217/) }] },
      { row: 451, problems: [{ column: 'Title', message: 'Enter the title' }] },
    ]);

    const refused = await sendCsv('', mapping, file);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.map((f: { field: string }) => f.field)).toEqual([
      'row 11, Bead size largest (mm)',
      'row 201, Currency',
      'row 451, Title',
    ]);
    expect(await lotCount()).toBe(before);

    rows[9]![col('Bead size largest (mm)')] = '9';
    rows[199]![col('Currency')] = 'GBP';
    rows[449]![col('Title')] = 'Estate strand 450';
    const fixed = await sendCsv('', mapping, csv(rows));
    expect(fixed.status).toBe(201);
    const lines = fixed.text
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l) as { total?: number; done?: number; codes?: string[] });
    expect(lines[0]).toEqual({ total: 500 });
    expect(lines.filter((l) => l.done !== undefined).at(-1)).toEqual({ done: 500, total: 500 });
    expect(lines.at(-1)!.codes).toHaveLength(500);
    expect(await lotCount()).toBe(before + 500);
    const one = await dealer.agent.get(`/api/lots/${lines.at(-1)!.codes![0]}`);
    expect(one.body.title).toBe('Estate strand 1');
  }, 120_000);

  it('reads XLSX the same way and refuses a file over 500 lots', async () => {
    const book = new ExcelJS.Workbook();
    const ws = book.addWorksheet('Lots');
    ws.addRow(HEADERS);
    ws.addRow(goodRow(1));
    const xlsx = Buffer.from(await book.xlsx.writeBuffer());
    const check = await dealer.agent.post('/api/lot-imports/checks').set(W).attach('file', xlsx, 'lots.xlsx');
    expect(check.body).toEqual({ total: 1, valid: 1, rows: [] });
    const big = csv(Array.from({ length: 501 }, (_, i) => goodRow(i)));
    const res = await dealer.agent.post('/api/lot-imports/sheets').set(W).attach('file', big, 'big.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].reason).toMatch(/up to 500/);
  });
});
