import {
  QR_QUIET_ZONE_MODULES,
  TagError,
  normaliseTagHost,
  qrModulesPerSide,
  tagQrVersion,
  type QrEcLevel,
} from '@beadroll/core';
import { AppError, type FieldProblem } from '../common/app-error';

// Geometry of printed tags, in millimetres. Pure: no PDF, no I/O.

/** The two label designs: a strung tag and the flag of a jewellery barbell label. */
export const TAG_DESIGNS = ['string', 'barbell'] as const;
export type TagDesign = (typeof TAG_DESIGNS)[number];

/** Sheet papers and their sizes in mm (ISO 216 A4; US Letter is 8.5 × 11 in, 1 in = 25.4 mm). */
export const PAPERS = {
  a4: { widthMm: 210, heightMm: 297 },
  letter: { widthMm: 215.9, heightMm: 279.4 },
} as const;
export type Paper = keyof typeof PAPERS;

/** Error-correction level of every printed tag: the smallest symbol, as the payload is short. */
export const TAG_EC_LEVEL: QrEcLevel = 'L';

/**
 * Smallest module a phone reads reliably when held by hand: about 0.4 mm
 * (qrtool.ch, "QR code size for print – minimum dimensions"; GS1 consumer QR minimum X 0.396 mm).
 */
export const MIN_MODULE_MM = 0.4;

/** Default label sizes; a sheet or a roll may set its own within the limits below. */
export const DESIGN_DEFAULTS: Record<TagDesign, { widthMm: number; heightMm: number }> = {
  // A small strung tag, about 7/8 × 1 3/8 in (common practice, no source).
  string: { widthMm: 22, heightMm: 35 },
  // One printable flag of a barbell label: a version 2 symbol at 0.4 mm with its quiet zone
  // is (25 + 8) × 0.4 = 13.2 mm, so the flag is that tall and the code sits beside it.
  barbell: { widthMm: 30, heightMm: 13.2 },
};

export const LABEL_LIMITS = { minMm: 8, maxMm: 120 } as const;
export const GRID_LIMITS = { maxCells: 60, maxMarginMm: 60, maxGapMm: 40 } as const;

/** How a sheet of labels is laid out. Omitted columns or rows mean "as many as fit". */
export interface SheetSpec {
  paper: Paper;
  columns?: number;
  rows?: number;
  marginTopMm: number;
  marginRightMm: number;
  marginBottomMm: number;
  marginLeftMm: number;
  gapXMm: number;
  gapYMm: number;
  /** Cells already used on the first sheet (filled left to right, top to bottom). */
  skip?: number;
  /** Draw a thin cutting outline around each cell (for plain paper). */
  outline?: boolean;
}

/** What to print: a design, an optional label size, and a sheet (or none: one label per page). */
export interface TagLayoutRequest {
  design: TagDesign;
  labelWidthMm?: number;
  labelHeightMm?: number;
  sheet?: SheetSpec;
}

/** A box in mm, origin at the top left of the page. */
export interface BoxMm {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where each part of one label goes, relative to the label's top left corner. */
export interface LabelGeometry {
  design: TagDesign;
  widthMm: number;
  heightMm: number;
  /** The symbol including its quiet zone; side = (modules + 8) × moduleMm. */
  qr: { x: number; y: number; moduleMm: number; modules: number; version: number };
  /** The box the text goes in. */
  text: BoxMm;
}

/** A full plan: page size, label geometry, and the cell origins on each page. */
export interface TagPlan {
  pageWidthMm: number;
  pageHeightMm: number;
  label: LabelGeometry;
  columns: number;
  rows: number;
  /** Label origins (top left, mm) in print order; page is 0-based. */
  cells: { page: number; x: number; y: number }[];
  outline: boolean;
  skip: number;
}

const EPS = 1e-6;
const round = (n: number) => Math.round(n * 100) / 100;

// Room the text of each design needs, in mm (sized for 5–8 pt type).
const STRING_HOLE_MM = 4; // punched hole at the top of a strung tag
const STRING_TEXT_MM = 12.5; // code, two title lines, date, entry line
const STRING_MAX_MODULE_MM = 0.75; // safer print value; larger only wastes the tag
const BARBELL_MIN_TEXT_MM = 11; // "7K2Q-M9XA-T" at no less than about 5 pt

/** The QR version of `host`'s payloads, or a 400 naming `host` when no table version holds it. */
export function versionForHost(host: string): number {
  let version: number | null;
  try {
    version = tagQrVersion(host, TAG_EC_LEVEL);
  } catch (e) {
    if (e instanceof TagError) throw AppError.validation([{ field: 'host', reason: e.message }]);
    throw e;
  }
  if (version === null)
    throw AppError.validation([
      {
        field: 'host',
        reason: 'the public address is too long for a tag: its QR symbol would exceed version 6',
      },
    ]);
  return version;
}

/**
 * Lays out one label of `design` at `widthMm × heightMm` for a symbol of `version`. Returns
 * the geometry or the reason it does not fit (module under 0.4 mm, no room for the text).
 */
export function labelGeometry(
  design: TagDesign,
  widthMm: number,
  heightMm: number,
  version: number,
): { ok: true; geometry: LabelGeometry } | { ok: false; reason: string } {
  const modules = qrModulesPerSide(version);
  const span = modules + 2 * QR_QUIET_ZONE_MODULES;
  const tooSmall = (room: string) => ({
    ok: false as const,
    reason: `a version ${version} symbol needs ${round(span * MIN_MODULE_MM)} mm at ${MIN_MODULE_MM} mm per module; ${room}`,
  });
  const fits = (qr: Omit<LabelGeometry['qr'], 'modules' | 'version'>, text: LabelGeometry['text']) => ({
    ok: true as const,
    geometry: { design, widthMm, heightMm, qr: { ...qr, modules, version }, text },
  });
  if (design === 'string') {
    const qrRoom = Math.min(widthMm, heightMm - STRING_HOLE_MM - STRING_TEXT_MM);
    const moduleMm = Math.min(STRING_MAX_MODULE_MM, qrRoom / span);
    if (moduleMm + EPS < MIN_MODULE_MM)
      return tooSmall(`a ${widthMm} × ${heightMm} mm string tag leaves ${round(Math.max(qrRoom, 0))} mm`);
    const side = moduleMm * span;
    const qrY = STRING_HOLE_MM;
    // The quiet zone's lower half is blank: the text may start just under the symbol.
    return fits(
      { x: (widthMm - side) / 2, y: qrY, moduleMm },
      {
        x: 1.2,
        y: qrY + side - moduleMm * 2,
        w: widthMm - 2.4,
        h: heightMm - (qrY + side - moduleMm * 2) - 0.8,
      },
    );
  }
  const moduleMm = heightMm / span;
  if (moduleMm + EPS < MIN_MODULE_MM) return tooSmall(`a barbell flag ${heightMm} mm tall is too small`);
  const side = moduleMm * span;
  const textX = side - moduleMm * 2;
  if (widthMm - textX - 0.8 < BARBELL_MIN_TEXT_MM)
    return {
      ok: false,
      reason: `a barbell flag ${widthMm} mm wide leaves ${round(widthMm - textX - 0.8)} mm beside the symbol; the code needs ${BARBELL_MIN_TEXT_MM} mm`,
    };
  return fits({ x: 0, y: 0, moduleMm }, { x: textX, y: 0.8, w: widthMm - textX - 0.8, h: heightMm - 1.6 });
}

/** How each design fares with `host` at its default size (for the print dialog's warnings). */
export interface DesignFit {
  design: TagDesign;
  fits: boolean;
  moduleMm?: number;
  reason?: string;
}

/** The QR version for `host` and whether each design fits at its default size. */
export function tagFit(host: string): { host: string; version: number; designs: DesignFit[] } {
  const version = versionForHost(host);
  const designs = TAG_DESIGNS.map((design): DesignFit => {
    const d = DESIGN_DEFAULTS[design];
    const g = labelGeometry(design, d.widthMm, d.heightMm, version);
    return g.ok
      ? { design, fits: true, moduleMm: round(g.geometry.qr.moduleMm * 1000) / 1000 }
      : { design, fits: false, reason: g.reason };
  });
  return { host: normaliseTagHost(host), version, designs };
}

function checkNumber(problems: FieldProblem[], field: string, value: number, min: number, max: number): void {
  if (!Number.isFinite(value) || value < min || value > max)
    problems.push({ field, reason: `must be a number from ${min} to ${max}` });
}

/**
 * Plans `count` labels for `host` as `request` asks. Throws AppError `validation` naming the
 * field: `host` when no design fits its QR symbol, `design`/`labelHeightMm`/`labelWidthMm` when
 * this label is too small, `sheet.columns`/`sheet.rows` when the grid does not fit the page.
 */
export function planTags(host: string, request: TagLayoutRequest, count: number): TagPlan {
  const version = versionForHost(host);
  if (!TAG_DESIGNS.includes(request.design))
    throw AppError.validation([{ field: 'design', reason: `must be one of ${TAG_DESIGNS.join(', ')}` }]);
  const defaults = DESIGN_DEFAULTS[request.design];
  const widthMm = request.labelWidthMm ?? defaults.widthMm;
  const heightMm = request.labelHeightMm ?? defaults.heightMm;
  const problems: FieldProblem[] = [];
  checkNumber(problems, 'labelWidthMm', widthMm, LABEL_LIMITS.minMm, LABEL_LIMITS.maxMm);
  checkNumber(problems, 'labelHeightMm', heightMm, LABEL_LIMITS.minMm, LABEL_LIMITS.maxMm);
  if (problems.length) throw AppError.validation(problems);

  const fitted = labelGeometry(request.design, widthMm, heightMm, version);
  if (!fitted.ok) {
    const anyFits = TAG_DESIGNS.some(
      (d) => labelGeometry(d, DESIGN_DEFAULTS[d].widthMm, DESIGN_DEFAULTS[d].heightMm, version).ok,
    );
    const field = !anyFits
      ? 'host'
      : request.labelWidthMm !== undefined || request.labelHeightMm !== undefined
        ? request.design === 'barbell' && fitted.reason.includes('wide')
          ? 'labelWidthMm'
          : 'labelHeightMm'
        : 'design';
    throw AppError.validation([{ field, reason: fitted.reason }]);
  }
  const label = fitted.geometry;

  if (!request.sheet) {
    return {
      pageWidthMm: widthMm,
      pageHeightMm: heightMm,
      label,
      columns: 1,
      rows: 1,
      cells: Array.from({ length: count }, (_, page) => ({ page, x: 0, y: 0 })),
      outline: false,
      skip: 0,
    };
  }

  const s = request.sheet;
  const paper = PAPERS[s.paper];
  if (!paper) throw AppError.validation([{ field: 'sheet.paper', reason: 'must be a4 or letter' }]);
  for (const side of ['marginTopMm', 'marginRightMm', 'marginBottomMm', 'marginLeftMm'] as const)
    checkNumber(problems, `sheet.${side}`, s[side], 0, GRID_LIMITS.maxMarginMm);
  checkNumber(problems, 'sheet.gapXMm', s.gapXMm, 0, GRID_LIMITS.maxGapMm);
  checkNumber(problems, 'sheet.gapYMm', s.gapYMm, 0, GRID_LIMITS.maxGapMm);
  for (const n of ['columns', 'rows'] as const)
    if (s[n] !== undefined && (!Number.isInteger(s[n]) || s[n]! < 1 || s[n]! > GRID_LIMITS.maxCells))
      problems.push({
        field: `sheet.${n}`,
        reason: `must be a whole number from 1 to ${GRID_LIMITS.maxCells}`,
      });
  if (problems.length) throw AppError.validation(problems);

  const innerW = paper.widthMm - s.marginLeftMm - s.marginRightMm;
  const innerH = paper.heightMm - s.marginTopMm - s.marginBottomMm;
  const most = (inner: number, size: number, gap: number) => Math.floor((inner + gap + EPS) / (size + gap));
  const columns = s.columns ?? most(innerW, widthMm, s.gapXMm);
  const rows = s.rows ?? most(innerH, heightMm, s.gapYMm);
  const needW = columns * widthMm + (columns - 1) * s.gapXMm;
  const needH = rows * heightMm + (rows - 1) * s.gapYMm;
  if (columns < 1 || needW > innerW + EPS)
    problems.push({
      field: 'sheet.columns',
      reason: `${Math.max(columns, 1)} columns of ${widthMm} mm labels need ${round(Math.max(needW, widthMm))} mm; the ${s.paper === 'a4' ? 'A4' : 'Letter'} page has ${round(innerW)} mm between its margins`,
    });
  if (rows < 1 || needH > innerH + EPS)
    problems.push({
      field: 'sheet.rows',
      reason: `${Math.max(rows, 1)} rows of ${heightMm} mm labels need ${round(Math.max(needH, heightMm))} mm; the ${s.paper === 'a4' ? 'A4' : 'Letter'} page has ${round(innerH)} mm between its margins`,
    });
  if (problems.length) throw AppError.validation(problems);

  const perPage = columns * rows;
  const skip = s.skip ?? 0;
  if (!Number.isInteger(skip) || skip < 0 || skip >= perPage)
    throw AppError.validation([
      { field: 'sheet.skip', reason: `must be a whole number from 0 to ${perPage - 1}` },
    ]);

  const cells: TagPlan['cells'] = [];
  for (let i = 0; i < count; i++) {
    const slot = i + skip;
    const page = Math.floor(slot / perPage);
    const within = slot % perPage;
    const col = within % columns;
    const row = Math.floor(within / columns);
    cells.push({
      page,
      x: s.marginLeftMm + col * (widthMm + s.gapXMm),
      y: s.marginTopMm + row * (heightMm + s.gapYMm),
    });
  }
  return {
    pageWidthMm: paper.widthMm,
    pageHeightMm: paper.heightMm,
    label,
    columns,
    rows,
    cells,
    outline: s.outline ?? false,
    skip,
  };
}
