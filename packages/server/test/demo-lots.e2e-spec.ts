import { formatLotCode, parseBundleText, verifyBundle, type Bundle } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import {
  DEMO_LOTS_FILE,
  loadDemoLots,
  readDemoLots,
  seedLots,
  type LoadedDemoLot,
} from '../src/demo/demo-lots';
import { runSeed, seedAccounts, type DemoReport } from '../src/demo/seed';
import { LedgerService } from '../src/ledger/ledger.service';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { useTestApp } from './support/test-app';

/** Keys that name private facts; none may appear anywhere in public data (the header's `sealed` is only the root of salted digests). */
const PRIVATE_KEYS =
  /^(salt|salts|commitments|cost|price|acquisition|storageLocation|visibleTo|privateNote)$/i;

function keysDeep(v: unknown, out: string[] = []): string[] {
  if (Array.isArray(v)) v.forEach((x) => keysDeep(x, out));
  else if (v && typeof v === 'object')
    for (const [k, x] of Object.entries(v)) {
      out.push(k);
      keysDeep(x, out);
    }
  return out;
}

/** Every JSON value inside a public answer, body and header strings decoded too. */
function decodeStrings(v: unknown): unknown {
  if (typeof v === 'string' && (v.startsWith('{') || v.startsWith('['))) {
    try {
      return decodeStrings(JSON.parse(v));
    } catch {
      return v;
    }
  }
  if (Array.isArray(v)) return v.map(decodeStrings);
  if (v && typeof v === 'object')
    return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, decodeStrings(x)]));
  return v;
}

const DEMO_LOT_STEPS = [seedAccounts, seedLots];

describe('the demo lots', () => {
  let loaded: LoadedDemoLot[];
  let report: DemoReport;
  const dealers: Record<string, string> = {};

  const t = useTestApp();
  beforeAll(async () => {
    // The accounts and the lots, as npm start loads them (later steps add lots of their own).
    report = await runSeed(t.app, DEMO_LOT_STEPS);
    for (const row of (await t.app.get(DataSource).query('SELECT id, handle FROM accounts')) as Array<{
      id: string;
      handle: string;
    }>)
      dealers[row.handle] = row.id;
    loaded = await loadDemoLots(
      t.app.get(LedgerService),
      t.app.get(RollReaderService),
      readDemoLots(DEMO_LOTS_FILE),
      dealers,
    );
  });

  it('are a few dozen varied lots with the same codes on every load, loaded once', async () => {
    expect(loaded.length).toBeGreaterThanOrEqual(24);
    expect(new Set(loaded.map((l) => l.code)).size).toBe(loaded.length);
    expect(loaded.some((l) => !l.listed)).toBe(true);
    const again = await loadDemoLots(
      t.app.get(LedgerService),
      t.app.get(RollReaderService),
      readDemoLots(DEMO_LOTS_FILE),
      dealers,
    );
    expect(again.map((l) => l.code)).toEqual(loaded.map((l) => l.code));
    // Other steps of the scenario add lots of their own; these codes are each on the ledger once.
    const [{ n }] = (await t.app
      .get(DataSource)
      .query('SELECT count(*)::int AS n FROM lots WHERE code = ANY($1)', [
        loaded.map((l) => l.code),
      ])) as Array<{
      n: number;
    }>;
    expect(n).toBe(loaded.length);
  });

  it('gives the start banner at least three listed lots (later steps add their own; it prints the last three)', async () => {
    expect(report.publicLots.length).toBeGreaterThanOrEqual(3);
    const listed = new Set(loaded.filter((l) => l.listed).map((l) => l.code));
    for (const p of report.publicLots) expect(listed.has(p.code)).toBe(true);
    const again = await runSeed(t.app, DEMO_LOT_STEPS);
    expect(again.publicLots).toEqual(report.publicLots);
  });

  it('every demo roll verifies', async () => {
    const reader = t.app.get(RollReaderService);
    for (const l of loaded) {
      const lot = await reader.findLot(l.code);
      const bundle = parseBundleText(
        JSON.stringify({
          format: 'beadroll-bundle',
          version: 1,
          rolls: [
            {
              lot: l.code,
              scope: 'full',
              entries: (await reader.entries(lot!.id)).map(({ hash, header, body, logIndex }) => ({
                hash,
                header,
                body,
                logIndex,
              })),
            },
          ],
          checkpoints: [],
        }),
      );
      expect(verifyBundle(bundle).failures).toEqual([]);
    }
  });

  it('public routes serve listed lots and leak nothing sealed, across the whole demo', async () => {
    const sealedValues: string[] = [];
    const rows: Array<{ value: string }> = await t.app
      .get(DataSource)
      .query('SELECT value, salt FROM sealed_fields');
    expect(rows.length).toBeGreaterThan(5);
    for (const r of rows as Array<{ value: string; salt: string }>) sealedValues.push(r.value, r.salt);
    for (const l of loaded) {
      const page = await request(t.app.getHttpServer()).get(`/api/public/lots/${l.code}`);
      const file = await request(t.app.getHttpServer()).get(
        `/api/public/lots/${formatLotCode(l.code)}/bundle`,
      );
      if (!l.listed) {
        expect(page.status).toBe(404);
        expect(file.status).toBe(404);
        continue;
      }
      expect(page.status).toBe(200);
      expect(Object.keys(page.body).sort()).toEqual(['bundle', 'cards', 'code']);
      expect(page.body.cards[dealers[l.holder]!]).toMatchObject({ handle: l.holder, status: 'verified' });
      expect(file.status).toBe(200);
      expect(file.headers['content-disposition']).toBe(`attachment; filename="${l.code}.beadroll.json"`);
      expect(verifyBundle(parseBundleText(file.text)).ok).toBe(true);
      expect((page.body as { bundle: Bundle }).bundle).toEqual(JSON.parse(file.text));
      for (const text of [page.text, file.text]) {
        for (const s of sealedValues) expect(text).not.toContain(s.replace(/^"|"$/g, ''));
        const keys = keysDeep(decodeStrings(JSON.parse(text)));
        expect(keys.filter((k) => PRIVATE_KEYS.test(k))).toEqual([]);
      }
    }
  });

  it('answers every code that is not a listed lot with the same bare 404', async () => {
    const unlisted = loaded.find((l) => !l.listed)!.code;
    const listed = loaded.find((l) => l.listed)!.code;
    const wrongCheck = listed.slice(0, 8) + (listed[8] === '0' ? '1' : '0');
    const bodies = new Set<string>();
    for (const code of [
      unlisted,
      'ZZZZZZZZZ',
      '7K2Q-M9XA-T',
      wrongCheck,
      'not-a-code',
      '%20',
      'x'.repeat(300),
    ]) {
      for (const path of [
        `/api/public/lots/${encodeURIComponent(code)}`,
        `/api/public/lots/${encodeURIComponent(code)}/bundle`,
      ]) {
        const res = await request(t.app.getHttpServer()).get(path).expect(404);
        const { requestId: _r, ...rest } = res.body.error as Record<string, unknown>;
        bodies.add(JSON.stringify(rest));
      }
    }
    expect([...bodies]).toEqual([JSON.stringify({ code: 'not_found', message: 'Not found.' })]);
  });
});
