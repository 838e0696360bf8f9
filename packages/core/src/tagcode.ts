import {
  CROCKFORD_ALPHABET,
  CROCKFORD_CHECK_EXTRA,
  crockfordCheckSymbol,
  TAG_REF_SYMBOLS,
  tagReference,
} from './lotcode.js';

/**
 * The code printed on a tag for the tag reference `ref` (10 canonical Crockford symbols): the
 * reference and its Crockford check symbol (the 50-bit number modulo 37, ledger format §4),
 * grouped `XXXXX-XXXXX-X`. The check symbol may be one of `* ~ $ = U`.
 */
export function printedTagCode(ref: string): string {
  const check = crockfordCheckSymbol(ref);
  return `${ref.slice(0, 5)}-${ref.slice(5, TAG_REF_SYMBOLS)}-${check}`;
}

/** What a person typed from a tag, read. */
export type TypedTagCode =
  | { ok: true; ref: string; seq?: number; checked: boolean }
  | { ok: false; problem: 'empty' | 'length' | 'symbol' | 'check'; seq?: number; ref?: string };

const LOOK_ALIKES: Record<string, string> = { I: '1', L: '1', O: '0' };

function symbolsOf(text: string): string {
  return text
    .toUpperCase()
    .replace(/[\s\-‐‑‒–—·•.]/g, '')
    .replace(/[ILO]/g, (c) => LOOK_ALIKES[c]!);
}

/**
 * Reads a tag code as a person types it: any case; spaces, dashes and dots ignored; I and L
 * read as 1, O as 0; optionally preceded by the entry number as printed (`entry 12 ·`). Ten
 * symbols are an older tag's code without a check symbol; eleven carry the check symbol, which
 * must match (`problem: 'check'`, with the ten symbols read). Never throws.
 */
export function readTagCode(text: string): TypedTagCode {
  if (typeof text !== 'string') return { ok: false, problem: 'empty' };
  let s = symbolsOf(text);
  let seq: number | undefined;
  const m = /^\s*(?:entry\s*)?(\d{1,9})\s*[·•.:,\s]\s*(.+)$/i.exec(text);
  if (m && (/^\s*entry/i.test(text) || (s.length !== TAG_REF_SYMBOLS && s.length !== TAG_REF_SYMBOLS + 1))) {
    seq = Number(m[1]);
    s = symbolsOf(m[2]!);
  }
  const at = seq === undefined ? {} : { seq };
  if (s.length === 0) return { ok: false, problem: 'empty', ...at };
  if (s.length !== TAG_REF_SYMBOLS && s.length !== TAG_REF_SYMBOLS + 1)
    return { ok: false, problem: 'length', ...at };
  const data = s.slice(0, TAG_REF_SYMBOLS);
  for (const ch of data) if (!CROCKFORD_ALPHABET.includes(ch)) return { ok: false, problem: 'symbol', ...at };
  if (s.length === TAG_REF_SYMBOLS) return { ok: true, ref: data, checked: false, ...at };
  const check = s[TAG_REF_SYMBOLS]!;
  if (!(CROCKFORD_ALPHABET + CROCKFORD_CHECK_EXTRA).includes(check))
    return { ok: false, problem: 'symbol', ...at };
  if (crockfordCheckSymbol(data) !== check) return { ok: false, problem: 'check', ref: data, ...at };
  return { ok: true, ref: data, checked: true, ...at };
}

/** Outcome of checking a typed or scanned tag code against a verified roll. */
export type TagCodeCheck =
  | { state: 'matches'; seq: number; since: number }
  /** The code fails its check symbol, or is one symbol away from an entry's code. */
  | { state: 'typing-error' }
  /** A well-formed code that names no entry of the roll. */
  | { state: 'absent' }
  /** Not a tag code at all (wrong length or symbols). */
  | { state: 'unreadable' };

function symbolsApart(a: string, b: string): number {
  let n = 0;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) n++;
  return n;
}

/**
 * Checks a tag code (as {@link readTagCode} reads it) against the entries of a verified roll, in
 * seq order. `matches` names the entry whose tag reference it is (at the typed entry number when
 * one was given) and how many entries came after it. A code that fails its check symbol, or is
 * one symbol away from an entry's reference, is a `typing-error`; only a well-formed code that
 * names no entry and is not one symbol from any is `absent`. Never throws.
 */
export function checkTagCode(
  entries: ReadonlyArray<{ hash: string; header: { seq: number } }>,
  code: TypedTagCode,
): TagCodeCheck {
  if (!code.ok) return code.problem === 'check' ? { state: 'typing-error' } : { state: 'unreadable' };
  const refs = entries.map((e) => ({ seq: e.header.seq, ref: tagReference(e.hash) }));
  const hit = refs.filter((r) => r.ref === code.ref && (code.seq === undefined || r.seq === code.seq)).at(-1);
  if (hit) return { state: 'matches', seq: hit.seq, since: entries.length - 1 - hit.seq };
  if (refs.some((r) => r.ref === code.ref || symbolsApart(r.ref, code.ref) === 1))
    return { state: 'typing-error' };
  return { state: 'absent' };
}
