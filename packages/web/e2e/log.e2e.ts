import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, type Browser } from './support/browser';
import { superuser } from './support/journey';

async function checkpointText(baseUrl: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/log/checkpoint`);
  return res.ok ? res.text() : '';
}

async function until<T>(what: string, fn: () => Promise<T | undefined>, ms = 40_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

const IN_LOG = /In the registry’s public log since .+, checkpoint of \d+ entries, witnessed by \d+/;

describe('the public log seen from buyers’ browsers', () => {
  const baseUrl = inject('baseUrl');
  const db = superuser();
  let code: string;
  let a: Browser;
  let b: Browser;

  beforeAll(async () => {
    await db.connect();
    const { rows } = await db.query<{ code: string }>(
      `SELECT v."code" FROM "lot_views" v WHERE v."listed" ORDER BY v."code" LIMIT 1`,
    );
    code = rows[0]!.code;
    // Wait for a checkpoint covering the lot's head.
    await until('a checkpoint covering the lot', async () => {
      const r = await fetch(`${baseUrl}/api/public/lots/${code}`);
      const body = (await r.json()) as { bundle: { checkpoints: Array<{ inclusions: unknown[] }> } };
      return body.bundle.checkpoints[0]?.inclusions.length ? true : undefined;
    });
    a = await openBrowser();
    b = await openBrowser({ width: 390, height: 844 });
  });
  afterAll(async () => {
    await a?.close();
    await b?.close();
    await db.end();
  });

  it('a fork shown to a second browser verifies on its own, and the first browser’s remembered checkpoint catches it', async () => {
    await a.page.goto(`${baseUrl}/l/${code}`);
    await expect.poll(() => a.page.locator('.pl-log').innerText(), { timeout: 20_000 }).toMatch(IN_LOG);
    const before = await checkpointText(baseUrl);

    // The operator forks the log: two leaves of other lots change places (every roll still
    // verifies on its own), and the signed checkpoints are deleted so the service signs anew.
    const { rows } = await db.query<{ log_index: string }>(
      `SELECT e."log_index" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
        WHERE l."code" <> $1 AND e."log_index" IS NOT NULL ORDER BY e."log_index" LIMIT 2`,
      [code],
    );
    const [x, y] = rows.map((r) => r.log_index);
    await db.query('BEGIN');
    await db.query('SET LOCAL session_replication_role = replica');
    await db.query(`UPDATE "entries" SET "log_index" = 9000000000000000 WHERE "log_index" = $1`, [x]);
    await db.query(`UPDATE "entries" SET "log_index" = $1 WHERE "log_index" = $2`, [x, y]);
    await db.query(`UPDATE "entries" SET "log_index" = $1 WHERE "log_index" = 9000000000000000`, [y]);
    await db.query('DELETE FROM "log_checkpoints"');
    await db.query('COMMIT');
    await until('the forked checkpoint', async () => {
      const now = await checkpointText(baseUrl);
      return now && now !== before ? now : undefined;
    });

    // A browser that never saw the log before sees the fork as a good log.
    await b.page.goto(`${baseUrl}/l/${code}`);
    await expect.poll(() => b.page.locator('.pl-log').innerText(), { timeout: 20_000 }).toMatch(IN_LOG);
    await screenshot(b.page, 'log-fork-fresh-browser-390');

    // The first browser remembers the honest checkpoint and says exactly what failed.
    await a.page.reload();
    await expect
      .poll(() => a.page.locator('.pl-log').innerText(), { timeout: 20_000 })
      .toMatch(
        /public log check failed[\s\S]*not consistent with the checkpoint of \d+ entries this browser saw before/,
      );
    await screenshot(a.page, 'log-fork-remembering-browser');
  });
});
