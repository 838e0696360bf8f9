import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { EXHIBIT_KINDS, type ExhibitDerivative, type ExhibitFile, type ExhibitKind } from '@beadroll/core';
import type { ExhibitEntity } from '../entities/exhibit.entity';

export type ExhibitVariant = 'original' | 'web' | 'thumb';
export const EXHIBIT_VARIANTS: readonly ExhibitVariant[] = ['original', 'web', 'thumb'];

/** Where each kept variant of an exhibit is served, for this viewer. */
export class ExhibitUrls implements Partial<Record<ExhibitVariant, string>> {
  @ApiPropertyOptional() original?: string;
  @ApiPropertyOptional() web?: string;
  @ApiPropertyOptional() thumb?: string;
}

/** One exhibit as a signed-in viewer sees it. */
export class ExhibitResponse {
  @ApiProperty() seq: number;
  @ApiProperty({ enum: EXHIBIT_KINDS }) kind: ExhibitKind;
  @ApiPropertyOptional() caption?: string;
  @ApiProperty({ description: 'on the roll only as a commitment; shown to the dealer who added it' })
  sealed: boolean;
  @ApiProperty() addedBy: string;
  @ApiProperty() time: string;
  @ApiProperty({ type: Object, description: "the stored file as the roll names it (core's ExhibitFile)" })
  original: ExhibitFile;
  @ApiProperty({ type: [Object], description: "the files derived from it (core's ExhibitDerivative)" })
  derivatives: ExhibitDerivative[];
  @ApiProperty({ type: ExhibitUrls }) urls: ExhibitUrls;
}

export class ExhibitListResponse {
  @ApiProperty({ type: [ExhibitResponse] }) exhibits: ExhibitResponse[];
}

export class AddExhibitResponse {
  @ApiProperty({ type: ExhibitResponse }) exhibit: ExhibitResponse;
  @ApiProperty({
    type: [String],
    description: 'how the file was kept, for the uploader (for example a PDF stored as sent)',
  })
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
