import { createHash } from 'node:crypto';
import { BUNDLE_VERSION } from '@beadroll/core';
import type { DealerCard } from '../accounts/dto/dealer-card.dto';

/**
 * One statement for the public answer of a listed lot (parameter: its canonical code): no row
 * unless the code is a listed lot. PostgreSQL writes the roll's entries as JSON text, member by
 * member in the order toPublicBundle (public-lots.service) gives them (hash, header, body, logIndex), so the
 * stored strings go out without being decoded and encoded again; `to_json(text)` escapes exactly
 * the characters JSON.stringify escapes. `checkpoints` is the bundle's checkpoint list as JSON
 * text. `cards` are the verified accounts among the roll's actors and the recipients of its
 * transfer offers, in the order they first appear on it, shaped as {@link DealerCard} with
 * the same status rule as DealerCardsService.
 * `has_parents` says the first entry names parent lots: those need the bundle walk over ancestors.
 * Framework-free so the public-data benchmark's bare server can run the very same text.
 */
export const PUBLIC_LOT_SQL = `
SELECT
  COALESCE((SELECT COALESCE(json_typeof(e."header"::json -> 'parents'), 'null') <> 'null'
              FROM "entries" e WHERE e."lot_id" = v."lot_id" AND e."seq" = 0), false) AS "has_parents",
  COALESCE((SELECT '[' || string_agg(
                 '{"hash":' || to_json(e."hash")::text
              || ',"header":' || to_json(e."header")::text
              || ',"body":' || COALESCE(to_json(b."body")::text, 'null')
              || ',"logIndex":' || COALESCE(e."log_index"::text, 'null') || '}',
               ',' ORDER BY e."seq") || ']'
              FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
              WHERE e."lot_id" = v."lot_id"), '[]') AS "entries",
  (SELECT e."seq" FROM "entries" e WHERE e."lot_id" = v."lot_id" ORDER BY e."seq" DESC LIMIT 1) AS "head_seq",
  (SELECT e."log_index" FROM "entries" e WHERE e."lot_id" = v."lot_id" ORDER BY e."seq" DESC LIMIT 1)
    AS "head_log_index",
  (SELECT json_agg(json_build_object(
            'id', a."id",
            'handle', a."handle",
            'displayName', a."display_name",
            'business', a."business",
            'town', a."town",
            'country', a."country",
            'verifiedSince', to_char(a."verified_at" AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
            'status', CASE a."status" WHEN 'verified' THEN 'verified' WHEN 'suspended' THEN 'suspended'
                      ELSE 'former' END,
            'role', a."role")
          ORDER BY r."first")
     FROM (SELECT x."actor", min(x."at") AS "first" FROM (
              SELECT e."actor", 2 * e."seq" AS "at" FROM "entries" e WHERE e."lot_id" = v."lot_id"
              UNION ALL
              SELECT b."body"::json ->> 'recipient', 2 * e."seq" + 1
                FROM "entries" e JOIN "entry_bodies" b ON b."entry_id" = e."id"
               WHERE e."lot_id" = v."lot_id" AND e."kind" = 'transfer-offered') x
            GROUP BY x."actor") r
     JOIN "accounts" a ON a."id"::text = r."actor"
     WHERE a."verified_at" IS NOT NULL) AS "cards"
FROM "lot_views" v
WHERE v."code" = $1 AND v."listed"`;

/**
 * The name {@link PUBLIC_LOT_SQL} is prepared under: each pooled connection parses and plans it
 * once and afterwards only binds a code and executes it (planning costs about as much as
 * running it on a roll of a few dozen entries).
 */
export const PUBLIC_LOT_STATEMENT = 'beadroll_public_lot';

/** What {@link readPublicLot} needs of a connection pool: pg's `Pool#query` with a named statement. */
export interface NamedStatementPool {
  query(config: { name: string; text: string; values: unknown[] }): Promise<{ rows: unknown[] }>;
}

/** The row of the listed lot `code` (canonical), or undefined when it is not a listed lot. */
export async function readPublicLot(
  pool: NamedStatementPool,
  code: string,
): Promise<PublicLotRow | undefined> {
  const { rows } = await pool.query({ name: PUBLIC_LOT_STATEMENT, text: PUBLIC_LOT_SQL, values: [code] });
  return rows[0] as PublicLotRow | undefined;
}

/**
 * What a composed public answer of a listed lot (parameter 1: its canonical code) depends on, read
 * before that answer so it can never be newer than the answer: the roll's head (hash, seq, log
 * index) and a digest of the card columns of the accounts `$2` (the roll's actors and offer
 * recipients). No row unless the code is a listed lot. The checkpoint member depends on the
 * log's latest checkpoint too, which the caller compares itself.
 */
export const PUBLIC_LOT_KEY_SQL = `
SELECT l."head_hash" AS "head", l."head_seq",
  (SELECT e."log_index" FROM "entries" e WHERE e."lot_id" = l."id" AND e."seq" = l."head_seq") AS "head_log_index",
  (SELECT encode(sha256(convert_to(string_agg(e."hash" || e."header" || coalesce(b."body", '-'), ',' ORDER BY e."seq"), 'UTF8')), 'hex')
     FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE e."lot_id" = l."id") AS "roll",
  (SELECT md5(string_agg(ROW(a."id", a."handle", a."display_name", a."business", a."town", a."country",
                             a."verified_at", a."status", a."role")::text, ',' ORDER BY a."id"))
     FROM "accounts" a WHERE a."id" = ANY($2::uuid[])) AS "accounts"
FROM "lot_views" v JOIN "lots" l ON l."id" = v."lot_id"
WHERE v."code" = $1 AND v."listed"`;

/** The row {@link PUBLIC_LOT_KEY_SQL} returns for a listed lot. */
export interface PublicLotKeyRow {
  head: string;
  /**
   * A digest of every stored entry and body of the roll: a change made to the stored text
   * behind the ledger's back (which the buyer's browser must be shown) makes a kept answer stale.
   */
  roll: string;
  head_seq: number;
  head_log_index: string | null;
  accounts: string | null;
}

/** The key row of the listed lot `code` with the digest over `accounts`, or undefined. */
export async function readPublicLotKey(
  pool: NamedStatementPool,
  code: string,
  accounts: readonly string[],
): Promise<PublicLotKeyRow | undefined> {
  const { rows } = await pool.query({
    name: `${PUBLIC_LOT_STATEMENT}_key`,
    text: PUBLIC_LOT_KEY_SQL,
    values: [code, accounts],
  });
  return rows[0] as PublicLotKeyRow | undefined;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The accounts a roll's cards can name (its actors and the recipients of its transfer offers,
 * as PUBLIC_LOT_SQL picks them), sorted, from the entries text of a {@link PublicLotRow}.
 */
export function cardAccounts(entries: string): string[] {
  const ids = new Set<string>();
  for (const e of JSON.parse(entries) as Array<{ header: string; body: string | null }>) {
    const h = JSON.parse(e.header) as { actor?: unknown; kind?: unknown };
    if (typeof h.actor === 'string' && UUID.test(h.actor)) ids.add(h.actor);
    if (h.kind === 'transfer-offered' && e.body !== null) {
      const r = (JSON.parse(e.body) as { recipient?: unknown }).recipient;
      if (typeof r === 'string' && UUID.test(r)) ids.add(r);
    }
  }
  return [...ids].sort();
}

/** The weak ETag express gives a text answer (length and SHA-1 of its UTF-8 bytes). */
export function weakEtag(text: string): string {
  const hash = createHash('sha1').update(text, 'utf8').digest('base64').substring(0, 27);
  return `W/"${Buffer.byteLength(text, 'utf8').toString(16)}-${hash}"`;
}

/** The row {@link PUBLIC_LOT_SQL} returns for a listed lot. */
export interface PublicLotRow {
  has_parents: boolean;
  /** JSON array text of the roll's entries. */
  entries: string;
  /** seq and log index (bigint as text, or null) of the roll's head, for its checkpoint proof. */
  head_seq: number;
  head_log_index: string | null;
  cards: DealerCard[] | null;
}

/**
 * The serialised PublicLotResponse of a lot whose bundle is its own roll alone (no parents), with
 * the members in the order the DTO has them; the entries text is inserted as PostgreSQL wrote it.
 */
export function publicLotText(code: string, row: PublicLotRow, checkpoints = '[]'): string {
  const cards: Record<string, DealerCard> = {};
  for (const card of row.cards ?? []) cards[card.id] = card;
  const lot = JSON.stringify(code);
  return (
    `{"code":${lot},"bundle":{"format":"beadroll-bundle","version":${BUNDLE_VERSION},` +
    `"rolls":[{"lot":${lot},"scope":"full","entries":${row.entries}}],"checkpoints":${checkpoints}},` +
    `"cards":${JSON.stringify(cards)}}`
  );
}
