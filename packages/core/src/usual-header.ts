import { endOfCanonicalRead, keptText, readCanonicalAt } from './canonical.js';
import { useUsualHeaderReader } from './entry.js';
import { ENTRY_KINDS, type EntryKind } from './types.js';

// The direct reading of usual headers, installed into `decodeHeader` when this module loads
// (see `useUsualHeaderReader`): about a fifth of the verifier's time on a long roll in Node.

/**
 * Reads a header written the usual way, straight from its text, with no JSON.parse:
 * `{"actor":"…","body":"…","facts":…,"kind":"…","lot":"…","prev":"…",["sealed":"…",]"seq":N,"time":"…","v":N}`,
 * the keys in that (canonical) order, each string running to the next quote, each integer
 * canonical, and `facts` a value `readCanonicalAt` finds canonical. A member of fixed length
 * (hex digits, lot code, time) is taken to its length, whatever it holds. Returns null for
 * anything else (no `facts`, as in version 1, `parents`, another key, another spelling). The
 * object has the members in text order, as JSON.parse gives them. Precondition of trusting it:
 * `headerProblem` in entry.ts finds nothing. Every string member is then checked to hold only
 * characters of its own kind (account id, lot code, kind, time, hex digits), none of them a
 * quote, backslash or control character, so each string read here is the whole JSON string,
 * the text is canonical, and its parse is this object. `lastActor` and `lastLot` are the values
 * checked last, handed back as they are when the text has them.
 */
export function readUsualHeader(
  t: string,
  lastActor: unknown,
  lastLot: unknown,
): Record<string, unknown> | null {
  if (t.charCodeAt(0) !== 0x7b) return null;
  pos = 1;
  // The actor and lot a roll repeats from entry to entry are taken as the strings already
  // checked, when the text has them: nothing is copied, and comparing them later is quick.
  const actor = stringMember(t, ACTOR, lastActor, 0);
  const body = stringMember(t, BODY, undefined, 64);
  if (actor === null || body === null || !hasCodesAt(t, FACTS, pos)) return null;
  const facts = readCanonicalAt(t, pos + FACTS.length);
  pos = endOfCanonicalRead();
  if (facts === undefined || t.charCodeAt(pos++) !== 0x2c) return null;
  const kind = stringMember(t, KIND, undefined, 0, true);
  const lot = stringMember(t, LOT, lastLot, 9);
  const prev = stringMember(t, PREV, undefined, 64);
  const sealed = hasCodesAt(t, SEALED, pos) ? stringMember(t, SEALED, undefined, 64) : undefined;
  const seq = integerMember(t, SEQ);
  if (kind === null || lot === null || prev === null || sealed === null || t.charCodeAt(pos++) !== 0x2c)
    return null;
  const time = stringMember(t, TIME, undefined, 24);
  const v = integerMember(t, V);
  if (time === null || pos !== t.length - 1 || t.charCodeAt(pos) !== 0x7d) return null;
  // One literal per shape, so each header gets its members in one step and in text order.
  return sealed === undefined
    ? { actor, body, facts, kind, lot, prev, seq, time, v }
    : { actor, body, facts, kind, lot, prev, sealed, seq, time, v };
}

/** `t.startsWith(part, at)`, where a plain loop is quicker for the short parts read here. */
function hasAt(t: string, part: string, at: number): boolean {
  for (let i = 0; i < part.length; i++) if (t.charCodeAt(at + i) !== part.charCodeAt(i)) return false;
  return true;
}

/** {@link hasAt} for a part given as its code units. */
function hasCodesAt(t: string, codes: Uint16Array, at: number): boolean {
  for (let i = 0; i < codes.length; i++) if (t.charCodeAt(at + i) !== codes[i]) return false;
  return true;
}

/** What comes before each member's value in a usual header, as code units. */
const [ACTOR, BODY, FACTS, KIND, LOT, PREV, SEALED, SEQ, TIME, V] = [
  '"actor":"',
  '"body":"',
  '"facts":',
  '"kind":"',
  '"lot":"',
  '"prev":"',
  '"sealed":"',
  '"seq":',
  '"time":"',
  '"v":',
].map((member) => Uint16Array.from(member, (ch) => ch.charCodeAt(0))) as [Uint16Array, ...Uint16Array[]];

/** Where {@link readUsualHeader} is in its text. */
let pos = 0;

/**
 * The text between the quotes of `member` (`"key":"`) at {@link pos} and the next quote (or,
 * for a member of a fixed `length`, the quote that must end it there), which a comma follows;
 * {@link pos} then moves past the comma. Null when the text is otherwise, or when an earlier
 * member was not read (pos is -1). When that text is `known`, `known` itself is returned; with
 * `keep` (a kind), the kind's own name when it is one, which later comparisons take quickest.
 */
function stringMember(
  t: string,
  member: Uint16Array,
  known: unknown,
  length: number,
  keep = false,
): string | null {
  if (pos < 0 || !hasCodesAt(t, member, pos)) return fail();
  const start = pos + member.length;
  if (typeof known === 'string') {
    const end = start + known.length;
    if (t.charCodeAt(end) === 0x22 && t.charCodeAt(end + 1) === 0x2c && hasAt(t, known, start)) {
      pos = end + 2;
      return known;
    }
  }
  const end = length > 0 ? start + length : t.indexOf('"', start);
  if (end < 0 || t.charCodeAt(end) !== 0x22 || t.charCodeAt(end + 1) !== 0x2c) return fail();
  pos = end + 2;
  if (!keep) return t.slice(start, end);
  const kept = keptText(t, start, end);
  return KIND_NAMES.get(kept) ?? kept;
}

/** Marks the reading as failed: every later member read gives null (or -1) too. */
function fail(): null {
  pos = -1;
  return null;
}

/**
 * The non-negative integer written canonically after `member` (`"key":`) at {@link pos}, which
 * then moves past it; -1 (and so {@link pos}) when the text is otherwise.
 */
function integerMember(t: string, member: Uint16Array): number {
  if (pos < 0 || !hasCodesAt(t, member, pos)) return (pos = -1);
  let i = pos + member.length;
  let c = t.charCodeAt(i);
  if (c === 0x30) {
    pos = i + 1;
    return 0;
  }
  const from = i;
  let value = 0;
  for (; c >= 0x30 && c <= 0x39; c = t.charCodeAt(++i)) value = value * 10 + (c - 0x30);
  if (i === from || i - from > 15) return (pos = -1);
  pos = i;
  return value;
}

/** Each kind's name, found by an equal string. */
const KIND_NAMES: ReadonlyMap<string, EntryKind> = new Map(ENTRY_KINDS.map((k) => [k, k]));

useUsualHeaderReader(readUsualHeader);
