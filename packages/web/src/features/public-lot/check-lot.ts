// Everything the page shows is derived here from core's verifier and reducer over the raw
// bundle the server sent; nothing is taken from a server summary.
import {
  attributionOnRecord,
  checkTagCode,
  decodeHeader,
  inheritedRecord,
  isHeaderProblem,
  parseBundle,
  readTagCode,
  verifyBundle,
  verifyRoll,
  type AttributionOnRecord,
  type Bundle,
  type BundleRoll,
  type InheritedEntry,
  type UncheckedRule,
  type ReasonCode,
  type RollState,
  type TagCodeCheck,
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
      /** Opinions, observations and exhibits recorded on the ancestors, each verified. */
      inherited: InheritedEntry[];
      /** The attribution on record and the opinions that agree or dissent with it. */
      record: AttributionOnRecord;
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

// The page's first script checks the data before the rest of the page has loaded; the page then
// asks again for the same data object and is given that result, not a second run.
const checked = new WeakMap<object, { code: string; check: LotCheck }>();

/**
 * Verifies the lot's roll and every cross-lot link of the bundle. Precondition: `code` is the
 * canonical lot code from the page's address. Never throws. The same `raw` object checked again
 * for the same code gives the same result without a second run.
 */
export function checkLot(code: string, raw: unknown): LotCheck {
  const known = raw !== null && typeof raw === 'object' ? checked.get(raw) : undefined;
  if (known && known.code === code) return known.check;
  const check = checkLotOnce(code, raw);
  if (raw !== null && typeof raw === 'object') checked.set(raw, { code, check });
  return check;
}

function checkLotOnce(code: string, raw: unknown): LotCheck {
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
  const inherited = inheritedRecord(bundle, code);
  return {
    ok: true,
    code,
    entries: own.verified,
    state: own.state,
    ancestors: ancestorsOf(code, own.state, bundle, all.rolls),
    inherited,
    record: attributionOnRecord(own.verified, own.state, inherited),
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

/** What the printed tag promised, checked against the verified entries (core's reading rules). */
export type TagCheck = TagCodeCheck;

/**
 * Checks a tag code — from the page's address or typed from the tag, with or without its check
 * symbol and entry number — against the verified entries.
 */
export function checkTag(entries: VerifiedEntry[], text: string): TagCheck {
  return checkTagCode(entries, readTagCode(text));
}
