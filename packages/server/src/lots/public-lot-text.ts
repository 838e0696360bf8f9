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
