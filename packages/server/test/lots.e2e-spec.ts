import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseBundleText, verifyBundle } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { createAccount, type TestAccount, useAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { tamper, useTestApp } from './support/test-app';

const REPO = resolve(__dirname, '../../..');
const W = { 'X-Beadroll-Request': '1' };

describe('lots over HTTP', () => {
  const t = useTestApp();
  const ana = useAccount(t, { role: 'dealer' });
  const ben = useAccount(t, { role: 'dealer' });
  const registrar = useAccount(t, { role: 'registrar' });

  async function entryCount(): Promise<number> {
    const [{ n }] = (await t.app.get(DataSource).query('SELECT count(*)::int AS n FROM entries')) as Array<{
      n: number;
    }>;
    return n;
  }

  async function register(who: TestAccount, over: Record<string, unknown> = {}, extra: object = {}) {
    const res = await who.agent
      .post('/api/lots')
      .set(W)
      .send({ description: description(over as never), ...extra });
    expect(res.status).toBe(201);
    return res.body as { code: string; displayCode: string; headSeq: number };
  }

  it('registers, describes, observes, lists, verifies and exports a lot', async () => {
    const lot = await register(
      ana,
      { title: 'Venetian-style rose beads', listed: false },
      {
        observations: { hole: 'powder', uvA: 'none' },
        sealed: { storageLocation: 'tray 3', acquisition: { cost: { amount: 3200, currency: 'EUR' } } },
      },
    );
    expect(lot.code).toMatch(/^[0-9A-Z]{9}$/);
    expect(lot.headSeq).toBe(1);

    const described = await ana.agent
      .post(`/api/lots/${lot.displayCode}/descriptions`)
      .set(W)
      .send({ description: description({ title: 'Rose beads, sorted', listed: false }) })
      .expect(201);
    expect(described.body).toMatchObject({ title: 'Rose beads, sorted', headSeq: 2 });
    await ana.agent
      .post(`/api/lots/${lot.code}/observations`)
      .set(W)
      .send({ observations: { windingMarks: 'seen', mouldSeam: 'not-seen', foil: 'none' } })
      .expect(201);
    const listed = await ana.agent
      .put(`/api/lots/${lot.code}/listing`)
      .set(W)
      .send({ listed: true })
      .expect(200);
    expect(listed.body).toMatchObject({ listed: true, headSeq: 4 });

    const detail = await ana.agent.get(`/api/lots/${lot.code}`).expect(200);
    expect(detail.body.sealed).toEqual({
      storageLocation: 'tray 3',
      acquisitionCost: { amount: 3200, currency: 'EUR' },
    });
    expect(detail.body.observations).toEqual({ windingMarks: 'seen', mouldSeam: 'not-seen', foil: 'none' });
    const seenByBen = await ben.agent.get(`/api/lots/${lot.code}`).expect(200);
    expect(seenByBen.body.sealed).toEqual({});
    expect(JSON.stringify(seenByBen.body)).not.toContain('tray 3');

    const roll = await ana.agent.get(`/api/lots/${lot.code}/roll`).expect(200);
    expect(roll.body.entries.map((e: { kind: string }) => e.kind)).toEqual([
      'registered',
      'observed',
      'described',
      'observed',
      'described',
    ]);
    expect(roll.body.entries[0].sealed.map((f: { name: string }) => f.name)).toEqual([
      'acquisition-cost',
      'storage-location',
    ]);
    const benRoll = await ben.agent.get(`/api/lots/${lot.code}/roll`).expect(200);
    expect(benRoll.body.entries[0].sealed).toBeUndefined();

    const v = await ben.agent.get(`/api/lots/${lot.code}/verification`).expect(200);
    expect(v.body).toMatchObject({ ok: true, entries: 5, headSeq: 4 });

    const file = await ana.agent.get(`/api/lots/${lot.code}/bundle`).expect(200);
    expect(file.headers['content-disposition']).toBe(`attachment; filename="${lot.code}.beadroll.json"`);
    expect(verifyBundle(parseBundleText(file.text)).ok).toBe(true);
    // The project's own offline verifier accepts the exported file (exit 0).
    const path = join(mkdtempSync(join(tmpdir(), 'beadroll-bundle-')), 'lot.beadroll.json');
    writeFileSync(path, file.text);
    const cli = spawnSync('node', [join(REPO, 'tools/verify.mjs'), path], { encoding: 'utf8' });
    expect(cli.stderr).toBe('');
    expect(cli.status).toBe(0);
    expect(cli.stdout).toContain('intact');
  });

  it('lists with paging, sorting, filters and text search', async () => {
    const c = await createAccount(t, { role: 'dealer' });
    await register(c, { title: 'Amber pressed beads', form: 'loose', summary: 'moulded facets' });
    await register(c, { title: 'Black wound beads', form: 'strand', summary: 'tiny blue forget-me-nots' });
    await register(c, { title: 'Private tangle', form: 'mixed', listed: false });
    const all = await c.agent.get('/api/lots?mine=true&sort=title&order=asc').expect(200);
    expect(all.body.items.map((i: { title: string }) => i.title)).toEqual([
      'Amber pressed beads',
      'Black wound beads',
      'Private tangle',
    ]);
    const strands = await c.agent.get('/api/lots?mine=true&form=strand').expect(200);
    expect(strands.body.total).toBe(1);
    const search = await c.agent.get('/api/lots?mine=true&q=forget-me-nots').expect(200);
    expect(search.body.items.map((i: { title: string }) => i.title)).toEqual(['Black wound beads']);
    const unlisted = await c.agent.get('/api/lots?mine=true&listed=false').expect(200);
    expect(unlisted.body.items.map((i: { title: string }) => i.title)).toEqual(['Private tangle']);
    const page2 = await c.agent.get('/api/lots?mine=true&sort=title&order=asc&pageSize=2&page=2').expect(200);
    expect(page2.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(page2.body.items).toHaveLength(1);
    // Another dealer does not see the unlisted one; the registrar does.
    const other = await ben.agent.get('/api/lots?q=tangle').expect(200);
    expect(other.body.total).toBe(0);
    const reg = await registrar.agent.get('/api/lots?q=tangle').expect(200);
    expect(reg.body.total).toBe(1);
    const bad = await c.agent.get('/api/lots?status=lost&pageSize=0').expect(400);
    expect(bad.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'pageSize',
      'status',
    ]);
  });

  it('answers bad input with 400 naming each field, and writes nothing', async () => {
    const before = await entryCount();
    const res = await ana.agent
      .post('/api/lots')
      .set(W)
      .send({
        description: {
          ...description(),
          title: 'x'.repeat(201),
          count: { value: -3, estimated: false },
          diameterMm: { min: 9, max: 4 },
          glaze: 'shiny',
        },
        sealed: { acquisition: { cost: { amount: 100, currency: 'XYZ' } } },
        price: 100,
      })
      .expect(400);
    expect(res.body.error.code).toBe('validation');
    const fields = (res.body.error.fields as Array<{ field: string; reason: string }>)
      .map((f) => f.field)
      .sort();
    expect(fields).toEqual([
      'description.count.value',
      'description.diameterMm.min',
      'description.glaze',
      'description.title',
      'price',
      'sealed.acquisition.cost.currency',
    ]);
    for (const f of res.body.error.fields as Array<{ reason: string }>)
      expect(f.reason.length).toBeGreaterThan(0);
    const lot = await register(ana);
    const afterRegister = await entryCount();
    await ana.agent
      .post(`/api/lots/${lot.code}/observations`)
      .set(W)
      .send({ observations: { hole: 'sticky' }, extra: true })
      .expect(400);
    expect(await entryCount()).toBe(afterRegister);
    expect(afterRegister).toBe(before + 1);
  });

  const MISSING = 'description should not be null or undefined';
  it.each([
    ['without a description', {}, 'description', MISSING],
    ['with a null description', { description: null }, 'description', MISSING],
    [
      'with a text description',
      { description: 'wound beads' },
      'description',
      'description must be an object',
    ],
    ['with a list for a description', { description: [] }, 'description', 'description must be an object'],
    [
      'with a list for a count',
      { description: { ...description(), count: [] } },
      'description.count',
      'count must be an object',
    ],
    [
      'with a list for observations',
      { description: description(), observations: [] },
      'observations',
      'observations must be an object',
    ],
  ])(
    'answers a registration %s with 400 naming the field, and writes nothing',
    async (_what, body, field, reason) => {
      const before = await entryCount();
      const res = await ana.agent.post('/api/lots').set(W).send(body).expect(400);
      expect(res.body.error).toMatchObject({ code: 'validation', fields: [{ field, reason }] });
      expect(await entryCount()).toBe(before);
    },
  );

  it('lets only the holder write, only verified dealers register, and hides unlisted lots', async () => {
    const lot = await register(ana, { listed: false });
    await ben.agent.get(`/api/lots/${lot.code}`).expect(404);
    await ben.agent.get(`/api/lots/${lot.code}/roll`).expect(404);
    await ben.agent.get(`/api/lots/${lot.code}/bundle`).expect(404);
    await ben.agent.post(`/api/lots/${lot.code}/observations`).set(W).send({ observations: {} }).expect(404);
    const listedLot = await register(ana);
    const refused = await ben.agent
      .post(`/api/lots/${listedLot.code}/observations`)
      .set(W)
      .send({ observations: { hole: 'clean' } })
      .expect(403);
    expect(refused.body.error.code).toBe('forbidden');
    const assessor = await createAccount(t, { role: 'assessor' });
    await assessor.agent.post('/api/lots').set(W).send({ description: description() }).expect(403);
    const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    const np = await pending.agent.post('/api/lots').set(W).send({ description: description() }).expect(403);
    expect(np.body.error.code).toBe('not_verified');
    await ana.agent.post('/api/lots').send({ description: description() }).expect(403);
    await request(t.app.getHttpServer()).get('/api/lots').expect(401);
  });

  it("streams the registrar's full-ledger audit, naming a tampered roll", async () => {
    const lot = await register(ana);
    await ana.agent
      .post(`/api/lots/${lot.code}/observations`)
      .set(W)
      .send({ observations: { surface: 'glossy' } })
      .expect(201);
    const clean = await registrar.agent
      .get('/api/audit/ledger')
      .buffer(true)
      .parse(textParser as never)
      .expect(200);
    expect(clean.headers['content-type']).toContain('application/x-ndjson');
    const events = (clean.body as string)
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(events[0]).toMatchObject({ type: 'start' });
    expect(events.some((e) => e.type === 'progress')).toBe(true);
    expect(events.at(-1)).toMatchObject({ type: 'done', ok: true, broken: 0 });

    await tamper(
      t,
      `UPDATE entry_bodies SET body = replace(body, '"glossy"', '"matte"')
         WHERE entry_id = (SELECT e.id FROM entries e JOIN lots l ON l.id = e.lot_id WHERE l.code = $1 AND e.seq = 1)`,
      [lot.code],
    );
    const broken = await registrar.agent
      .get('/api/audit/ledger')
      .buffer(true)
      .parse(textParser as never)
      .expect(200);
    const lines = (broken.body as string)
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(lines).toContainEqual(
      expect.objectContaining({ type: 'broken', lot: lot.code, seq: 1, reason: 'bad-body-digest' }),
    );
    expect(lines.at(-1)).toMatchObject({ type: 'done', ok: false, broken: 1 });
    const v = await ana.agent.get(`/api/lots/${lot.code}/verification`).expect(200);
    expect(v.body).toMatchObject({ ok: false, failure: { seq: 1, reason: 'bad-body-digest' } });
    await ana.agent.get('/api/audit/ledger').expect(403);
  });

  it('documents the lot routes in OpenAPI', async () => {
    const doc = await request(t.app.getHttpServer()).get('/api/docs-json').expect(200);
    for (const p of ['/api/lots', '/api/lots/{code}/roll', '/api/public/lots/{code}', '/api/audit/ledger'])
      expect(Object.keys(doc.body.paths)).toContain(p);
  });
});

function textParser(
  res: NodeJS.ReadableStream & { text?: string },
  cb: (err: Error | null, body: string) => void,
) {
  let text = '';
  res.setEncoding('utf8');
  res.on('data', (c: string) => (text += c));
  res.on('end', () => cb(null, text));
}
