import type { EntityManager } from 'typeorm';

/** First key of the transaction advisory locks on a blob name ("BRBL"). */
export const BLOB_LOCK = 0x4252424c;

/**
 * Locks blob names until the transaction ends: shared while an upload stores them, exclusive
 * while they are deleted (a redaction, a failed upload's clean-up). Names are taken in sorted
 * order, so two transactions locking overlapping sets never wait on each other in a circle.
 */
export async function lockBlobNames(
  m: EntityManager,
  digests: readonly string[],
  mode: 'shared' | 'exclusive',
): Promise<void> {
  const fn = mode === 'shared' ? 'pg_advisory_xact_lock_shared' : 'pg_advisory_xact_lock';
  for (const digest of [...new Set(digests)].sort())
    await m.query(`SELECT ${fn}($1, hashtext($2))`, [BLOB_LOCK, digest]);
}
