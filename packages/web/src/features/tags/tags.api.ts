import { queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';
import { CSRF_HEADER, toApiError } from '../../lib/api';

export type TagDesign = Schemas['DesignFitResponse']['design'];
export type Paper = keyof Schemas['PaperSizes'];

/** How each design fares with the service's public host (from the server's layout check). */
export type TagLayouts = Schemas['TagLayoutsResponse'];

export type SheetRequest = Schemas['SheetDto'];
export type TagPrintRequest = Schemas['PrintTagsDto'];

/** A row of the dealer's own lots, as the lot list answers. */
export type HeldLotRow = Pick<
  Schemas['LotSummaryResponse'],
  'code' | 'displayCode' | 'title' | 'listed' | 'status'
>;

export const tagsQueries = {
  all: () => ['tags'] as const,
  layouts: () =>
    queryOptions({
      queryKey: ['tags', 'layouts'],
      queryFn: ({ signal }) => answer(client.GET('/api/tags/layouts', { signal })),
    }),
  heldLots: () =>
    queryOptions({
      queryKey: ['lots', 'list', { mine: true, pageSize: 100 }],
      queryFn: () =>
        answer(
          client.GET('/api/lots', {
            params: { query: { mine: true, pageSize: 100, sort: 'updated', order: 'desc' } },
          }),
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
export function listLots(lots: string[]): Promise<Schemas['TagListResponse']> {
  return answer(client.POST('/api/tags/list', { body: { lots } }));
}
