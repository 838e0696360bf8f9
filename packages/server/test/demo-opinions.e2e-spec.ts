import { resolve } from 'node:path';
import { verifyRoll } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { loadDemoLots, readDemoLots } from '../src/demo/demo-lots';
import { runSeed, seedAccounts, type SeedStep } from '../src/demo/seed';
import { LedgerService } from '../src/ledger/ledger.service';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { seedOpinions } from '../src/opinions/demo-opinions';
import { createTestApp, type TestApp } from './support/test-app';

const LOTS_FILE = resolve(__dirname, '../../../seed-demo/lots.json');
const DEALERS = ['odile-varnas', 'teodor-brasko', 'ines-calloway-rue', 'wren-ashdown', 'pim-oyelaran'];

describe('demo scenario: opinions', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  const lots: SeedStep = async (app, ctx) => {
    await loadDemoLots(
      app.get(LedgerService),
      app.get(DataSource),
      readDemoLots(LOTS_FILE),
      DEALERS.map((h) => ctx.accounts[h]!),
    );
  };

  it('gives demo lots opinions, one of them the assessor’s dissent on a listed lot, once', async () => {
    const first = await runSeed(t.app, [seedAccounts, lots, seedOpinions]);
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
    const second = await runSeed(t.app, [seedAccounts, lots, seedOpinions]);
    expect(await count()).toBe(before);
    expect(second.publicLots).toEqual(first.publicLots);
  });
});
