import type { EntityManager } from 'typeorm';

/**
 * Gives the entries a transaction wrote (ids in the order written) the next indices of the
 * ledger-wide log. Called as the transaction's last statements: the update of the one
 * `log_head` row holds its row lock until commit, so concurrent appends take their indices one
 * after the other, in the order they commit, with no gaps (a rolled-back transaction also
 * rolls back its increment). Every other statement of an append runs before it, unserialised.
 */
export async function sequenceEntries(manager: EntityManager, entryIds: readonly string[]): Promise<void> {
  if (entryIds.length === 0) return;
  const rows: Array<{ size: string }> = await manager.query(
    'WITH "u" AS (UPDATE "log_head" SET "size" = "size" + $1 WHERE "id" = 1 RETURNING "size") SELECT "size" FROM "u"',
    [entryIds.length],
  );
  const first = BigInt(rows[0]!.size) - BigInt(entryIds.length);
  await manager.query(
    `UPDATE "entries" e SET "log_index" = $1::bigint + x."ord" - 1
       FROM unnest($2::bigint[]) WITH ORDINALITY AS x("id", "ord")
      WHERE e."id" = x."id"`,
    [first.toString(), entryIds],
  );
}
