import type { BaseGlass, Decoration, LotDescription, LotForm, Observations } from '@beadroll/core';
import { MM_PER_INCH } from './labels';
import type { CreateLotInput, SealedInput } from './lots.api';

/**
 * What the register form holds, as typed: numbers stay strings until sent, so nothing a dealer
 * types is lost to parsing, and the draft can be kept in the browser (see saveDraft).
 */
export interface LotDraft {
  title: string;
  summary: string;
  form: LotForm;
  countValue: string;
  countEstimated: boolean;
  diameterMin: string;
  diameterMax: string;
  strandLengthMm: string;
  colours: string;
  baseGlass: BaseGlass[];
  decoration: Decoration[];
  decorationNote: string;
  condition: string;
  listed: boolean;
  observations: Observations;
  storageLocation: string;
  acquisitionDate: string;
  acquisitionSource: string;
  costAmount: string;
  costCurrency: string;
  privateNote: string;
}

export const EMPTY_DRAFT: LotDraft = {
  title: '',
  summary: '',
  form: 'strand',
  countValue: '',
  countEstimated: false,
  diameterMin: '',
  diameterMax: '',
  strandLengthMm: '',
  colours: '',
  baseGlass: [],
  decoration: [],
  decorationNote: '',
  condition: '',
  listed: false,
  observations: {},
  storageLocation: '',
  acquisitionDate: '',
  acquisitionSource: '',
  costAmount: '',
  costCurrency: 'EUR',
  privateNote: '',
};

/** A draft filled from an existing description (for "describe"). */
export function draftFromDescription(d: LotDescription): LotDraft {
  return {
    ...EMPTY_DRAFT,
    title: d.title,
    summary: d.summary ?? '',
    form: d.form,
    countValue: String(d.count.value),
    countEstimated: d.count.estimated,
    diameterMin: d.diameterMm ? String(d.diameterMm.min) : '',
    diameterMax: d.diameterMm ? String(d.diameterMm.max) : '',
    strandLengthMm: d.strandLengthMm !== undefined ? String(d.strandLengthMm) : '',
    colours: d.colours.join(', '),
    baseGlass: [...d.baseGlass],
    decoration: [...d.decoration],
    decorationNote: d.decorationNote ?? '',
    condition: d.condition ?? '',
    listed: d.listed,
  };
}

/** Field name (as the server names it in a 400 body) → the reason. */
export type FieldErrors = Record<string, string>;

const LENGTH = /^\d+(\.\d)?$/;
const COUNT = /^\d+$/;

/** mm for a length typed in inches, to the 0.1 mm the ledger keeps. */
export function inchesToMm(inches: number): number {
  return Math.round(inches * MM_PER_INCH * 10) / 10;
}

/**
 * Beads on a strand: length ÷ bead size along the string, rounded to the nearest bead; knots,
 * spacers and the clasp make the real count smaller. Null when either is missing or not positive.
 */
export function estimateBeads(strandLengthMm: number, beadSizeMm: number): number | null {
  if (!(strandLengthMm > 0) || !(beadSizeMm > 0)) return null;
  return Math.round(strandLengthMm / beadSizeMm);
}

function length(v: string, field: string, errors: FieldErrors): number | undefined {
  const t = v.trim().replace(',', '.');
  if (!t) return undefined;
  if (!LENGTH.test(t) || Number(t) > 100_000) {
    errors[field] = 'Give millimetres with at most one decimal, as in 8 or 8.5.';
    return undefined;
  }
  return Number(t);
}

/** Digits after the decimal point of a currency (ISO 4217 minor units, as Intl knows them). */
export function minorDigits(currency: string): number | null {
  try {
    return (
      new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ??
      2
    );
  } catch {
    return null;
  }
}

/**
 * Checks a draft the way the server will and builds the request. The server checks again;
 * its answers are shown at the same fields.
 */
export function draftToRequest(d: LotDraft): { input: CreateLotInput | null; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const title = d.title.trim();
  if (!title) errors['description.title'] = 'Give the lot a title, as in “Blue wound beads with roses”.';
  else if (title.length > 200) errors['description.title'] = 'Keep the title to 200 characters.';
  const countText = d.countValue.trim();
  if (!COUNT.test(countText) || Number(countText) > 10_000_000)
    errors['description.count.value'] = 'Give the number of beads as a whole number (estimate if need be).';
  const min = length(d.diameterMin, 'description.diameterMm.min', errors);
  const max = length(d.diameterMax, 'description.diameterMm.max', errors);
  if (min !== undefined && max !== undefined && min > max)
    errors['description.diameterMm.min'] = 'The smallest size is larger than the largest.';
  const strand = length(d.strandLengthMm, 'description.strandLengthMm', errors);
  const colours = d.colours
    .split(',')
    .map((c) => c.trim())
    .filter(Boolean);
  if (colours.some((c) => c.length > 200)) errors['description.colours'] = 'Keep each colour short.';

  const sealed: SealedInput = {};
  if (d.storageLocation.trim()) sealed.storageLocation = d.storageLocation.trim();
  if (d.privateNote.trim()) sealed.privateNote = d.privateNote.trim();
  const acquisition: NonNullable<SealedInput['acquisition']> = {};
  if (d.acquisitionDate) {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(d.acquisitionDate))
      errors['sealed.acquisition.date'] = 'Give the date as YYYY-MM-DD.';
    else acquisition.date = d.acquisitionDate;
  }
  if (d.acquisitionSource.trim()) acquisition.source = d.acquisitionSource.trim();
  const amount = d.costAmount.trim().replace(',', '.');
  if (amount) {
    const currency = d.costCurrency.trim().toUpperCase();
    const digits = /^[A-Z]{3}$/.test(currency) ? minorDigits(currency) : null;
    if (digits === null)
      errors['sealed.acquisition.cost.currency'] = 'Give a currency code, as in EUR or GBP.';
    const re = digits ? new RegExp(`^\\d+(\\.\\d{1,${digits}})?$`) : /^\d+$/;
    if (!re.test(amount))
      errors['sealed.acquisition.cost.amount'] =
        digits === 0
          ? 'This currency has no smaller unit: give a whole amount.'
          : 'Give an amount, as in 45 or 45.50.';
    else if (digits !== null) {
      const [whole, frac = ''] = amount.split('.');
      const minor = Number(whole) * 10 ** digits + Number(frac.padEnd(digits, '0') || '0');
      acquisition.cost = { amount: minor, currency };
    }
  }
  if (Object.keys(acquisition).length) sealed.acquisition = acquisition;

  const description: LotDescription = {
    title,
    form: d.form,
    count: { value: Number(countText), estimated: d.countEstimated },
    colours,
    baseGlass: d.baseGlass,
    decoration: d.decoration,
    listed: d.listed,
  };
  if (d.summary.trim()) description.summary = d.summary.trim();
  // One size alone means beads of one size.
  if (min !== undefined || max !== undefined) description.diameterMm = { min: min ?? max!, max: max ?? min! };
  if (strand !== undefined) description.strandLengthMm = strand;
  if (d.decorationNote.trim()) description.decorationNote = d.decorationNote.trim();
  if (d.condition.trim()) description.condition = d.condition.trim();

  const observations: Observations = { ...d.observations };
  if (observations.note !== undefined && !observations.note.trim()) delete observations.note;

  if (Object.keys(errors).length) return { input: null, errors };
  return {
    input: {
      description,
      ...(Object.keys(observations).length ? { observations } : {}),
      ...(Object.keys(sealed).length ? { sealed } : {}),
    },
    errors,
  };
}

const DRAFT_KEY = 'beadroll.register-draft.v1';
const SEALED_KEY = 'beadroll.register-draft.sealed.v1';

/** The draft's sealed fields: what it costs, where from, where kept, private notes. */
export const SEALED_DRAFT_FIELDS = [
  'storageLocation',
  'acquisitionDate',
  'acquisitionSource',
  'costAmount',
  'costCurrency',
  'privateNote',
] as const satisfies ReadonlyArray<keyof LotDraft>;

type Split = { open: Partial<LotDraft>; sealed: Partial<LotDraft> };

function split(d: Partial<LotDraft>): Split {
  const open: Record<string, unknown> = { ...d };
  const sealed: Record<string, unknown> = {};
  for (const k of SEALED_DRAFT_FIELDS) {
    if (k in open) sealed[k] = open[k];
    delete open[k];
  }
  return { open: open as Partial<LotDraft>, sealed: sealed as Partial<LotDraft> };
}

function read(storage: Storage | undefined, key: string): Partial<LotDraft> {
  try {
    const raw = storage?.getItem(key);
    return raw ? (JSON.parse(raw) as Partial<LotDraft>) : {};
  } catch {
    return {};
  }
}

/** Where the draft is kept. */
export interface DraftStores {
  /** The description and observations, kept until the lot is registered. */
  local?: Storage;
  /** The sealed fields, kept only for this tab's session: they survive a reload, not closing the browser. */
  session?: Storage;
}

function stores(s: DraftStores | undefined): DraftStores {
  if (s) return s;
  try {
    return { local: globalThis.localStorage, session: globalThis.sessionStorage };
  } catch {
    return {};
  }
}

/**
 * The kept draft of the register form, or the empty one. Sealed fields are taken only from the
 * session store, never from the lasting one (where older versions kept them).
 */
export function loadDraft(s?: DraftStores): LotDraft {
  const { local, session } = stores(s);
  return {
    ...EMPTY_DRAFT,
    ...split(read(local, DRAFT_KEY)).open,
    ...split(read(session, SEALED_KEY)).sealed,
  };
}

function write(storage: Storage | undefined, key: string, value: Partial<LotDraft> | null): void {
  try {
    if (value) storage?.setItem(key, JSON.stringify(value));
    else storage?.removeItem(key);
  } catch {
    // A full or blocked storage only loses the draft-on-reload convenience.
  }
}

/** Keeps the draft: the open part in the lasting store, the sealed part in the session store. */
export function saveDraft(d: LotDraft, s?: DraftStores): void {
  const { local, session } = stores(s);
  const { open, sealed } = split(d);
  write(local, DRAFT_KEY, open);
  write(session, SEALED_KEY, sealed);
}

/** Forgets the draft in both stores (once the lot is registered). */
export function clearDraft(s?: DraftStores): void {
  const { local, session } = stores(s);
  write(local, DRAFT_KEY, null);
  write(session, SEALED_KEY, null);
}
