import { parseBundle, verifyBundle, type EntryHeader } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { runSeed, seedAccounts, seedLineage } from '../src/demo/seed';
import { createTestApp, type TestApp } from './support/test-app';

describe('demo scenario: a split strand and a combined piece', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('loads once, reports a listed split child whose public bundle verifies with its parent', async () => {
    const first = await runSeed(t.app, [seedAccounts, seedLineage]);
    const count = async () =>
      (
        (await t.app.get(DataSource).query('SELECT count(*)::int AS n FROM "entries"')) as Array<{
          n: number;
        }>
      )[0]!.n;
    const entries = await count();
    const second = await runSeed(t.app, [seedAccounts, seedLineage]);
    expect(second).toEqual(first);
    expect(await count()).toBe(entries);

    const child = first.publicLots.find((p) => p.why === 'split child')!;
    const res = await request(t.app.getHttpServer()).get(`/api/public/lots/${child.code}`);
    expect(res.status).toBe(200);
    const bundle = parseBundle(res.body.bundle);
    expect(verifyBundle(bundle).ok).toBe(true);
    expect(bundle.rolls.map((r) => r.scope)).toEqual(['full', 'full']);
    const reg = JSON.parse(bundle.rolls[0]!.entries[0]!.header) as EntryHeader;
    expect(reg.parents).toHaveLength(1);

    const piece = first.publicLots.find((p) => p.why === 'combined piece')!;
    const pub = await request(t.app.getHttpServer()).get(`/api/public/lots/${piece.code}`);
    const pieceBundle = parseBundle(pub.body.bundle);
    expect(verifyBundle(pieceBundle).ok).toBe(true);
    // One parent is listed (full roll), the other unlisted (its linking entry only).
    expect(pieceBundle.rolls.map((r) => r.scope).sort()).toEqual(['full', 'full', 'link']);
  });
});
