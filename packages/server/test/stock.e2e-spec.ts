import ExcelJS from 'exceljs';
import { createAccount, useAccount } from './support/accounts';
import { recordOpinion, registerLot } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };

/** Reads a binary response body into a Buffer (supertest leaves unknown types unparsed). */
function binary(
  res: NodeJS.ReadableStream & { setEncoding(e: string): void },
  done: (e: Error | null, b?: Buffer) => void,
) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

describe('stock and sales figures', () => {
  const register = registerLot;

  const attribute = recordOpinion;

  const t = useTestApp();
  const ana = useAccount(t, { role: 'dealer' });
  const ben = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    // Held: two in EUR (one attributed), one in GBP, one with no cost.
    const a = await register(
      ana,
      { title: '=HYPERLINK("http://x.invalid","click")' },
      {
        storageLocation: '+Tray 3',
        acquisition: { date: '2026-01-10', source: 'House sale', cost: { amount: 3200, currency: 'EUR' } },
      },
    );
    await attribute(ana, a.code);
    await register(ana, { title: 'Second' }, { acquisition: { cost: { amount: 1050, currency: 'EUR' } } });
    await register(ana, { title: 'Third' }, { acquisition: { cost: { amount: 900, currency: 'GBP' } } });
    await register(ana, { title: 'No cost' });
    // Sold: bought for 20.00 EUR, sold for 55.00 EUR in March 2026.
    const sold = await register(
      ana,
      { title: 'Sold one' },
      { acquisition: { cost: { amount: 2000, currency: 'EUR' } } },
    );
    await ana.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({ lot: sold.code, date: '2026-03-14', price: { amount: 5500, currency: 'EUR' } })
      .expect(201);
    // Ben's stock never shows in Ana's figures.
    await register(ben, { title: 'Ben' }, { acquisition: { cost: { amount: 99900, currency: 'EUR' } } });
  });

  it('sums the cost of stock held, per currency, from the dealer’s own sealed values', async () => {
    const res = await ana.agent.get('/api/stock/summary').expect(200);
    expect(res.headers['cache-control']).toBe('no-store');
    const { currencies, lotsHeld, lotsWithoutCost } = res.body;
    expect(lotsHeld).toBe(4);
    expect(lotsWithoutCost).toBe(1);
    const eur = currencies.find((c: { currency: string }) => c.currency === 'EUR');
    const gbp = currencies.find((c: { currency: string }) => c.currency === 'GBP');
    expect(eur.stock).toEqual({ lots: 2, cost: 4250 });
    expect(eur.minorDigits).toBe(2);
    expect(gbp.stock).toEqual({ lots: 1, cost: 900 });
    expect(eur.stockByOrigin).toEqual([
      { key: 'venice-murano', lots: 1, cost: 3200 },
      { key: 'none', lots: 1, cost: 1050 },
    ]);
    expect(eur.stockByCentury).toEqual([
      { key: '1800', lots: 1, cost: 3200 },
      { key: 'none', lots: 1, cost: 1050 },
    ]);
  });

  it('gives sales, cost and margin by month and by year', async () => {
    const { currencies } = (await ana.agent.get('/api/stock/summary').expect(200)).body;
    const eur = currencies.find((c: { currency: string }) => c.currency === 'EUR');
    const march = { sales: 1, revenue: 5500, cost: 2000, margin: 3500, withoutCost: 0 };
    expect(eur.salesByMonth).toEqual([{ period: '2026-03', ...march }]);
    expect(eur.salesByYear).toEqual([{ period: '2026', ...march }]);
  });

  it('shows another dealer only their own figures', async () => {
    const { currencies, lotsHeld } = (await ben.agent.get('/api/stock/summary').expect(200)).body;
    expect(lotsHeld).toBe(1);
    expect(currencies).toEqual([
      expect.objectContaining({ currency: 'EUR', stock: { lots: 1, cost: 99900 }, salesByMonth: [] }),
    ]);
  });

  it('exports a CSV with cost, currency, acquisition date, storage place and attribution; formulas stay text', async () => {
    const res = await ana.agent.get('/api/stock/export').query({ format: 'csv' }).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="beadroll-stock-.*\.csv"/);
    const lines = res.text.split('\r\n');
    expect(lines[0]).toBe(
      'code,title,form,count,count estimated,status,listed,origin on record,period on record from,period on record to,technique on record,storage place,acquisition date,acquisition source,cost,currency',
    );
    const row = lines.find((l) => l.includes('HYPERLINK'))!;
    // OWASP, "CSV Injection": a cell starting with = or + is prefixed so it is never run.
    expect(row).toContain(`"'=HYPERLINK(""http://x.invalid"",""click"")"`);
    expect(row).toContain("'+Tray 3");
    expect(row).toContain('venice-murano,1880,1920,wound-lampwork');
    expect(row).toContain('2026-01-10,House sale,32.00,EUR');
    expect(lines.filter((l) => l.includes('Ben'))).toEqual([]);
    expect(lines.filter((l) => l.includes('Sold one'))).toEqual([]);
  });

  it('exports an XLSX whose cells are values, never formulas', async () => {
    const res = await ana.agent
      .get('/api/stock/export')
      .query({ format: 'xlsx' })
      .buffer(true)
      .parse(binary as never)
      .expect(200);
    expect(res.headers['content-type']).toBe(
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    );
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as never);
    const sheet = book.getWorksheet('Stock')!;
    expect(sheet.rowCount).toBe(5);
    const rows: unknown[][] = [];
    sheet.eachRow((r) => rows.push((r.values as unknown[]).slice(1)));
    const first = rows.find((r) => String(r[1]).includes('HYPERLINK'))!;
    expect(first[14]).toBe(32);
    expect(first[15]).toBe('EUR');
    sheet.eachRow((r) => r.eachCell((c) => expect(c.type).not.toBe(ExcelJS.ValueType.Formula)));
  });

  it('exports the inventory list through the same path: filters kept, formulas stay text', async () => {
    const res = await ana.agent.get('/api/lots/export').query({ mine: true, format: 'csv' }).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="beadroll-lots-.*\.csv"/);
    const lines = res.text.split('\r\n');
    expect(lines[0]).toBe('code,title,form,count,estimated,origin,status,listed,last entry (UTC)');
    // OWASP, "CSV Injection": the title starting with = is prefixed so it is never run.
    expect(lines.find((l) => l.includes('HYPERLINK'))).toMatch(/^\w{4}-\w{4}-\w,"'=HYPERLINK/);
    expect(lines.filter((l) => l.includes('Ben'))).toEqual([]);
    const xlsx = await ana.agent
      .get('/api/lots/export')
      .query({ mine: true, format: 'xlsx' })
      .buffer(true)
      .parse(binary as never)
      .expect(200);
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(xlsx.body as never);
    const sheet = book.getWorksheet('Lots')!;
    expect(sheet.rowCount).toBe(lines.filter((l) => l !== '').length);
    sheet.eachRow((r) => r.eachCell((c) => expect(c.type).not.toBe(ExcelJS.ValueType.Formula)));
    const bad = await ana.agent.get('/api/lots/export').query({ format: 'ods' }).expect(400);
    expect(bad.body.error.fields).toEqual([expect.objectContaining({ field: 'format' })]);
  });

  it('answers 400 naming the field for an unknown format, and 403 to an assessor', async () => {
    const res = await ana.agent.get('/api/stock/export').query({ format: 'pdf' }).expect(400);
    expect(res.body.error.fields).toEqual([expect.objectContaining({ field: 'format' })]);
    const assessor = await createAccount(t, { role: 'assessor' });
    await assessor.agent.get('/api/stock/summary').expect(403);
  });
});
