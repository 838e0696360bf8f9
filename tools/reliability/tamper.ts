// Tamper: every column of every ledger table is changed in turn (in a copy of a database made
// from a small ledger), and the full-ledger audit must name the lot and the first bad entry.
import { createRequire } from 'node:module';
import { join } from 'node:path';
import type { PgTarget } from '../lib/pg.ts';
import { account, Client, description, type Row, ServerProcess, SERVER_DIST, sql } from './harness.ts';

const LEDGER_TABLES = ['lots', 'entries', 'entry_bodies', 'sealed_fields'];
/** Columns that carry no ledger content: their change is harmless and nothing could notice it. */
const BOOKKEEPING: Record<string, string> = {
  'lots.created_at': 'when the row was inserted (server bookkeeping, not on the roll)',
  'entries.recorded_at': 'when the row was inserted (server bookkeeping, not on the roll)',
  'entries.log_index': 'reserved for checkpoint log positions; nothing writes it yet',
  'sealed_fields.id': 'a row number no other row refers to',
};

interface Target {
  code: string;
  lotId: string;
  /** The entry whose columns are changed (a transfer offer with a sealed price). */
  entryId: string;
  seq: number;
  /** The `redacted` entry, for its target column. */
  redactedId: string;
  redactedSeq: number;
  /** A later entry without sealed fields, to move a sealed field onto. */
  laterId: string;
  headSeq: number;
  sealedId: string;
}

/** Flips one digit (or, with none, one letter) so the value keeps its shape and CHECKs. */
function nudge(s: string): string {
  const i = s.search(/\d(?!.*\d)/);
  if (i >= 0) return s.slice(0, i) + String((Number(s[i]) + 1) % 10) + s.slice(i + 1);
  const j = s.search(/[a-z](?!.*[a-z])/i);
  if (j < 0) return `${s}x`;
  const c = s[j]!;
  return (
    s.slice(0, j) +
    (c === 'a' || c === 'A'
      ? String.fromCharCode(c.charCodeAt(0) + 1)
      : String.fromCharCode(c.charCodeAt(0) - 1)) +
    s.slice(j + 1)
  );
}

/** Builds the small ledger the mutations start from, through the real server. */
async function build(target: PgTarget, database: string, dataDir: string): Promise<Target> {
  const server = await ServerProcess.create(target, database, dataDir);
  await server.migrate();
  await server.start();
  try {
    const mk = async (role: 'dealer' | 'registrar') => {
      const a = await account(target, database, role);
      const c = new Client(server);
      await c.signIn(a.email, a.password);
      return Object.assign(c, { id: a.id });
    };
    const a = await mk('dealer');
    const b = await mk('dealer');
    const registrar = await mk('registrar');
    const must = async (p: Promise<{ status: number; body: unknown }>) => {
      const r = await p;
      if (r.status >= 300)
        throw new Error(`building the tamper ledger: ${r.status} ${JSON.stringify(r.body)}`);
      return r.body as Record<string, unknown>;
    };
    // A few other lots, so the audit has good rolls around the broken one.
    for (const t of ['Amber discs', 'Green hearts'])
      await must(a.write('POST', '/api/lots', { description: description(t) }));
    const lot = await must(
      a.write('POST', '/api/lots', {
        description: description('Striped chevrons'),
        sealed: {
          storageLocation: 'drawer 4',
          acquisition: { source: 'a house clearance', cost: { amount: 1200, currency: 'EUR' } },
        },
      }),
    );
    const code = lot.code as string;
    await must(a.write('POST', `/api/lots/${code}/observations`, { observations: { windingMarks: 'seen' } }));
    await must(
      a.write('POST', '/api/transfers/offers', {
        lot: code,
        recipient: b.id,
        price: { amount: 5000, currency: 'EUR' },
      }),
    );
    const offers = await must(a.send('GET', '/api/transfers/offers?box=outgoing'));
    const offer = (offers.items as Array<{ id: string; lot: { code: string } | string }>)[0]!;
    await must(b.write('POST', `/api/transfers/offers/${offer.id}/accept`, {}));
    await must(
      registrar.write('POST', '/api/registry/redactions', { lot: code, seq: 1, reason: 'personal-data' }),
    );
    await must(
      b.write('POST', `/api/lots/${code}/splits`, {
        children: [
          { description: description('Chevrons, part one', 10) },
          { description: description('Chevrons, part two', 10) },
        ],
      }),
    );
    const rows = await sql<{ id: string; seq: number; kind: string; lot_id: string }>(
      target,
      database,
      `SELECT e."id", e."seq", e."kind", e."lot_id" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1 ORDER BY e."seq"`,
      [code],
    );
    const offered = rows.find((r) => r.kind === 'transfer-offered')!;
    const redacted = rows.find((r) => r.kind === 'redacted')!;
    const later = rows.find((r) => r.kind === 'transfer-accepted')!;
    const [sealed] = await sql<{ id: string }>(
      target,
      database,
      `SELECT "id" FROM "sealed_fields" WHERE "entry_id" = $1 AND "name" = 'transfer-price'`,
      [offered.id],
    );
    return {
      code,
      lotId: offered.lot_id,
      entryId: offered.id,
      seq: offered.seq,
      redactedId: redacted.id,
      redactedSeq: redacted.seq,
      laterId: later.id,
      headSeq: rows[rows.length - 1]!.seq,
      sealedId: sealed!.id,
    };
  } finally {
    await server.stop();
  }
}

/** The UPDATE that changes one column, and the seq the audit must name. */
function mutation(table: string, column: string, t: Target): { sql: string; seq: number } | null {
  const text = (where: string) => `SET "${column}" = $$NUDGE$$ WHERE ${where}`;
  switch (`${table}.${column}`) {
    case 'lots.id':
      return { sql: `UPDATE "lots" SET "id" = gen_random_uuid() WHERE "id" = '${t.lotId}'`, seq: 0 };
    case 'lots.code':
      return { sql: `UPDATE "lots" ${text(`"id" = '${t.lotId}'`)}`, seq: 0 };
    case 'lots.head_seq':
      return {
        sql: `UPDATE "lots" SET "head_seq" = "head_seq" - 1 WHERE "id" = '${t.lotId}'`,
        seq: t.headSeq,
      };
    case 'lots.head_hash':
    case 'lots.head_time':
      return { sql: `UPDATE "lots" ${text(`"id" = '${t.lotId}'`)}`, seq: t.headSeq };
    case 'lots.state':
      return {
        sql: `UPDATE "lots" SET "state" = jsonb_set("state", '{remaining,value}', to_jsonb(("state"->'remaining'->>'value')::int + 1)) WHERE "id" = '${t.lotId}'`,
        seq: t.headSeq,
      };
    case 'entries.id':
      return { sql: `UPDATE "entries" SET "id" = DEFAULT WHERE "id" = ${t.entryId}`, seq: t.seq };
    case 'entries.lot_id':
      return {
        sql: `UPDATE "entries" SET "lot_id" = (SELECT "id" FROM "lots" WHERE "id" <> '${t.lotId}' ORDER BY "code" LIMIT 1) WHERE "id" = ${t.entryId}`,
        seq: t.seq,
      };
    case 'entries.kind':
      // Another kind the table accepts (its CHECK lists them).
      return { sql: `UPDATE "entries" SET "kind" = 'note' WHERE "id" = ${t.entryId}`, seq: t.seq };
    case 'entries.seq':
      return { sql: `UPDATE "entries" SET "seq" = "seq" + 1000 WHERE "id" = ${t.entryId}`, seq: t.seq };
    case 'entries.redacts_seq':
      return {
        sql: `UPDATE "entries" SET "redacts_seq" = "redacts_seq" + 1 WHERE "id" = ${t.redactedId}`,
        seq: t.redactedSeq,
      };
    case 'entry_bodies.entry_id':
      return {
        sql: `UPDATE "entry_bodies" SET "entry_id" = "entry_id" + 100000 WHERE "entry_id" = ${t.entryId}`,
        seq: t.seq,
      };
    case 'entry_bodies.body':
      return { sql: `UPDATE "entry_bodies" ${text(`"entry_id" = ${t.entryId}`)}`, seq: t.seq };
    case 'sealed_fields.entry_id':
      return {
        sql: `UPDATE "sealed_fields" SET "entry_id" = ${t.laterId} WHERE "id" = ${t.sealedId}`,
        seq: t.seq,
      };
    case 'sealed_fields.visible_to':
      return {
        sql: `UPDATE "sealed_fields" SET "visible_to" = "visible_to" || gen_random_uuid()::varchar WHERE "id" = ${t.sealedId}`,
        seq: t.seq,
      };
    default:
      if (table === 'entries') return { sql: `UPDATE "entries" ${text(`"id" = ${t.entryId}`)}`, seq: t.seq };
      if (table === 'sealed_fields')
        return { sql: `UPDATE "sealed_fields" ${text(`"id" = ${t.sealedId}`)}`, seq: t.seq };
      return null;
  }
}

/** The server's own audit, loaded from its build and run in this process against `database`. */
async function runAudit(
  target: PgTarget,
  database: string,
): Promise<Array<{ lot: string; seq: number; reason: string }>> {
  const require = createRequire(import.meta.url);
  require('reflect-metadata');
  const { loadConfig } = require(join(SERVER_DIST, 'config', 'app-config.js'));
  const { createDataSource } = require(join(SERVER_DIST, 'database', 'data-source.js'));
  const { AuditService } = require(join(SERVER_DIST, 'audit', 'audit.service.js'));
  const ds = createDataSource(
    loadConfig({
      PGHOST: target.host,
      PGPORT: String(target.port),
      PGUSER: target.user,
      PGPASSWORD: target.password,
      PGDATABASE: database,
    }),
  );
  await ds.initialize();
  try {
    const broken: Array<{ lot: string; seq: number; reason: string }> = [];
    for await (const e of new AuditService(ds).run(1_000_000)) if (e.type === 'broken') broken.push(e);
    return broken;
  } finally {
    await ds.destroy();
  }
}

export async function tamperSection(target: PgTarget, work: string): Promise<Row[]> {
  const rows: Row[] = [];
  const base = 'rel_tamper_base';
  await sql(target, 'postgres', `DROP DATABASE IF EXISTS ${base} WITH (FORCE)`, [], true);
  await sql(target, 'postgres', `CREATE DATABASE ${base} OWNER "${target.user}"`, [], true);
  const t = await build(target, base, join(work, 'tamper'));
  const clean = await runAudit(target, base);
  rows.push({
    section: 'tamper',
    check: 'untouched ledger',
    detail: clean.length ? `${clean.length} broken` : 'audit passes',
    ok: clean.length === 0,
  });
  const columns = await sql<{ table_name: string; column_name: string; data_type: string }>(
    target,
    base,
    `SELECT "table_name", "column_name", "data_type" FROM information_schema.columns
      WHERE table_schema = 'public' AND table_name = ANY($1) ORDER BY table_name, ordinal_position`,
    [LEDGER_TABLES],
  );
  for (const c of columns) {
    const name = `${c.table_name}.${c.column_name}`;
    if (BOOKKEEPING[name]) {
      rows.push({
        section: 'tamper',
        check: name,
        detail: `not ledger content: ${BOOKKEEPING[name]}`,
        ok: null,
      });
      continue;
    }
    const m = mutation(c.table_name, c.column_name, t);
    if (!m) {
      rows.push({ section: 'tamper', check: name, detail: 'no mutation defined for this column', ok: false });
      continue;
    }
    const copy = `rel_tamper_${c.table_name}_${c.column_name}`.slice(0, 60);
    await sql(target, 'postgres', `DROP DATABASE IF EXISTS ${copy} WITH (FORCE)`, [], true);
    await sql(
      target,
      'postgres',
      `CREATE DATABASE ${copy} TEMPLATE ${base} OWNER "${target.user}"`,
      [],
      true,
    );
    try {
      let statement = m.sql;
      if (statement.includes('$$NUDGE$$')) {
        const table = c.table_name;
        const where = statement.slice(statement.indexOf(' WHERE ') + 7);
        const [row] = await sql<{ v: string }>(
          target,
          copy,
          `SELECT "${c.column_name}"::text AS v FROM "${table}" WHERE ${where}`,
        );
        statement = statement.replace('$$NUDGE$$', `'${nudge(row!.v).replace(/'/g, "''")}'`);
      }
      // Past the append-only triggers and foreign keys, as someone with the database's files would be.
      await sql(
        target,
        copy,
        `BEGIN; SET LOCAL session_replication_role = replica; ${statement}; COMMIT`,
        [],
        true,
      );
      const broken = await runAudit(target, copy);
      // A changed lot code is reported under the code the table now holds.
      const lot = name === 'lots.code' ? nudge(t.code) : t.code;
      const hit = broken.find((b) => b.lot === lot);
      const ok = hit?.seq === m.seq;
      rows.push({
        section: 'tamper',
        check: name,
        detail: hit
          ? `audit names ${hit.lot} seq ${hit.seq} (${hit.reason})${ok ? '' : `, expected seq ${m.seq}`}`
          : 'NOT DETECTED',
        ok,
      });
    } catch (err) {
      rows.push({
        section: 'tamper',
        check: name,
        detail: `could not run: ${(err as Error).message.split('\n')[0]}`,
        ok: false,
      });
    } finally {
      await sql(target, 'postgres', `DROP DATABASE IF EXISTS ${copy} WITH (FORCE)`, [], true);
    }
  }
  await sql(target, 'postgres', `DROP DATABASE IF EXISTS ${base} WITH (FORCE)`, [], true);
  return rows;
}
