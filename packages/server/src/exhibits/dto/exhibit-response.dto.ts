import type { ExhibitDerivative, ExhibitFile, ExhibitKind } from '@beadroll/core';
import type { ExhibitEntity } from '../entities/exhibit.entity';

export type ExhibitVariant = 'original' | 'web' | 'thumb';
export const EXHIBIT_VARIANTS: readonly ExhibitVariant[] = ['original', 'web', 'thumb'];

/** One exhibit as a signed-in viewer sees it. */
export interface ExhibitResponse {
  seq: number;
  kind: ExhibitKind;
  caption?: string;
  sealed: boolean;
  addedBy: string;
  time: string;
  original: ExhibitFile;
  derivatives: ExhibitDerivative[];
  urls: Partial<Record<ExhibitVariant, string>>;
}

export interface ExhibitListResponse {
  exhibits: ExhibitResponse[];
}

export interface AddExhibitResponse {
  exhibit: ExhibitResponse;
  /** How the file was kept, for the uploader (for example a PDF stored as sent). */
  notes: string[];
}

/** The derivative a variant names (the original for `original`). */
export function fileOfVariant(
  ref: { original: ExhibitFile; derivatives: ExhibitDerivative[] },
  v: ExhibitVariant,
) {
  if (v === 'original') return ref.original;
  return ref.derivatives.find((d) => d.role === (v === 'thumb' ? 'thumbnail' : 'web'));
}

export function toExhibitResponse(row: ExhibitEntity, time: string, base: string): ExhibitResponse {
  const urls: Partial<Record<ExhibitVariant, string>> = {};
  for (const v of EXHIBIT_VARIANTS) if (fileOfVariant(row.ref, v)) urls[v] = `${base}/${row.seq}/${v}`;
  return {
    seq: row.seq,
    kind: row.ref.kind,
    ...(row.ref.caption ? { caption: row.ref.caption } : {}),
    sealed: row.sealed,
    addedBy: row.addedBy,
    time,
    original: row.ref.original,
    derivatives: row.ref.derivatives,
    urls,
  };
}
