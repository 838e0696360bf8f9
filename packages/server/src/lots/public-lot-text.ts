import { createHash } from 'node:crypto';
import { BUNDLE_VERSION } from '@beadroll/core';
import type { DealerCard } from '../accounts/dto/dealer-card.dto';
import { dealerCardsDigestSql, dealerCardsJsonSql } from '../accounts/dealer-card-sql';
import {
  lotHeadJoinSql,
  rollEntriesJsonSql,
  rollHasParentsSql,
  rollHeadSql,
  rollLogIndexAtSql,
  rollNamedAccountsSql,
  rollTextDigestSql,
} from '../ledger/roll-sql';

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
 * Framework-free so the public-data benchmark's bare server can run the very same text. The parts
 * that read the roll and the accounts are written by their owners (ledger/roll-sql,
 * accounts/dealer-card-sql); this module names only its own `lot_views`.
 */
export const PUBLIC_LOT_SQL = `
SELECT
  ${rollHasParentsSql('v."lot_id"')} AS "has_parents",
  ${rollEntriesJsonSql('v."lot_id"')} AS entries,
  ${rollHeadSql('v."lot_id"', 'seq')} AS "head_seq",
  ${rollHeadSql('v."lot_id"', 'log_index')}
    AS "head_log_index",
  ${dealerCardsJsonSql(rollNamedAccountsSql('v."lot_id"'))} AS "cards"
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
  ${rollLogIndexAtSql('l."id"', 'l."head_seq"')} AS "head_log_index",
  ${rollTextDigestSql('l."id"')} AS "roll",
  ${dealerCardsDigestSql('$2::uuid[]')} AS accounts
FROM "lot_views" v ${lotHeadJoinSql('l', 'v."lot_id"')}
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
