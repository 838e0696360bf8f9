import type { MigrationInterface, QueryRunner } from 'typeorm';
import { refreshStoredCopies } from '../audit/refresh-stored-copies';

/**
 * Format version 2's reducer keeps more in a lot's state (the described count, the beads taken
 * out, the exhibits an opinion may cite, the format version) and counts what remains
 * cumulatively. The cached state and lot view of lots written before are rewritten from their
 * rolls, so the audit, which compares them with a replay, does not read them as tampered. The
 * caches are derived: there is nothing to undo.
 */
export class RefreshCachedRollState1796471607047 implements MigrationInterface {
  name = 'RefreshCachedRollState1796471607047';

  async up(q: QueryRunner): Promise<void> {
    await refreshStoredCopies(q.manager);
  }

  async down(): Promise<void> {
    // Derived copies only: the rolls are unchanged.
  }
}
