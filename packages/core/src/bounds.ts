import { currencyOf } from './currencies.js';
import type { FieldIssue } from './errors.js';
import type { AnyBody, EntryKind, LotDescription, Money, SealedValues } from './types.js';

export { CURRENCIES, currencyOf, type Currency } from './currencies.js';

/**
 * Plausible values for what a dealer types, kept in one place: the web form, the server's
 * request checks and the roll rules (format version 2 writes) all read these.
 *
 * - Bead size: a bead is sized by its diameter in mm (trade usage: "Sizing and Bead Quantity
 *   for Round Bead Strands", taszel14.blogspot.com, 2008). The limits 0.5–100 mm are common
 *   practice, no source: smaller than the finest seed beads, larger than the largest trade beads.
 * - Strand length: rope necklaces run past 45 in = 1143 mm ("Pearl Necklace Lengths",
 *   glossaria.net); 10–5000 mm is common practice, no source, and leaves room for long ropes.
 * - Count: a "mass" of seed beads is 1,200 beads (forestheart, "Beads: Terminology"); a lot of up
 *   to 1,000,000 beads covers bulk seed-bead lots (common practice, no source).
 * - Years: glass beads are made since the third millennium BC (from memory), so a period starts
 *   no earlier than 3000 BC and ends no later than the year it is recorded in.
 */
export const BOUNDS = {
  beadSizeMm: { min: 0.5, max: 100 },
  strandLengthMm: { min: 10, max: 5000 },
  count: { min: 1, max: 1_000_000 },
  year: { min: -3000 },
  /** Largest amount in major units (a million of any currency unit is beyond a bead lot). */
  moneyMajor: { max: 100_000_000 },
} as const;

/** Earliest date a dealer may give for an acquisition or a sale. */
export const EARLIEST_DATE = '1900-01-01';

/** Writes a year for a dealer: 1850, or 300 BC for -300. */
export function yearText(y: number): string {
  return y < 0 ? `${-y} BC` : String(y);
}

function oneDecimal(v: number): boolean {
  return Math.abs(Math.round(v * 10) / 10 - v) < 1e-9;
}

function mmProblem(v: unknown, b: { min: number; max: number }, what: string): string | null {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < b.min || v > b.max || !oneDecimal(v))
    return `Enter ${what} between ${b.min} and ${b.max} mm, to at most one decimal place`;
  return null;
}

/** Message for a bead size (mm) outside {@link BOUNDS}, or null when it is plausible. */
export function beadSizeProblem(v: unknown): string | null {
  return mmProblem(v, BOUNDS.beadSizeMm, 'a bead size');
}

/** Message for a strand length (mm) outside {@link BOUNDS}, or null when it is plausible. */
export function strandLengthProblem(v: unknown): string | null {
  return mmProblem(v, BOUNDS.strandLengthMm, 'a strand length');
}

/** Message for a bead count outside {@link BOUNDS} (whole beads), or null. */
export function countProblem(v: unknown): string | null {
  const b = BOUNDS.count;
  if (!Number.isSafeInteger(v) || (v as number) < b.min || (v as number) > b.max)
    return `Enter a whole number of beads between ${b.min} and ${b.max.toLocaleString('en')}`;
  return null;
}

/** Message for a year outside 3000 BC … `thisYear`, or null. Precondition: thisYear is an integer. */
export function yearProblem(v: unknown, thisYear: number): string | null {
  if (!Number.isSafeInteger(v) || (v as number) < BOUNDS.year.min || (v as number) > thisYear)
    return `Enter a year between ${yearText(BOUNDS.year.min)} and ${thisYear}`;
  return null;
}

/**
 * Message for a calendar date (YYYY-MM-DD) before 1900 or later than today, or null. `now` is an
 * RFC 3339 UTC time; a date one day past its UTC day is still today somewhere, so it passes.
 */
export function dateProblem(v: unknown, now: string): string | null {
  const latest = new Date(Date.parse(now) + 86_400_000).toISOString().slice(0, 10);
  if (typeof v !== 'string' || v < EARLIEST_DATE || v > latest)
    return `Enter a date from ${EARLIEST_DATE} up to today`;
  return null;
}

/** Message for an unknown currency code, or null. */
export function currencyProblem(code: unknown): string | null {
  return currencyOf(code)
    ? null
    : 'Choose a currency by its three-letter ISO 4217 code, such as EUR, GBP or USD';
}

/** Message for an amount in minor units that is not positive or too large, or null. */
export function amountProblem(amount: unknown, currency: unknown): string | null {
  const c = currencyOf(currency);
  const digits = c?.digits ?? 2;
  const max = BOUNDS.moneyMajor.max * 10 ** digits;
  if (!Number.isSafeInteger(amount) || (amount as number) < 1 || (amount as number) > max)
    return `Enter an amount above 0 and at most ${BOUNDS.moneyMajor.max.toLocaleString('en')}`;
  return null;
}

/** Problems with a money value ({amount, currency}), as field issues under `path`. */
export function moneyIssues(m: Money, path: string): FieldIssue[] {
  const out: FieldIssue[] = [];
  const c = currencyProblem(m.currency);
  if (c) out.push({ path: `${path}.currency`, message: c });
  const a = amountProblem(m.amount, m.currency);
  if (a) out.push({ path: `${path}.amount`, message: a });
  return out;
}

/**
 * Reads an amount typed by a dealer ("12.50", "12,50", "1500") in `currency`'s major units and
 * returns it in minor units, or a message saying what to enter (decimals beyond the currency's
 * minor unit are refused: yen have none, dinars three).
 */
export function parseAmount(text: string, currency: string): { amount: number } | { problem: string } {
  const c = currencyOf(currency);
  if (!c) return { problem: currencyProblem(currency)! };
  const t = text.trim().replace(',', '.');
  const m = /^(\d+)(?:\.(\d*))?$/.exec(t);
  const decimals = m?.[2] ?? '';
  if (!m || decimals.length > c.digits) {
    const how =
      c.digits === 0
        ? `a whole number (${c.code} has no smaller unit)`
        : `a number with at most ${c.digits} decimal place${c.digits === 1 ? '' : 's'}`;
    return {
      problem: `Enter the amount as ${how}, such as ${c.digits === 0 ? '1500' : '12.' + '5'.repeat(c.digits)}`,
    };
  }
  const amount = Number(m[1]) * 10 ** c.digits + Number(decimals.padEnd(c.digits, '0') || '0');
  const p = amountProblem(amount, c.code);
  return p ? { problem: p } : { amount };
}

/** Problems with a description's sizes, length and count, as field issues under `path`. */
export function descriptionIssues(d: LotDescription, path = 'description'): FieldIssue[] {
  const out: FieldIssue[] = [];
  const add = (p: string, m: string | null) => {
    if (m) out.push({ path: `${path}.${p}`, message: m });
  };
  if (d.diameterMm) {
    add('diameterMm.min', beadSizeProblem(d.diameterMm.min));
    add('diameterMm.max', beadSizeProblem(d.diameterMm.max));
  }
  if (d.strandLengthMm !== undefined) add('strandLengthMm', strandLengthProblem(d.strandLengthMm));
  add('count.value', countProblem(d.count?.value));
  return out;
}

/**
 * The plausibility rules for a body written at `time` (RFC 3339, UTC): sizes, lengths and counts
 * of descriptions and split or combined children, an opinion's years (not after the year of
 * `time`), a sale's date (not after the day of `time`). Returns field issues (empty when all is
 * plausible). Precondition: the body already has its kind's shape (see `bodyIssues`). Writers
 * apply this to every new entry; verifiers apply it to format version 2 entries only.
 */
export function bodyBoundIssues(kind: EntryKind, body: AnyBody, time: string): FieldIssue[] {
  const b = body as unknown as Record<string, unknown>;
  switch (kind) {
    case 'registered':
    case 'described':
      return descriptionIssues(b.description as LotDescription);
    case 'opinion': {
      const p = b.period as { from: number; to: number };
      const year = Number(time.slice(0, 4));
      const out: FieldIssue[] = [];
      const f = yearProblem(p.from, year);
      if (f) out.push({ path: 'period.from', message: f });
      const t = yearProblem(p.to, year);
      if (t) out.push({ path: 'period.to', message: t });
      return out;
    }
    case 'split':
      return (b.children as Array<{ count: { value: number } }>).flatMap((c, i) => {
        const m = countProblem(c.count.value);
        return m ? [{ path: `children[${i}].count.value`, message: m }] : [];
      });
    case 'combined': {
      const m = countProblem((b.count as { value: number }).value);
      return m ? [{ path: 'count.value', message: m }] : [];
    }
    case 'sold': {
      const m = dateProblem(b.date, time);
      return m ? [{ path: 'date', message: m }] : [];
    }
    default:
      return [];
  }
}

/** The plausibility rules for sealed values written at `time`: money and dates. */
export function sealedBoundIssues(sealed: SealedValues, time: string): FieldIssue[] {
  const out: FieldIssue[] = [];
  for (const name of ['acquisition-cost', 'transfer-price', 'sale-price'] as const) {
    const v = sealed[name];
    if (v) out.push(...moneyIssues(v, `sealed.${name}`));
  }
  const d = sealed['acquisition-date'];
  if (d !== undefined) {
    const m = dateProblem(d, time);
    if (m) out.push({ path: 'sealed.acquisition-date', message: m });
  }
  return out;
}
