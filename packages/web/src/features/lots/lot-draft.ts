import {
  LIMITS,
  beadSizeProblem,
  countProblem,
  currencyProblem,
  dateProblem,
  parseAmount,
  strandLengthProblem,
  type BaseGlass,
  type Decoration,
  type LotDescription,
  type LotForm,
  type Observations,
} from '@beadroll/core';
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

function length(
  v: string,
  field: string,
  errors: FieldErrors,
  problem: (n: unknown) => string | null,
): number | undefined {
  const t = v.trim().replace(',', '.');
  if (!t) return undefined;
  const n = LENGTH.test(t) ? Number(t) : NaN;
  const p = problem(n);
  if (p) {
    errors[field] = `${p}.`;
    return undefined;
  }
  return n;
}

/**
 * Checks a draft with core's bounds, as the server will, and builds the request. The server
 * checks again; its answers are shown at the same fields. `today` (YYYY-MM-DD) limits the
 * acquisition date.
 */
export function draftToRequest(
  d: LotDraft,
  today = new Date().toISOString(),
): { input: CreateLotInput | null; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const title = d.title.trim();
  if (!title) errors['description.title'] = 'Give the lot a title, as in “Blue wound beads with roses”.';
  else if (title.length > LIMITS.title)
    errors['description.title'] = `Keep the title to ${LIMITS.title} characters.`;
  const countText = d.countValue.trim();
  const countIssue = countProblem(COUNT.test(countText) ? Number(countText) : NaN);
  if (countIssue) errors['description.count.value'] = `${countIssue} (estimate if need be).`;
  const min = length(d.diameterMin, 'description.diameterMm.min', errors, beadSizeProblem);
  const max = length(d.diameterMax, 'description.diameterMm.max', errors, beadSizeProblem);
  if (min !== undefined && max !== undefined && min > max)
    errors['description.diameterMm.min'] = 'Enter a smallest bead size that is not larger than the largest.';
  const strand = length(d.strandLengthMm, 'description.strandLengthMm', errors, strandLengthProblem);
  const colours = d.colours
    .split(',')
    .map((c) => c.trim())
    .filter(Boolean);
  if (colours.some((c) => c.length > LIMITS.shortText))
    errors['description.colours'] = 'Keep each colour short.';

  const sealed: SealedInput = {};
  if (d.storageLocation.trim()) sealed.storageLocation = d.storageLocation.trim();
  if (d.privateNote.trim()) sealed.privateNote = d.privateNote.trim();
  const acquisition: NonNullable<SealedInput['acquisition']> = {};
  if (d.acquisitionDate) {
    const p = dateProblem(d.acquisitionDate, today);
    if (p) errors['sealed.acquisition.date'] = `${p}.`;
    else acquisition.date = d.acquisitionDate;
  }
  if (d.acquisitionSource.trim()) acquisition.source = d.acquisitionSource.trim();
  if (d.costAmount.trim()) {
    const currency = d.costCurrency.trim().toUpperCase();
    const c = currencyProblem(currency);
    if (c) errors['sealed.acquisition.cost.currency'] = `${c}.`;
    else {
      const parsed = parseAmount(d.costAmount, currency);
      if ('problem' in parsed) errors['sealed.acquisition.cost.amount'] = `${parsed.problem}.`;
      else acquisition.cost = { amount: parsed.amount, currency };
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
