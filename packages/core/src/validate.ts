import { ValidationError, type FieldIssue } from './errors.js';
import { isCanonicalLotCode } from './lotcode.js';
import {
  BASE_GLASS,
  CONFIDENCES,
  DECORATIONS,
  ENTRY_KINDS,
  FORMAT_VERSION,
  EXHIBIT_KINDS,
  LOT_FORMS,
  ORIGINS,
  QUALIFIERS,
  REDACTION_REASONS,
  SEALED_FIELD_NAMES,
  TECHNIQUES,
  type EntryKind,
  type FormatVersion,
  type SealedFieldName,
} from './types.js';

/** Limits on text and list sizes inside bodies (characters, UTF-16 code units). */
export const LIMITS = {
  title: 200,
  shortText: 200,
  longText: 5000,
  caption: 1000,
  listItems: 50,
  children: 500,
  mediaType: 100,
  exhibitBytes: Number.MAX_SAFE_INTEGER,
} as const;

const ACTOR = /^[A-Za-z0-9][A-Za-z0-9._:-]{0,63}$/;
/** The shape of an entry time: `d` a digit, any other character itself. */
const TIME_SHAPE = 'dddd-dd-ddTdd:dd:dd.dddZ';
/** {@link TIME_SHAPE} as code units, 0 where a digit goes. */
const TIME_CODES = Uint16Array.from(TIME_SHAPE, (ch) => (ch === 'd' ? 0 : ch.charCodeAt(0)));
const DATE = /^\d{4}-\d{2}-\d{2}$/;
const CURRENCY = /^[A-Z]{3}$/;
const MEDIA_TYPE = /^[a-z0-9][a-z0-9!#$&^_.+-]*\/[a-z0-9][a-z0-9!#$&^_.+-]*$/;

/** True for 64 lower-case hex digits (a SHA-256 value). */
export function isHex64(v: unknown): v is string {
  return isLowerHex(v, 64);
}

function isHex32(v: unknown): boolean {
  return isLowerHex(v, 32);
}

/** 1 for the code units of 0–9 and a–f. */
const LOWER_HEX = new Uint8Array(128);
for (const c of '0123456789abcdef') LOWER_HEX[c.charCodeAt(0)] = 1;

/** True for a string of exactly `length` lower-case hex digits (a table beats a pattern here). */
function isLowerHex(v: unknown, length: number): v is string {
  if (typeof v !== 'string' || v.length !== length) return false;
  for (let i = 0; i < length; i++) if (LOWER_HEX[v.charCodeAt(i)] !== 1) return false;
  return true;
}

/** True for an opaque account id: 1–64 of A–Z a–z 0–9 . _ : - starting with a letter or digit. */
export function isActorId(v: unknown): v is string {
  return typeof v === 'string' && ACTOR.test(v);
}

/** True for a UTC time written exactly `YYYY-MM-DDTHH:MM:SS.sssZ` that names a real instant. */
export function isEntryTime(v: unknown): v is string {
  if (typeof v !== 'string' || v.length !== 24) return false;
  for (let i = 0; i < 24; i++) {
    const want = TIME_CODES[i]!;
    const c = v.charCodeAt(i);
    if (want === 0 ? c - 0x30 > 9 || c < 0x30 : c !== want) return false;
  }
  // Digits are known from here on: hours below 24, minutes and seconds below 60.
  const hour = (v.charCodeAt(11) - 48) * 10 + v.charCodeAt(12) - 48;
  if (hour > 23 || v.charCodeAt(14) > 53 || v.charCodeAt(17) > 53) return false;
  return isDayOfMonth(v, 0);
}

/** True for a real calendar date written `YYYY-MM-DD`. */
export function isCalendarDate(v: unknown): v is string {
  return typeof v === 'string' && DATE.test(v) && isDayOfMonth(v, 0);
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

/** True when the `YYYY-MM-DD` digits at `at` in `v` (already known to be digits) name a real day. */
function isDayOfMonth(v: string, at: number): boolean {
  const digit = (i: number) => v.charCodeAt(at + i) - 48;
  const y = digit(0) * 1000 + digit(1) * 100 + digit(2) * 10 + digit(3);
  const m = digit(5) * 10 + digit(6);
  const d = digit(8) * 10 + digit(9);
  if (m < 1 || m > 12 || d < 1) return false;
  const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
  return d <= (m === 2 && leap ? 29 : DAYS_IN_MONTH[m - 1]!);
}

type Obj = Record<string, unknown>;

class Checker {
  issues: FieldIssue[] = [];
  /** Format version whose body shapes apply. */
  constructor(readonly version: FormatVersion = FORMAT_VERSION) {}
  fail(path: string, message: string): void {
    this.issues.push({ path, message });
  }
  obj(v: unknown, path: string, required: string[], optional: string[] = []): Obj | null {
    if (v === null || typeof v !== 'object' || Array.isArray(v)) {
      this.fail(path, 'must be an object');
      return null;
    }
    const o = v as Obj;
    for (const k of required) if (!(k in o)) this.fail(join(path, k), 'is required');
    for (const k in o)
      if (Object.prototype.hasOwnProperty.call(o, k) && !required.includes(k) && !optional.includes(k))
        this.fail(join(path, k), 'is not a known field');
    return o;
  }
  str(o: Obj, k: string, path: string, max: number, opt = false, min = 1): void {
    if (!(k in o)) {
      if (!opt) this.fail(join(path, k), 'is required');
      return;
    }
    const v = o[k];
    if (typeof v !== 'string') return this.fail(join(path, k), 'must be a string');
    if (v.length < min) return this.fail(join(path, k), 'must not be empty');
    if (v.length > max) this.fail(join(path, k), `must be at most ${max} characters`);
  }
  pattern(o: Obj, k: string, path: string, test: (v: unknown) => boolean, what: string, opt = false): void {
    if (!(k in o)) {
      if (!opt) this.fail(join(path, k), 'is required');
      return;
    }
    if (!test(o[k])) this.fail(join(path, k), `must be ${what}`);
  }
  oneOf(o: Obj, k: string, path: string, values: readonly string[], opt = false): void {
    if (!(k in o)) {
      if (!opt) this.fail(join(path, k), 'is required');
      return;
    }
    const v = o[k];
    if (typeof v !== 'string' || !values.includes(v))
      this.fail(join(path, k), `must be one of ${values.join(', ')}`);
  }
  int(o: Obj, k: string, path: string, min: number, max: number, opt = false): void {
    if (!(k in o)) {
      if (!opt) this.fail(join(path, k), 'is required');
      return;
    }
    const v = o[k];
    if (!Number.isSafeInteger(v) || (v as number) < min || (v as number) > max)
      this.fail(join(path, k), `must be an integer from ${min} to ${max}`);
  }
  bool(o: Obj, k: string, path: string): void {
    this.pattern(o, k, path, (v) => typeof v === 'boolean', 'true or false');
  }
  mm(o: Obj, k: string, path: string, opt = false): void {
    this.pattern(
      o,
      k,
      path,
      (v) =>
        typeof v === 'number' &&
        Number.isFinite(v) &&
        v >= 0 &&
        v <= 100000 &&
        Number.isInteger(Math.round(v * 10)) &&
        Math.abs(Math.round(v * 10) / 10 - v) < 1e-9,
      'a length in mm from 0 to 100000 with at most one decimal',
      opt,
    );
  }
  list(
    o: Obj,
    k: string,
    path: string,
    each: (v: unknown, p: string) => void,
    max: number,
    opt = false,
  ): void {
    if (!(k in o)) {
      if (!opt) this.fail(join(path, k), 'is required');
      return;
    }
    const v = o[k];
    if (!Array.isArray(v)) return this.fail(join(path, k), 'must be a list');
    if (v.length > max) return this.fail(join(path, k), `must have at most ${max} items`);
    if (v.length === 0) return;
    const at = join(path, k);
    for (let i = 0; i < v.length; i++) each(v[i], `${at}[${i}]`);
  }
  uniqueList(o: Obj, k: string, path: string, values: readonly string[]): void {
    this.list(
      o,
      k,
      path,
      (v, p) => {
        if (typeof v !== 'string' || !values.includes(v)) this.fail(p, `must be one of ${values.join(', ')}`);
      },
      values.length,
    );
    const arr = o[k];
    if (Array.isArray(arr) && new Set(arr).size !== arr.length)
      this.fail(join(path, k), 'must not repeat a value');
  }
  count(v: unknown, path: string, min = 0): void {
    const c = this.obj(v, path, ['value', 'estimated']);
    if (!c) return;
    this.int(c, 'value', path, min, 10_000_000);
    this.bool(c, 'estimated', path);
  }
}

function join(path: string, k: string): string {
  return path ? `${path}.${k}` : k;
}

function checkDescription(c: Checker, v: unknown, path: string): void {
  const d = c.obj(
    v,
    path,
    ['title', 'form', 'count', 'colours', 'baseGlass', 'decoration', 'listed'],
    ['summary', 'diameterMm', 'strandLengthMm', 'decorationNote', 'condition'],
  );
  if (!d) return;
  c.str(d, 'title', path, LIMITS.title);
  c.str(d, 'summary', path, LIMITS.longText, true);
  c.oneOf(d, 'form', path, LOT_FORMS);
  if ('count' in d) c.count(d.count, join(path, 'count'));
  if ('diameterMm' in d) {
    const p = join(path, 'diameterMm');
    const r = c.obj(d.diameterMm, p, ['min', 'max']);
    if (r) {
      c.mm(r, 'min', p);
      c.mm(r, 'max', p);
      if (typeof r.min === 'number' && typeof r.max === 'number' && r.min > r.max)
        c.fail(p, 'min must not exceed max');
    }
  }
  c.mm(d, 'strandLengthMm', path, true);
  c.list(
    d,
    'colours',
    path,
    (x, p) => {
      if (typeof x !== 'string' || x.length < 1 || x.length > LIMITS.shortText)
        c.fail(p, 'must be a colour name');
    },
    LIMITS.listItems,
  );
  c.uniqueList(d, 'baseGlass', path, BASE_GLASS);
  c.uniqueList(d, 'decoration', path, DECORATIONS);
  c.str(d, 'decorationNote', path, LIMITS.longText, true);
  c.str(d, 'condition', path, LIMITS.longText, true);
  c.bool(d, 'listed', path);
}

function checkFile(c: Checker, v: unknown, path: string, derivative: boolean): void {
  const f = c.obj(
    v,
    path,
    derivative ? ['role', 'sha256', 'size', 'mediaType'] : ['sha256', 'size', 'mediaType'],
    ['width', 'height'],
  );
  if (!f) return;
  if (derivative) c.str(f, 'role', path, 40);
  c.pattern(f, 'sha256', path, isHex64, '64 lower-case hex digits');
  c.int(f, 'size', path, 0, LIMITS.exhibitBytes);
  c.pattern(
    f,
    'mediaType',
    path,
    (x) => typeof x === 'string' && x.length <= LIMITS.mediaType && MEDIA_TYPE.test(x),
    'a lower-case media type',
  );
  c.int(f, 'width', path, 1, 1_000_000, true);
  c.int(f, 'height', path, 1, 1_000_000, true);
}

function checkExhibit(c: Checker, v: unknown, path: string): void {
  const e = c.obj(v, path, ['kind', 'original', 'derivatives'], ['caption']);
  if (!e) return;
  c.oneOf(e, 'kind', path, EXHIBIT_KINDS);
  if ('original' in e) checkFile(c, e.original, join(path, 'original'), false);
  c.list(e, 'derivatives', path, (x, p) => checkFile(c, x, p, true), 20);
  c.str(e, 'caption', path, LIMITS.caption, true);
}

const SEQ_MAX = Number.MAX_SAFE_INTEGER;

const bodyCheckers: Record<EntryKind, (c: Checker, b: unknown) => void> = {
  registered: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'description']);
    if (o && 'description' in o) checkDescription(c, o.description, 'description');
  },
  described: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'description'], c.version >= 2 ? ['corrects'] : []);
    if (!o) return;
    if ('description' in o) checkDescription(c, o.description, 'description');
    if ('corrects' in o) checkCorrection(c, o.corrects);
  },
  observed: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'observations'], c.version >= 2 ? ['corrects'] : []);
    if (o && 'corrects' in o) checkCorrection(c, o.corrects);
    if (!o || !('observations' in o)) return;
    const p = 'observations';
    const ob = c.obj(
      o.observations,
      p,
      [],
      [
        'hole',
        'holeShape',
        'windingMarks',
        'beadShape',
        ...(c.version >= 2 ? ['mouldSeam'] : []),
        'surface',
        'foil',
        'uvA',
        'note',
      ],
    );
    if (!ob) return;
    c.oneOf(ob, 'hole', p, ['clean', 'powder', 'green-traces', 'not-seen'], true);
    c.oneOf(ob, 'holeShape', p, ['irregular', 'regular'], true);
    c.oneOf(ob, 'windingMarks', p, ['seen', 'not-seen'], true);
    c.oneOf(ob, 'beadShape', p, ['irregular', 'uniform'], true);
    c.oneOf(ob, 'mouldSeam', p, ['seen', 'not-seen'], true);
    c.oneOf(ob, 'surface', p, ['glossy', 'satin', 'matte', 'worn'], true);
    c.oneOf(ob, 'foil', p, ['none', 'intact', 'worn'], true);
    c.oneOf(ob, 'uvA', p, ['not-tested', 'none', 'green-glow', 'other'], true);
    c.str(ob, 'note', p, LIMITS.longText, true);
  },
  'exhibit-added': (c, b) => {
    const request = c.version >= 3 ? ['request'] : [];
    if (b !== null && typeof b === 'object' && 'sealedOnly' in b) {
      const o = c.obj(b, '', ['nonce', 'sealedOnly'], request);
      if (o && o.sealedOnly !== true) c.fail('sealedOnly', 'must be true');
      if (o) c.int(o, 'request', '', 0, SEQ_MAX, true);
      return;
    }
    const o = c.obj(b, '', ['nonce', 'exhibit'], request);
    if (o && 'exhibit' in o) checkExhibit(c, o.exhibit, 'exhibit');
    if (o) c.int(o, 'request', '', 0, SEQ_MAX, true);
  },
  opinion: (c, b) => {
    const o = c.obj(
      b,
      '',
      ['nonce', 'origin', 'period', 'technique', 'qualifier', 'confidence', 'rationale', 'exhibits'],
      ['originNote', 'decoration', 'adopts', ...(c.version >= 3 ? ['request'] : [])],
    );
    if (!o) return;
    c.int(o, 'request', '', 0, SEQ_MAX, true);
    if ('adopts' in o) {
      const a = c.obj(o.adopts, 'adopts', ['lot', 'seq', 'hash']);
      if (a) {
        c.pattern(a, 'lot', 'adopts', isCanonicalLotCode, 'a canonical lot code');
        c.int(a, 'seq', 'adopts', 0, SEQ_MAX);
        c.pattern(a, 'hash', 'adopts', isHex64, 'an entry hash');
      }
    }
    c.oneOf(o, 'origin', '', ORIGINS);
    c.str(o, 'originNote', '', LIMITS.shortText, true);
    if ('period' in o) {
      const p = c.obj(o.period, 'period', ['from', 'to', 'approximate']);
      if (p) {
        c.int(p, 'from', 'period', -5000, 9999);
        c.int(p, 'to', 'period', -5000, 9999);
        c.bool(p, 'approximate', 'period');
        if (typeof p.from === 'number' && typeof p.to === 'number' && p.from > p.to)
          c.fail('period', 'from must not be after to');
      }
    }
    c.oneOf(o, 'technique', '', TECHNIQUES);
    c.str(o, 'decoration', '', LIMITS.longText, true);
    c.oneOf(o, 'qualifier', '', QUALIFIERS);
    c.oneOf(o, 'confidence', '', CONFIDENCES);
    c.str(o, 'rationale', '', LIMITS.longText, false, 0);
    c.list(
      o,
      'exhibits',
      '',
      (x, p) => (isHex64(x) ? undefined : c.fail(p, 'must be an exhibit sha256')),
      LIMITS.listItems,
    );
  },
  'opinion-withdrawn': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'opinionSeq'], ['note']);
    if (!o) return;
    c.int(o, 'opinionSeq', '', 0, SEQ_MAX);
    c.str(o, 'note', '', LIMITS.longText, true);
  },
  'transfer-offered': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'recipient'], ['note']);
    if (!o) return;
    c.pattern(o, 'recipient', '', isActorId, 'an account id');
    c.str(o, 'note', '', LIMITS.longText, true);
  },
  'transfer-accepted': (c, b) => answer(c, b),
  'transfer-declined': (c, b) => answer(c, b),
  'transfer-withdrawn': (c, b) => answer(c, b),
  'transfer-lapsed': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'offerSeq']);
    if (o) c.int(o, 'offerSeq', '', 0, SEQ_MAX);
  },
  split: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'children']);
    if (!o) return;
    c.list(
      o,
      'children',
      '',
      (x, p) => {
        const ch = c.obj(x, p, ['lot', 'count']);
        if (!ch) return;
        c.pattern(ch, 'lot', p, isCanonicalLotCode, 'a canonical lot code');
        if ('count' in ch) c.count(ch.count, join(p, 'count'), 1);
      },
      LIMITS.children,
    );
    if (Array.isArray(o.children)) {
      if (o.children.length === 0) c.fail('children', 'must name at least one child');
      const codes = o.children.map((x) => (x as { lot?: unknown })?.lot);
      if (new Set(codes).size !== codes.length) c.fail('children', 'must not name a lot twice');
    }
  },
  combined: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'child', 'count']);
    if (!o) return;
    c.pattern(o, 'child', '', isCanonicalLotCode, 'a canonical lot code');
    if ('count' in o) c.count(o.count, 'count', 1);
  },
  sold: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'date']);
    if (o) c.pattern(o, 'date', '', isCalendarDate, 'a date YYYY-MM-DD');
  },
  'sale-voided': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'saleSeq'], ['reason']);
    if (!o) return;
    c.int(o, 'saleSeq', '', 0, SEQ_MAX);
    c.str(o, 'reason', '', LIMITS.longText, true);
  },
  retired: (c, b) => {
    const o = c.obj(b, '', ['nonce'], ['note']);
    if (o) c.str(o, 'note', '', LIMITS.longText, true);
  },
  redacted: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'target', 'reason']);
    if (!o) return;
    c.int(o, 'target', '', 0, SEQ_MAX);
    c.oneOf(o, 'reason', '', REDACTION_REASONS);
  },
  note: (c, b) => {
    const o = c.obj(b, '', ['nonce', 'text'], ['ref']);
    if (!o) return;
    c.str(o, 'text', '', LIMITS.longText);
    c.int(o, 'ref', '', 0, SEQ_MAX, true);
  },
  'opinion-requested': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'assessor']);
    if (o) c.pattern(o, 'assessor', '', (v) => v === null || isActorId(v), 'an account id or null');
  },
  'opinion-request-closed': (c, b) => {
    const o = c.obj(b, '', ['nonce', 'request']);
    if (o) c.int(o, 'request', '', 0, SEQ_MAX);
  },
};

function checkCorrection(c: Checker, v: unknown): void {
  const o = c.obj(v, 'corrects', ['seq', 'reason']);
  if (!o) return;
  c.int(o, 'seq', 'corrects', 0, SEQ_MAX);
  c.str(o, 'reason', 'corrects', LIMITS.longText);
}

function answer(c: Checker, b: unknown): void {
  const o = c.obj(b, '', ['nonce', 'offerSeq'], ['note']);
  if (!o) return;
  c.int(o, 'offerSeq', '', 0, SEQ_MAX);
  c.str(o, 'note', '', LIMITS.longText, true);
}

/**
 * Checks a decoded body (nonce included) against the shape its kind requires in format
 * `version` (default {@link FORMAT_VERSION}). Returns every problem found (empty when valid);
 * never throws. Precondition: `kind` is an {@link EntryKind}.
 */
export function bodyIssues(
  kind: EntryKind,
  body: unknown,
  version: FormatVersion = FORMAT_VERSION,
): FieldIssue[] {
  const c = new Checker(version);
  if (!ENTRY_KINDS.includes(kind)) return [{ path: 'kind', message: 'is not a known kind' }];
  bodyCheckers[kind](c, body);
  if (body !== null && typeof body === 'object' && 'nonce' in body && !isHex32((body as Obj).nonce)) {
    c.fail('nonce', 'must be 32 lower-case hex digits');
  }
  return c.issues;
}

/** Like {@link bodyIssues}, but throws {@link ValidationError} (code `bad-body`) when there are any. */
export function assertBody(kind: EntryKind, body: unknown): void {
  const issues = bodyIssues(kind, body);
  if (issues.length > 0) throw new ValidationError(issues, 'bad-body');
}

/**
 * Checks one sealed value against its field's type. Returns the problems (empty when valid).
 * Unknown field names are a problem: format version 1 has a closed list.
 */
export function sealedValueIssues(name: string, value: unknown): FieldIssue[] {
  const c = new Checker();
  const path = `sealed.${name}`;
  if (!(SEALED_FIELD_NAMES as readonly string[]).includes(name))
    return [{ path, message: 'is not a known sealed field' }];
  const holder = { v: value };
  switch (name as SealedFieldName) {
    case 'storage-location':
    case 'acquisition-source':
    case 'buyer-note':
    case 'private-note':
      c.str(holder, 'v', '', LIMITS.longText);
      break;
    case 'acquisition-date':
      c.pattern(holder, 'v', '', isCalendarDate, 'a date YYYY-MM-DD');
      break;
    case 'acquisition-cost':
    case 'transfer-price':
    case 'sale-price': {
      const m = c.obj(value, '', ['amount', 'currency']);
      if (m) {
        c.int(m, 'amount', '', 0, Number.MAX_SAFE_INTEGER);
        c.pattern(
          m,
          'currency',
          '',
          (x) => typeof x === 'string' && CURRENCY.test(x),
          'an ISO 4217 code (three capital letters)',
        );
      }
      break;
    }
    case 'sealed-exhibit':
      checkExhibit(c, value, '');
      break;
  }
  return c.issues.map((i) => ({
    path: i.path === 'v' || i.path === '' ? path : `${path}.${i.path.replace(/^v\.?/, '')}`,
    message: i.message,
  }));
}

/**
 * Checks the `facts` member of a header of format `version` (2 or later; default
 * {@link FORMAT_VERSION}) against the shape its kind requires (see the format's rule-fact table). Returns every problem (empty when valid); never throws.
 * Precondition: `kind` is an {@link EntryKind}.
 */
export function factsIssues(
  kind: EntryKind,
  facts: unknown,
  version: FormatVersion = FORMAT_VERSION,
): FieldIssue[] {
  const c = new Checker(version);
  const request = version >= 3 ? ['request'] : [];
  const p = 'facts';
  const exact = (required: string[], optional: string[] = []) => c.obj(facts, p, required, optional);
  switch (kind) {
    case 'registered':
    case 'described': {
      const o = exact(['count', 'listed'], kind === 'described' ? ['corrects'] : []);
      if (!o) break;
      if ('count' in o) c.count(o.count, join(p, 'count'));
      c.bool(o, 'listed', p);
      c.int(o, 'corrects', p, 0, SEQ_MAX, true);
      break;
    }
    case 'exhibit-added': {
      const o = c.obj(facts, p, [], ['original', 'sealedOnly', ...request]);
      if (!o) break;
      c.int(o, 'request', p, 0, SEQ_MAX, true);
      if ('original' in o === 'sealedOnly' in o) c.fail(p, 'must hold exactly one of original, sealedOnly');
      c.pattern(o, 'original', p, isHex64, '64 lower-case hex digits', true);
      if ('sealedOnly' in o && o.sealedOnly !== true) c.fail(join(p, 'sealedOnly'), 'must be true');
      break;
    }
    case 'opinion': {
      const o = exact(['exhibits'], request);
      if (o) c.int(o, 'request', p, 0, SEQ_MAX, true);
      if (o)
        c.list(
          o,
          'exhibits',
          p,
          (x, q) => (isHex64(x) ? undefined : c.fail(q, 'must be an exhibit sha256')),
          LIMITS.listItems,
        );
      break;
    }
    case 'opinion-withdrawn': {
      const o = exact(['opinionSeq']);
      if (o) c.int(o, 'opinionSeq', p, 0, SEQ_MAX);
      break;
    }
    case 'transfer-offered': {
      const o = exact(['recipient']);
      if (o) c.pattern(o, 'recipient', p, isActorId, 'an account id');
      break;
    }
    case 'transfer-accepted':
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed': {
      const o = exact(['offerSeq']);
      if (o) c.int(o, 'offerSeq', p, 0, SEQ_MAX);
      break;
    }
    case 'split': {
      const o = exact(['children']);
      if (!o) break;
      c.list(
        o,
        'children',
        p,
        (x, q) => {
          const ch = c.obj(x, q, ['lot', 'count']);
          if (!ch) return;
          c.pattern(ch, 'lot', q, isCanonicalLotCode, 'a canonical lot code');
          if ('count' in ch) c.count(ch.count, join(q, 'count'), 1);
        },
        LIMITS.children,
      );
      if (Array.isArray(o.children) && o.children.length === 0)
        c.fail(join(p, 'children'), 'must name at least one child');
      break;
    }
    case 'combined': {
      const o = exact(['child', 'count']);
      if (!o) break;
      c.pattern(o, 'child', p, isCanonicalLotCode, 'a canonical lot code');
      if ('count' in o) c.count(o.count, join(p, 'count'), 1);
      break;
    }
    case 'redacted': {
      const o = exact(['target']);
      if (o) c.int(o, 'target', p, 0, SEQ_MAX);
      break;
    }
    case 'note': {
      const o = exact([], ['ref']);
      if (o) c.int(o, 'ref', p, 0, SEQ_MAX, true);
      break;
    }
    case 'observed': {
      const o = exact([], ['corrects']);
      if (o) c.int(o, 'corrects', p, 0, SEQ_MAX, true);
      break;
    }
    case 'sale-voided': {
      const o = exact(['saleSeq']);
      if (o) c.int(o, 'saleSeq', p, 0, SEQ_MAX);
      break;
    }
    case 'opinion-requested': {
      const o = exact(['assessor']);
      if (o) c.pattern(o, 'assessor', p, (v) => v === null || isActorId(v), 'an account id or null');
      break;
    }
    case 'opinion-request-closed': {
      const o = exact(['request']);
      if (o) c.int(o, 'request', p, 0, SEQ_MAX);
      break;
    }
    case 'sold':
    case 'retired':
      exact([]);
      break;
    default:
      c.fail('kind', 'is not a known kind');
  }
  return c.issues;
}
