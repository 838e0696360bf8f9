import {
  BASE_GLASS,
  DECORATIONS,
  LOT_FORMS,
  parseAmount,
  type BaseGlass,
  type Decoration,
  type LotForm,
} from '@beadroll/core';

/** One column a spreadsheet of lots may have: its key, the header the template uses, a hint. */
export interface ImportField {
  key: string;
  header: string;
  required?: boolean;
  hint: string;
  example: string;
}

/** The columns of the import template, in order. */
export const IMPORT_FIELDS: readonly ImportField[] = [
  {
    key: 'title',
    header: 'Title',
    required: true,
    hint: 'up to 200 characters',
    example: 'Blue wound beads with pink roses',
  },
  { key: 'form', header: 'Form', required: true, hint: LOT_FORMS.join(', '), example: 'strand' },
  { key: 'count', header: 'Number of beads', required: true, hint: 'a whole number', example: '51' },
  { key: 'countEstimated', header: 'Count is an estimate', hint: 'yes or no', example: 'yes' },
  { key: 'diameterMin', header: 'Bead size smallest (mm)', hint: 'mm, one decimal', example: '7.5' },
  { key: 'diameterMax', header: 'Bead size largest (mm)', hint: 'mm, one decimal', example: '8' },
  { key: 'strandLengthMm', header: 'Strand length (mm)', hint: 'mm, one decimal', example: '406.4' },
  { key: 'colours', header: 'Colours', hint: 'separated by commas', example: 'white, rose pink' },
  { key: 'baseGlass', header: 'Base glass', hint: BASE_GLASS.join(', '), example: 'opaque' },
  { key: 'decoration', header: 'Decoration', hint: DECORATIONS.join(', '), example: 'roses, trailing' },
  { key: 'decorationNote', header: 'About the decoration', hint: 'free text', example: '' },
  { key: 'condition', header: 'Condition', hint: 'free text', example: 'two beads chipped' },
  { key: 'summary', header: 'Description', hint: 'free text', example: '' },
  { key: 'listed', header: 'Listed', hint: 'yes or no (a public page)', example: 'no' },
  { key: 'storageLocation', header: 'Storage location', hint: 'private', example: 'box 3' },
  { key: 'acquisitionDate', header: 'Acquired on', hint: 'YYYY-MM-DD, private', example: '2026-03-14' },
  { key: 'acquisitionSource', header: 'Acquired from', hint: 'private', example: 'estate sale' },
  { key: 'cost', header: 'Cost', hint: 'amount, private', example: '45.50' },
  { key: 'currency', header: 'Currency', hint: 'ISO 4217 code such as EUR', example: 'EUR' },
  { key: 'privateNote', header: 'Private note', hint: 'private', example: '' },
];

/** Column index (0-based) of the sheet for each field key; absent = not imported. */
export type ColumnMapping = Partial<Record<string, number>>;

const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');

/** The mapping a sheet's header row suggests: a header equal to a field's header or key. */
export function suggestMapping(headers: readonly string[]): ColumnMapping {
  const out: ColumnMapping = {};
  headers.forEach((h, i) => {
    const f = IMPORT_FIELDS.find((x) => norm(x.header) === norm(h) || norm(x.key) === norm(h));
    if (f && out[f.key] === undefined) out[f.key] = i;
  });
  return out;
}

/** A problem with one cell, named by the field's template header. */
export interface CellProblem {
  column: string;
  message: string;
}

const YES = new Set(['yes', 'y', 'true', '1', 'x']);
const NO = new Set(['no', 'n', 'false', '0', '']);

function words(text: string): string[] {
  return text
    .split(/[,;]/)
    .map((w) => w.trim().toLowerCase().replace(/\s+/g, '-'))
    .filter(Boolean);
}

/**
 * Turns one sheet row into a registration request (as the register form sends it), or the
 * problems that stop it. The request is then checked like any other registration.
 */
export function rowToRequest(
  row: readonly string[],
  mapping: ColumnMapping,
): { request: Record<string, unknown> | null; problems: CellProblem[] } {
  const problems: CellProblem[] = [];
  const header = (key: string) => IMPORT_FIELDS.find((f) => f.key === key)!.header;
  const cell = (key: string) => {
    const i = mapping[key];
    return i === undefined ? '' : (row[i] ?? '').trim();
  };
  const fail = (key: string, message: string) => problems.push({ column: header(key), message });
  const num = (key: string): number | undefined => {
    const t = cell(key).replace(',', '.');
    if (!t) return undefined;
    const n = Number(t);
    if (!Number.isFinite(n)) {
      fail(key, 'Enter a number');
      return undefined;
    }
    return n;
  };
  const flag = (key: string, fallback: boolean): boolean => {
    const t = cell(key).toLowerCase();
    if (YES.has(t)) return true;
    if (NO.has(t)) return t === '' ? fallback : false;
    fail(key, 'Enter yes or no');
    return fallback;
  };
  const oneOf = <T extends string>(key: string, allowed: readonly T[]): T[] => {
    const ws = words(cell(key));
    const bad = ws.filter((w) => !allowed.includes(w as T));
    if (bad.length) fail(key, `Enter one or more of ${allowed.join(', ')} (not ${bad.join(', ')})`);
    return [...new Set(ws.filter((w) => allowed.includes(w as T)))] as T[];
  };

  for (const f of IMPORT_FIELDS)
    if (f.required && !cell(f.key)) fail(f.key, `Enter the ${f.header.toLowerCase()}`);
  const form = cell('form').toLowerCase();
  if (form && !LOT_FORMS.includes(form as LotForm)) fail('form', `Enter one of ${LOT_FORMS.join(', ')}`);
  const countText = cell('count');
  const count = /^\d+$/.test(countText) ? Number(countText) : countText ? NaN : undefined;

  const description: Record<string, unknown> = {
    title: cell('title'),
    form,
    count: { value: count ?? 0, estimated: flag('countEstimated', false) },
    colours: cell('colours')
      .split(/[,;]/)
      .map((c) => c.trim())
      .filter(Boolean),
    baseGlass: oneOf<BaseGlass>('baseGlass', BASE_GLASS),
    decoration: oneOf<Decoration>('decoration', DECORATIONS),
    listed: flag('listed', false),
  };
  const min = num('diameterMin');
  const max = num('diameterMax');
  if (min !== undefined || max !== undefined) description.diameterMm = { min: min ?? max, max: max ?? min };
  const strand = num('strandLengthMm');
  if (strand !== undefined) description.strandLengthMm = strand;
  for (const k of ['summary', 'decorationNote', 'condition'] as const) if (cell(k)) description[k] = cell(k);

  const sealed: Record<string, unknown> = {};
  if (cell('storageLocation')) sealed.storageLocation = cell('storageLocation');
  if (cell('privateNote')) sealed.privateNote = cell('privateNote');
  const acquisition: Record<string, unknown> = {};
  if (cell('acquisitionDate')) acquisition.date = cell('acquisitionDate');
  if (cell('acquisitionSource')) acquisition.source = cell('acquisitionSource');
  if (cell('cost')) {
    const currency = cell('currency').toUpperCase() || 'EUR';
    const parsed = parseAmount(cell('cost'), currency);
    if ('problem' in parsed) fail(parsed.problem.includes('currency') ? 'currency' : 'cost', parsed.problem);
    else acquisition.cost = { amount: parsed.amount, currency };
  }
  if (Object.keys(acquisition).length) sealed.acquisition = acquisition;
  const request = { description, ...(Object.keys(sealed).length ? { sealed } : {}) };
  return { request: problems.length ? null : request, problems };
}

/** Request field paths (as validation names them) → the import field they came from. */
const PATH_TO_FIELD: Array<[string, string]> = [
  ['description.title', 'title'],
  ['description.form', 'form'],
  ['description.count', 'count'],
  ['description.diameterMm.min', 'diameterMin'],
  ['description.diameterMm', 'diameterMax'],
  ['description.strandLengthMm', 'strandLengthMm'],
  ['description.colours', 'colours'],
  ['description.baseGlass', 'baseGlass'],
  ['description.decoration', 'decoration'],
  ['description.decorationNote', 'decorationNote'],
  ['description.condition', 'condition'],
  ['description.summary', 'summary'],
  ['description.listed', 'listed'],
  ['sealed.storageLocation', 'storageLocation'],
  ['sealed.privateNote', 'privateNote'],
  ['sealed.acquisition.date', 'acquisitionDate'],
  ['sealed.acquisition.source', 'acquisitionSource'],
  ['sealed.acquisition.cost.currency', 'currency'],
  ['sealed.acquisition.cost', 'cost'],
];

/** The template header of the import field a request field path came from. */
export function columnOf(path: string): string {
  const hit = PATH_TO_FIELD.find(([p]) => path === p || path.startsWith(`${p}.`));
  return hit ? IMPORT_FIELDS.find((f) => f.key === hit[1])!.header : path;
}
