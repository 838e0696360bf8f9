/**
 * SQL the ledger module gives other modules for reading a roll inside one statement of theirs
 * (the public lot answer is one statement on the busiest public read). Each function returns an
 * expression over the roll of the lot whose id is the SQL expression `lot`; the text that names
 * the ledger's tables is written here, beside the tables' owner, and nowhere else.
 */

/** Whether the roll's first entry names parent lots (a boolean). */
export function rollHasParentsSql(lot: string): string {
  return `COALESCE((SELECT COALESCE(json_typeof(e."header"::json -> 'parents'), 'null') <> 'null'
              FROM "entries" e WHERE e."lot_id" = ${lot} AND e."seq" = 0), false)`;
}

/**
 * The roll as JSON text: its entries in seq order, each written member by member (hash, header,
 * body, logIndex) from the stored strings, which go out without being decoded and encoded
 * again; `to_json(text)` escapes exactly the characters JSON.stringify escapes.
 */
export function rollEntriesJsonSql(lot: string): string {
  return `COALESCE((SELECT '[' || string_agg(
                 '{"hash":' || to_json(e."hash")::text
              || ',"header":' || to_json(e."header")::text
              || ',"body":' || COALESCE(to_json(b."body")::text, 'null')
              || ',"logIndex":' || COALESCE(e."log_index"::text, 'null') || '}',
               ',' ORDER BY e."seq") || ']'
              FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
              WHERE e."lot_id" = ${lot}), '[]')`;
}

/** The newest entry's seq, or its log index (`column`: "seq" or "log_index"). */
export function rollHeadSql(lot: string, column: 'seq' | 'log_index'): string {
  return `(SELECT e."${column}" FROM "entries" e WHERE e."lot_id" = ${lot} ORDER BY e."seq" DESC LIMIT 1)`;
}

/** The log index of the entry at `seq` (an SQL expression). */
export function rollLogIndexAtSql(lot: string, seq: string): string {
  return `(SELECT e."log_index" FROM "entries" e WHERE e."lot_id" = ${lot} AND e."seq" = ${seq})`;
}

/**
 * A digest (SHA-256, hex) of every stored entry and body of the roll: any change to the stored
 * text, even one made behind the ledger's back, changes it.
 */
export function rollTextDigestSql(lot: string): string {
  return `(SELECT encode(sha256(convert_to(string_agg(e."hash" || e."header" || coalesce(b."body", '-'), ',' ORDER BY e."seq"), 'UTF8')), 'hex')
     FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE e."lot_id" = ${lot})`;
}

/**
 * The accounts a roll names, as rows ("actor" text, "first" where it first appears): each
 * entry's actor at 2 × seq, and each transfer offer's recipient just after its entry.
 */
export function rollNamedAccountsSql(lot: string): string {
  return `(SELECT x."actor", min(x."at") AS "first" FROM (
              SELECT e."actor", 2 * e."seq" AS "at" FROM "entries" e WHERE e."lot_id" = ${lot}
              UNION ALL
              SELECT b."body"::json ->> 'recipient', 2 * e."seq" + 1
                FROM "entries" e JOIN "entry_bodies" b ON b."entry_id" = e."id"
               WHERE e."lot_id" = ${lot} AND e."kind" = 'transfer-offered') x
            GROUP BY x."actor")`;
}

/**
 * Joins the lot's head row as `alias` (its "head_hash", "head_seq", ...) to a statement that has
 * the lot's id as the SQL expression `lot`.
 */
export function lotHeadJoinSql(alias: string, lot: string): string {
  return `JOIN "lots" ${alias} ON ${alias}."id" = ${lot}`;
}
