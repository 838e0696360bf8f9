import { inheritedRecord, parseBundle, verifyBundle, type EntryHeader, type RollState } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { runSeed, seedAccounts, seedLineage } from '../src/demo/seed';
import { useTestApp } from './support/test-app';

describe('demo scenario: a split strand and a combined piece', () => {
  const t = useTestApp();

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
    // One parent is listed (full roll), the other unlisted (what travels from it only).
    expect(pieceBundle.rolls.map((r) => r.scope).sort()).toEqual(['full', 'full', 'inherited']);
  });

  it('every listed descendant’s public data carries every standing opinion of every ancestor, listed or not', async () => {
    await runSeed(t.app, [seedAccounts, seedLineage]);
    const db = t.app.get(DataSource);
    const lots: Array<{ code: string; state: RollState; listed: boolean }> = await db.query(
      `SELECT l."code", l."state", v."listed" FROM "lots" l JOIN "lot_views" v ON v."code" = l."code"`,
    );
    const byCode = new Map(lots.map((l) => [l.code, l]));
    const ancestorsOf = (code: string): string[] => {
      const out: string[] = [];
      const walk = (c: string) => {
        for (const p of byCode.get(c)!.state.parents)
          if (!out.includes(p.lot)) {
            out.push(p.lot);
            walk(p.lot);
          }
      };
      walk(code);
      return out;
    };
    let checked = 0;
    for (const lot of lots) {
      const ancestors = ancestorsOf(lot.code);
      if (!lot.listed || ancestors.length === 0) continue;
      const res = await request(t.app.getHttpServer()).get(`/api/public/lots/${lot.code}`);
      expect(res.status).toBe(200);
      const bundle = parseBundle(res.body.bundle);
      expect(verifyBundle(bundle).failures).toEqual([]);
      const carried = new Set(
        inheritedRecord(bundle, lot.code)
          .filter((i) => i.kind === 'opinion')
          .map((i) => `${i.lot}/${i.seq}`),
      );
      for (const a of ancestors)
        for (const o of byCode.get(a)!.state.opinions.filter((x) => x.body)) {
          expect(carried).toContain(`${a}/${o.seq}`);
          checked++;
        }
    }
    // The split strand's two opinions reach its three children, the unlisted spacers' one the necklace.
    expect(checked).toBe(7);
  });
});
