import {
  checkConsistency,
  parseVerifierKey,
  verifyBundleCheckpoint,
  base64Decode,
  base64Encode,
  type Bundle,
  type EntryHeader,
  type VerifierKey,
} from '@beadroll/core';

/** What this browser remembers of the registry's log: the largest checkpoint it has seen. */
export interface RememberedCheckpoint {
  size: number;
  /** Root hash, base64. */
  root: string;
  /** The signed note, kept as evidence should a later one disagree. */
  note: string;
}

/** How the page reaches the log and its own memory (injected so tests can run it offline). */
export interface LogCheckDeps {
  /** The verifier key written into the page when it was served (empty when it has none). */
  builtInKey: string;
  /** `GET /api/log/key`. */
  fetchKey(): Promise<string>;
  /** `GET /api/log/witnesses`: the registered witnesses' keys, one a line. */
  fetchWitnessKeys(): Promise<string>;
  /** `GET /api/log/proof/consistency`: the proof list (base64), from ≤ to. */
  fetchConsistency(from: number, to: number): Promise<unknown>;
  load(origin: string): RememberedCheckpoint | null;
  save(origin: string, c: RememberedCheckpoint): void;
}

/** The outcome the page shows. */
export type LogCheckResult =
  | {
      state: 'in-log';
      /** Time of the roll's first entry. */
      since: string;
      size: number;
      witnesses: number;
      /** The included entry's seq, and the head's (they differ when the head is newer than the checkpoint). */
      seq: number;
      headSeq: number;
      /** The size of the checkpoint this browser remembered before, if any. */
      rememberedSize: number | null;
    }
  | { state: 'not-yet' }
  | { state: 'failed'; what: string };

function fail(what: string): LogCheckResult {
  return { state: 'failed', what };
}

/**
 * Checks that the lot `code` in `bundle` is in the registry's public log (format §14.6): the
 * checkpoint's signature with the key built into the page (which must equal the served key), the
 * inclusion of the roll's latest covered entry, and consistency with the largest checkpoint this
 * browser remembered; then remembers the larger of the two.
 */
export async function checkLog(code: string, bundle: Bundle, deps: LogCheckDeps): Promise<LogCheckResult> {
  const member = bundle.checkpoints[0];
  if (member === undefined) return { state: 'not-yet' };
  let served: string;
  try {
    served = (await deps.fetchKey()).trim();
  } catch {
    return fail('The registry’s log key could not be fetched.');
  }
  const keyText = deps.builtInKey || served;
  if (deps.builtInKey && served !== deps.builtInKey)
    return fail('The registry’s log key served now is not the one built into this page.');
  let key: VerifierKey;
  try {
    key = parseVerifierKey(keyText);
  } catch {
    return fail('The registry’s log key is not a valid key.');
  }
  let witnessKeys: VerifierKey[];
  try {
    witnessKeys = (await deps.fetchWitnessKeys())
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean)
      .map(parseVerifierKey);
  } catch {
    witnessKeys = [];
  }
  const result = verifyBundleCheckpoint(member, bundle.rolls, key, witnessKeys);
  if (!result.checkpoint)
    return fail(`The log checkpoint does not verify: ${result.message ?? 'unknown reason'}.`);
  const cp = result.checkpoint;
  const roll = bundle.rolls.find((r) => r.lot === code);
  const inclusion = result.inclusions.find((i) => i.lot === code);
  if (!roll || roll.entries.length === 0) return fail('The history of this lot is missing from the data.');
  if (!inclusion) return { state: 'not-yet' };
  if (!inclusion.ok)
    return fail(
      `Entry ${inclusion.seq} is not in the registry’s log as claimed: ${inclusion.message ?? ''}.`,
    );
  const other = result.inclusions.find((i) => !i.ok);
  if (other)
    return fail(`Linked lot ${other.lot} is not in the registry’s log as claimed: ${other.message ?? ''}.`);

  const remembered = deps.load(cp.origin);
  if (remembered) {
    const rRoot = base64Decode(remembered.root);
    if (!rRoot) return fail('The checkpoint this browser remembered is damaged.');
    const [small, large] =
      remembered.size <= cp.size
        ? [
            { size: remembered.size, root: rRoot },
            { size: cp.size, root: cp.root },
          ]
        : [
            { size: cp.size, root: cp.root },
            { size: remembered.size, root: rRoot },
          ];
    let proof: unknown;
    try {
      proof = small.size === large.size ? [] : await deps.fetchConsistency(small.size, large.size);
    } catch {
      return fail(
        `The registry gave no proof that its log of ${cp.size} entries agrees with the one of ${remembered.size} this browser saw before.`,
      );
    }
    if (!checkConsistency(small.size, small.root, large.size, large.root, proof))
      return fail(
        `The registry’s log has changed its past: its checkpoint of ${cp.size} entries is not consistent with the checkpoint of ${remembered.size} entries this browser saw before.`,
      );
  }
  if (!remembered || cp.size > remembered.size)
    deps.save(cp.origin, {
      size: cp.size,
      root: base64Encode(cp.root),
      note: (member as { note: string }).note,
    });
  const first = JSON.parse(roll.entries[0]!.header) as EntryHeader;
  const head = JSON.parse(roll.entries[roll.entries.length - 1]!.header) as EntryHeader;
  return {
    state: 'in-log',
    since: first.time,
    size: cp.size,
    witnesses: cp.cosigned.length,
    seq: inclusion.seq,
    headSeq: head.seq,
    rememberedSize: remembered?.size ?? null,
  };
}

const STORAGE_PREFIX = 'beadroll:log-checkpoint:';

/** The browser's local storage as the page's memory of checkpoints (nothing when unavailable). */
export const browserMemory = {
  load(origin: string): RememberedCheckpoint | null {
    try {
      const raw = globalThis.localStorage?.getItem(STORAGE_PREFIX + origin);
      if (!raw) return null;
      const v = JSON.parse(raw) as RememberedCheckpoint;
      return Number.isSafeInteger(v.size) && typeof v.root === 'string' ? v : null;
    } catch {
      return null;
    }
  },
  save(origin: string, c: RememberedCheckpoint): void {
    try {
      globalThis.localStorage?.setItem(STORAGE_PREFIX + origin, JSON.stringify(c));
    } catch {
      // Private browsing or a full store: the page just cannot remember.
    }
  },
};
