import { BUNDLE_VERSION } from '@beadroll/core';
import type { PublicDealerCard } from './dto/public-lot.dto';

/**
 * One statement for the public answer of a listed lot (parameter: its canonical code): no row
 * unless the code is a listed lot. PostgreSQL writes the roll's entries as JSON text, member by
 * member in the order toPublicBundle (public-lots.service) gives them (hash, header, body, logIndex), so the
 * stored strings go out without being decoded and encoded again; `to_json(text)` escapes exactly
 * the characters JSON.stringify escapes. `cards` are the verified accounts among the roll's
 * actors in the order they first appear on it, shaped as {@link PublicDealerCard} with the same
 * status rule as DealerCardsService.
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
  (SELECT json_agg(json_build_object(
            'id', a."id",
            'handle', a."handle",
            'displayName', a."display_name",
            'business', a."business",
            'town', a."town",
            'country', a."country",
            'verifiedSince', to_char(a."verified_at" AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
            'status', CASE a."status" WHEN 'verified' THEN 'verified' WHEN 'suspended' THEN 'suspended'
                      ELSE 'former' END)
          ORDER BY r."first")
     FROM (SELECT e."actor", min(e."seq") AS "first" FROM "entries" e
            WHERE e."lot_id" = v."lot_id" GROUP BY e."actor") r
     JOIN "accounts" a ON a."id"::text = r."actor"
     WHERE a."verified_at" IS NOT NULL) AS "cards"
FROM "lot_views" v
WHERE v."code" = $1 AND v."listed"`;

/** The row {@link PUBLIC_LOT_SQL} returns for a listed lot. */
export interface PublicLotRow {
  has_parents: boolean;
  /** JSON array text of the roll's entries. */
  entries: string;
  cards: PublicDealerCard[] | null;
}

/**
 * The serialised PublicLotResponse of a lot whose bundle is its own roll alone (no parents), with
 * the members in the order the DTO has them; the entries text is inserted as PostgreSQL wrote it.
 */
export function publicLotText(code: string, row: PublicLotRow): string {
  const cards: Record<string, PublicDealerCard> = {};
  for (const card of row.cards ?? []) cards[card.id] = card;
  const lot = JSON.stringify(code);
  return (
    `{"code":${lot},"bundle":{"format":"beadroll-bundle","version":${BUNDLE_VERSION},` +
    `"rolls":[{"lot":${lot},"scope":"full","entries":${row.entries}}],"checkpoints":[]},` +
    `"cards":${JSON.stringify(cards)}}`
  );
}
