import { queryOptions } from '@tanstack/react-query';
import { api, CSRF_HEADER, toApiError } from '../../lib/api';

export type TagDesign = 'string' | 'barbell';
export type Paper = 'a4' | 'letter';

/** How each design fares with the service's public host (from the server's layout check). */
export interface TagLayouts {
  host: string;
  version: number;
  designs: { design: TagDesign; fits: boolean; moduleMm?: number; reason?: string }[];
  defaults: Record<TagDesign, { widthMm: number; heightMm: number }>;
  papers: Record<Paper, { widthMm: number; heightMm: number }>;
}

export interface SheetRequest {
  paper: Paper;
  columns?: number;
  rows?: number;
  marginTopMm: number;
  marginRightMm: number;
  marginBottomMm: number;
  marginLeftMm: number;
  gapXMm: number;
  gapYMm: number;
  skip?: number;
  outline?: boolean;
}

export interface TagPrintRequest {
  lots: string[];
  design: TagDesign;
  labelWidthMm?: number;
  labelHeightMm?: number;
  sheet?: SheetRequest;
}

/** A row of the dealer's own lots, as the lot list answers. */
export interface HeldLotRow {
  code: string;
  displayCode: string;
  title: string;
  listed: boolean;
  status: string;
}

export const tagsQueries = {
  all: () => ['tags'] as const,
  layouts: () =>
    queryOptions({ queryKey: ['tags', 'layouts'], queryFn: () => api<TagLayouts>('/api/tags/layouts') }),
  heldLots: () =>
    queryOptions({
      queryKey: ['lots', 'list', { mine: true, pageSize: 100 }],
      queryFn: () =>
        api<{ items: HeldLotRow[]; total: number }>(
          '/api/lots?mine=true&pageSize=100&sort=updated&order=desc',
        ),
    }),
};

/** Asks for the tag PDF; resolves to the file, or throws ApiError (400 with the fields). */
export async function fetchTagPdf(request: TagPrintRequest): Promise<Blob> {
  const res = await fetch('/api/tags/pdf', {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Accept: 'application/pdf', [CSRF_HEADER]: '1' },
    credentials: 'same-origin',
    body: JSON.stringify(request),
  });
  if (!res.ok) throw await toApiError(res);
  return res.blob();
}

/** Lists unlisted lots (the holder's confirmation): each gets a `described` entry. */
export function listLots(lots: string[]): Promise<{ listed: string[] }> {
  return api<{ listed: string[] }>('/api/tags/list', { body: { lots } });
}
