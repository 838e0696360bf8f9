import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository's root directory. */
export const REPO = fileURLToPath(new URL('../../../', import.meta.url));

/** The format document's example bundle (docs/ledger-format.md §11): invented lots, every roll intact. */
export const EXAMPLE = readFileSync(join(REPO, 'docs/examples/bundle.json'), 'utf8');

/**
 * The same example as format version 1 wrote it, frozen in core's tests: one roll has a note
 * whose body was removed, so it verifies as intact but not fully checkable after a removal.
 */
export const EXAMPLE_V1 = readFileSync(join(REPO, 'packages/core/test/fixtures/bundle-v1.json'), 'utf8');

interface ExampleRoll {
  lot: string;
  entries: Array<{ hash: string; header: string; body: string | null; logIndex: number | null }>;
}

/**
 * The example with one body changed in place: roll 1, entry 3 (an opinion) says "low" where it
 * said "high", so its digest no longer matches its header. Returns the text and the lot it breaks.
 */
export function tamperedExample(): { text: string; lot: string; seq: number } {
  const b = JSON.parse(EXAMPLE) as { rolls: ExampleRoll[] };
  const e = b.rolls[1]!.entries[4]!;
  if (!e.body?.includes('high')) throw new Error('the example bundle changed: pick another entry');
  e.body = e.body.replace('high', 'low');
  return { text: JSON.stringify(b), lot: b.rolls[1]!.lot, seq: 4 };
}

/** Files that are not bundles at all, each with what makes it so (exit 2). */
export const NOT_BUNDLES: Array<{ name: string; bytes: Uint8Array | string; why: string }> = [
  // 0xFF and 0xFE never appear in UTF-8 (RFC 3629 §1).
  { name: 'not-utf8.json', bytes: new Uint8Array([0xff, 0xfe, 0x7b, 0x7d]), why: 'not-utf8' },
  // A byte-order mark is not part of a JSON text (RFC 8259 §8.1: implementations MUST NOT add one).
  { name: 'bom.json', bytes: new Uint8Array([0xef, 0xbb, 0xbf, 0x7b, 0x7d]), why: 'not-utf8' },
  { name: 'not-json.json', bytes: '{"format":', why: 'not-json' },
  { name: 'list.json', bytes: '[1,2,3]', why: 'not-a-bundle' },
  {
    name: 'wrong-shape.json',
    bytes: JSON.stringify({ format: 'beadroll-bundle', version: 1, rolls: 'x', checkpoints: [] }),
    why: 'not-a-bundle',
  },
  {
    name: 'unknown-version.json',
    bytes: JSON.stringify({ format: 'beadroll-bundle', version: 99, rolls: [], checkpoints: [] }),
    why: 'unknown-version',
  },
];

/** A fresh temporary directory holding the given files. */
export function filesIn(files: Record<string, Uint8Array | string>): string {
  const dir = mkdtempSync(join(tmpdir(), 'beadroll-verify-test-'));
  for (const [name, bytes] of Object.entries(files)) writeFileSync(join(dir, name), bytes);
  return dir;
}
