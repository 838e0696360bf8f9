/**
 * SQL the accounts module gives other modules for dealer cards inside one statement of theirs
 * (the public lot answer). The text that names the accounts table is written here, beside its
 * owner, with the same status rule as DealerCardsService.
 */

/**
 * The cards (JSON array, shaped as DealerCard) of the verified accounts among `named`: an SQL
 * row source with columns "actor" (an account id as text) and "first" (the cards' order).
 */
export function dealerCardsJsonSql(named: string): string {
  return `(SELECT json_agg(json_build_object(
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
     FROM ${named} r
     JOIN "accounts" a ON a."id"::text = r."actor"
     WHERE a."verified_at" IS NOT NULL)`;
}

/** A digest (md5) of the card columns of the accounts whose ids are the uuid[] expression `ids`. */
export function dealerCardsDigestSql(ids: string): string {
  return `(SELECT md5(string_agg(ROW(a."id", a."handle", a."display_name", a."business", a."town", a."country",
                             a."verified_at", a."status", a."role")::text, ',' ORDER BY a."id"))
     FROM "accounts" a WHERE a."id" = ANY(${ids}))`;
}
