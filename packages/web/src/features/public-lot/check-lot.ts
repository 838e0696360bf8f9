// Everything the page shows is derived here from core's verifier and reducer over the raw
// bundle the server sent; nothing is taken from a server summary.
import {
  decodeHeader,
  findEntriesByTagReference,
  isHeaderProblem,
  parseBundle,
  parseTagReference,
  verifyBundle,
  verifyRoll,
  type Bundle,
  type BundleRoll,
  type UncheckedRule,
  type ReasonCode,
  type RollState,
  type VerifiedEntry,
} from '@beadroll/core';

/** Where and why the history breaks. `lot` is the roll that breaks (this lot or an ancestor). */
export interface HistoryBreak {
  lot: string | null;
  seq: number;
  reason: ReasonCode | 'not-a-bundle' | 'no-roll';
  message: string;
  /** Kind and time of the failing entry of this lot's roll, when its header can still be read. */
  at?: { kind: string; time: string };
}

/** A lot this one was made from (or one further back), as far as the bundle shows it. */
export interface AncestorView {
  lot: string;
  /** Generation: 1 = parent, 2 = grandparent, … */
  depth: number;
  /** true: the full roll is in the bundle (a listed lot with a public page). */
  listed: boolean;
  title: string | null;
  /** Lots this ancestor was made into that are on the path to this lot. */
  via: { kind: 'split' | 'combined'; seq: number; child: string }[];
}

export type LotCheck =
  | {
      ok: true;
      code: string;
      entries: VerifiedEntry[];
      state: RollState;
      ancestors: AncestorView[];
      /** Entries checked across the whole bundle (this roll and its ancestors). */
      bundleEntries: number;
      /**
       * Rules an old (format version 1) entry could not be checked against because a removed
       * body held the fact they need; empty when the history is fully checked.
       */
      unchecked: UncheckedRule[];
    }
  | {
      ok: false;
      code: string;
      /** The entries of this lot's roll that checked out before the break (never shown as verified). */
      entries: VerifiedEntry[];
      total: number;
      failure: HistoryBreak;
    };

/**
 * Verifies the lot's roll and every cross-lot link of the bundle. Precondition: `code` is the
 * canonical lot code from the page's address. Never throws.
 */
export function checkLot(code: string, raw: unknown): LotCheck {
  let bundle: Bundle;
  try {
    bundle = parseBundle(raw);
  } catch (e) {
    return broken(code, [], 0, { lot: null, seq: 0, reason: 'not-a-bundle', message: (e as Error).message });
  }
  const roll = bundle.rolls[0];
  if (!roll || roll.lot !== code || roll.scope !== 'full') {
    return broken(code, [], 0, {
      lot: code,
      seq: 0,
      reason: 'no-roll',
      message: 'the data served does not start with this lot’s full roll',
    });
  }
  const own = verifyRoll(roll.entries, { lot: code });
  if (!own.ok) {
    return broken(
      code,
      own.verified,
      roll.entries.length,
      {
        lot: code,
        seq: own.seq,
        reason: own.reason,
        message: own.message,
      },
      roll,
    );
  }
  const all = verifyBundle(bundle);
  if (!all.ok) {
    const f = all.failures.find((x) => x.lot === code) ?? all.failures[0]!;
    return broken(
      code,
      own.verified,
      roll.entries.length,
      {
        lot: f.lot,
        seq: f.seq,
        reason: f.reason,
        message: f.message,
      },
      roll,
    );
  }
  return {
    ok: true,
    code,
    entries: own.verified,
    state: own.state,
    ancestors: ancestorsOf(code, own.state, bundle, all.rolls),
    bundleEntries: all.entries,
    unchecked: all.rolls.flatMap((r) => r.unchecked),
  };
}

function broken(
  code: string,
  entries: VerifiedEntry[],
  total: number,
  failure: HistoryBreak,
  roll?: BundleRoll,
): LotCheck {
  const raw = roll && failure.lot === code ? roll.entries[failure.seq] : undefined;
  const h = raw ? decodeHeader(raw.header) : null;
  if (h && !isHeaderProblem(h)) failure = { ...failure, at: { kind: h.kind, time: h.time } };
  return { ok: false, code, entries, total, failure };
}

function ancestorsOf(
  code: string,
  state: RollState,
  bundle: Bundle,
  results: ReturnType<typeof verifyBundle>['rolls'],
): AncestorView[] {
  const byLot = new Map<string, BundleRoll>(bundle.rolls.map((r) => [r.lot, r]));
  const stateOf = new Map(results.filter((r) => r.state).map((r) => [r.lot, r.state!]));
  const out = new Map<string, AncestorView>();
  let frontier: { lot: string; parents: RollState['parents'] }[] = [{ lot: code, parents: state.parents }];
  for (let depth = 1; frontier.length > 0 && depth <= 20; depth++) {
    const next: typeof frontier = [];
    for (const { lot: child, parents } of frontier) {
      for (const p of parents) {
        const r = byLot.get(p.lot);
        const kind = linkKind(r, p.seq);
        let a = out.get(p.lot);
        if (!a) {
          const s = stateOf.get(p.lot) ?? null;
          a = {
            lot: p.lot,
            depth,
            listed: r?.scope === 'full',
            title: s?.description?.title ?? null,
            via: [],
          };
          out.set(p.lot, a);
          if (s) next.push({ lot: p.lot, parents: s.parents });
        }
        a.via.push({ kind, seq: p.seq, child });
      }
    }
    frontier = next;
  }
  return [...out.values()];
}

function linkKind(r: BundleRoll | undefined, seq: number): 'split' | 'combined' {
  for (const e of r?.entries ?? []) {
    const h = decodeHeader(e.header);
    if (!isHeaderProblem(h) && h.seq === seq) return h.kind === 'combined' ? 'combined' : 'split';
  }
  return 'split';
}

/** What the printed tag promised, checked against the verified entries. */
export type TagCheck =
  { state: 'matches'; seq: number; since: number } | { state: 'absent' } | { state: 'unreadable' };

/**
 * Looks for the entry whose tag reference is `ref` among the verified entries; when the tag
 * also gives its seq, that entry must be the one at that seq.
 */
export function checkTag(entries: VerifiedEntry[], ref: string, seq?: number): TagCheck {
  let want: string;
  try {
    want = parseTagReference(ref);
  } catch {
    return { state: 'unreadable' };
  }
  const hits = findEntriesByTagReference(entries, want).filter(
    (e) => seq === undefined || e.header.seq === seq,
  );
  if (hits.length === 0) return { state: 'absent' };
  const at = hits[hits.length - 1]!.header.seq;
  return { state: 'matches', seq: at, since: entries.length - 1 - at };
}

/**
 * Reads what a buyer types from a tag: the reference alone (`ABCDE-FGHJK`) or with its entry
 * number as printed (`entry 12 · ABCDE-FGHJK`).
 */
export function readTypedTag(text: string): { ref: string; seq?: number } | null {
  const t = text.trim();
  const m = /^(?:entry\s*)?(\d+)\s*[·.:,\s]\s*([0-9a-z-]{10,11})$/i.exec(t);
  const refText = m ? m[2]! : t;
  try {
    const ref = parseTagReference(refText);
    return m ? { ref, seq: Number(m[1]) } : { ref };
  } catch {
    return null;
  }
}
