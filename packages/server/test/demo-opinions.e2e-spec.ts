import { verifyRoll } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { runSeed } from '../src/demo/seed';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { useTestApp } from './support/test-app';

describe('demo scenario: opinions', () => {
  const t = useTestApp();

  it('gives demo lots opinions, one of them the assessor’s dissent on a listed lot, once', async () => {
    const first = await runSeed(t.app);
    const shown = first.publicLots.filter((l) => l.why === 'dissent');
    expect(shown).toHaveLength(1);
    const reader = t.app.get(RollReaderService);
    const lot = (await reader.findLot(shown[0]!.code))!;
    const r = verifyRoll(await reader.entries(lot.id), { lot: lot.code });
    if (!r.ok) throw new Error(r.message);
    expect(r.state.listed).toBe(true);
    expect(r.state.attribution).not.toBeNull();
    expect(r.state.dissents).toHaveLength(1);
    const [assessor] = (await t.app
      .get(DataSource)
      .query(`SELECT "id" FROM "accounts" WHERE "role" = 'assessor'`)) as Array<{ id: string }>;
    expect(r.state.dissents[0]!.author).toBe(assessor!.id);
    const count = async () =>
      (
        (await t.app.get(DataSource).query(`SELECT count(*)::int AS n FROM "entries"`)) as Array<{
          n: number;
        }>
      )[0]!.n;
    const before = await count();
    const second = await runSeed(t.app);
    expect(await count()).toBe(before);
    expect(second.publicLots).toEqual(first.publicLots);
  });
});
