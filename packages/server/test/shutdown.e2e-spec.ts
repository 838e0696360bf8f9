import { Client } from 'pg';
import { rmSync } from 'node:fs';
import { LedgerService } from '../src/ledger/ledger.service';
import { createAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

describe('closing the server', () => {
  let t: TestApp | undefined;
  afterAll(async () => {
    await t?.db.drop();
    if (t) rmSync(t.dataDir, { recursive: true, force: true });
  });

  it('lets the log sequencer finish the pass that writes just before it kicked, before the connections close', async () => {
    t = await createTestApp({ CHECKPOINT_SECONDS: '1' });
    const ledger = t.app.get(LedgerService);
    const { id: actor } = await createAccount(t, { role: 'dealer' });
    // Each commit kicks a numbering pass; the last ones are still under way when the server closes.
    await Promise.all(
      Array.from({ length: 8 }, () => ledger.register({ actor, description: description() })),
    );
    await t.app.close();

    const db = new Client({ database: t.db.name });
    await db.connect();
    try {
      const { rows } = await db.query<{ unnumbered: number; entries: number }>(
        `SELECT count(*) FILTER (WHERE "log_index" IS NULL)::int AS "unnumbered", count(*)::int AS "entries"
           FROM "entries"`,
      );
      expect(rows[0]).toEqual({ unnumbered: 0, entries: 8 });
    } finally {
      await db.end();
    }
  });
});
