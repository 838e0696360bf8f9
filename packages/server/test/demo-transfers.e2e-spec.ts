import { parseBundleText, verifyBundle } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { runSeed } from '../src/demo/seed';
import { useTestApp } from './support/test-app';

describe('demo scenario: transfers and sales', () => {
  const t = useTestApp();

  it('loads once; shows a lot that changed hands, every ending of an offer, and sales', async () => {
    const first = await runSeed(t.app);
    const db = t.app.get(DataSource);
    const count = async () =>
      ((await db.query('SELECT count(*)::int AS n FROM "entries"')) as Array<{ n: number }>)[0]!.n;
    const entries = await count();
    expect(await runSeed(t.app)).toEqual(first);
    expect(await count()).toBe(entries);

    const changed = first.publicLots.find((l) => l.why.startsWith('changed hands'));
    expect(changed).toBeDefined();
    const res = await request(t.app.getHttpServer()).get(`/api/public/lots/${changed!.code}`);
    expect(res.status).toBe(200);
    const kinds = res.body.bundle.rolls[0].entries.map((e: { header: string }) => JSON.parse(e.header).kind);
    expect(kinds[0]).toBe('registered');
    expect(kinds.slice(-2)).toEqual(['transfer-offered', 'transfer-accepted']);
    const bundle = await request(t.app.getHttpServer()).get(`/api/public/lots/${changed!.code}/bundle`);
    expect(verifyBundle(parseBundleText(bundle.text)).ok).toBe(true);
    // Sealed prices stay off public answers.
    expect(JSON.stringify(res.body)).not.toMatch(/14500|16000|auction lot 114/);

    const statuses = (await db.query('SELECT "status" FROM "transfer_offers"')) as Array<{ status: string }>;
    expect(new Set(statuses.map((s) => s.status))).toEqual(
      new Set(['accepted', 'declined', 'withdrawn', 'lapsed', 'open']),
    );
    const [{ n }] = (await db.query('SELECT count(*)::int AS n FROM "sales"')) as Array<{ n: number }>;
    expect(n).toBeGreaterThanOrEqual(2);
  });
});
