import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  base64Encode,
  entryLeafHash,
  formatCheckpoint,
  formatVerifierKey,
  MerkleTree,
  noteSigner,
  signNote,
} from '@beadroll/core';

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

/**
 * The example as the registry would export it with its public log: every entry numbered in the
 * log in roll order, one signed checkpoint (C2SP tlog-checkpoint, Ed25519) of them all, and for
 * each full roll an inclusion proof (RFC 9162 §2.1.3) of its head. Returns the text, the log's
 * verifier key and, for tests of a forged signature, the key of another signer of the same name.
 */
export function exampleWithCheckpoint(): { text: string; logKey: string; otherKey: string } {
  const b = JSON.parse(EXAMPLE) as {
    rolls: Array<ExampleRoll & { scope: string }>;
    checkpoints: unknown[];
  };
  const leaves: string[] = [];
  for (const r of b.rolls)
    for (const e of r.entries) {
      e.logIndex = leaves.length;
      leaves.push(e.hash);
    }
  const tree = new MerkleTree(leaves.map(entryLeafHash));
  const size = leaves.length;
  const signer = noteSigner('log.beads.example', new Uint8Array(32).fill(7));
  const other = noteSigner('log.beads.example', new Uint8Array(32).fill(8));
  const note = signNote(formatCheckpoint({ origin: signer.name, size, root: tree.root(size) }), signer);
  b.checkpoints = [
    {
      note,
      inclusions: b.rolls
        .filter((r) => r.scope === 'full')
        .map((r) => {
          const head = r.entries.at(-1)!;
          const seq = (JSON.parse(head.header) as { seq: number }).seq;
          return {
            lot: r.lot,
            seq,
            logIndex: head.logIndex!,
            proof: tree.inclusionProof(head.logIndex!, size).map(base64Encode),
          };
        }),
    },
  ];
  return {
    text: JSON.stringify(b),
    logKey: formatVerifierKey(signer.name, signer.publicKey),
    otherKey: formatVerifierKey(other.name, other.publicKey),
  };
}
