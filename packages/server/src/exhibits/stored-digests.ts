import type { ExhibitRef } from '@beadroll/core';
import type { DataSource } from 'typeorm';

/**
 * Every stored file an exhibit row names (original and derivatives), each once, sorted: what a
 * backup of the exhibit store must hold. Plain, for the command-line tools that run without the app.
 */
export async function storedExhibitDigests(ds: DataSource): Promise<string[]> {
  const rows: Array<{ ref: ExhibitRef }> = await ds.query('SELECT "ref" FROM "exhibits" ORDER BY "id"');
  const out = new Set<string>();
  for (const { ref } of rows) {
    out.add(ref.original.sha256);
    for (const d of ref.derivatives) out.add(d.sha256);
  }
  return [...out].sort();
}
