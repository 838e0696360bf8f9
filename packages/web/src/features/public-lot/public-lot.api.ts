import { queryOptions } from '@tanstack/react-query';
import type { Bundle } from '@beadroll/core';
// Types only from the generated API: the public page carries no API client beyond lib/api.
import type { Schemas, WithCore } from '../../api/types';
import { ApiError, toApiError } from '../../lib/api';
import { publicLotPath } from './route';

/** A dealer's card as the registry reports it (not part of the verified roll). */
export type DealerCard = Schemas['DealerCard'];

/** The public data of a listed lot: its bundle (roll first, then ancestors) and the cards of its actors. */
export type PublicLotResponse = WithCore<Schemas['PublicLotResponse'], { bundle: Bundle }>;

/**
 * The copy of a lot's data this browser kept when it last opened the page, given by the page's
 * service worker when there is no signal. `at` is when the server sent that copy (its `Date`),
 * which is when the page then checked it.
 */
export interface SavedCopy {
  at: Date | null;
}

/** Response header the page's service worker adds to an answer from its saved copy. */
export const SAVED_COPY_HEADER = 'Beadroll-Saved-Copy';

/**
 * What the page gets back: the data (marked when it is the saved copy), or "not a listed lot"
 * (the server says nothing more).
 */
export type PublicLotResult =
  { found: true; data: PublicLotResponse; savedCopy?: SavedCopy } | { found: false };

export { publicLotPath };
export const publicBundlePath = (code: string) => `${publicLotPath(code)}/bundle`;
export const exhibitPath = (code: string, seq: number, variant: ExhibitVariant) =>
  `${publicLotPath(code)}/exhibits/${seq}/${variant}`;

/** Where an exhibit recorded on an ancestor of the lot `code` is fetched. */
export interface ExhibitSource {
  /** The ancestor lot the exhibit is recorded on. */
  lot: string;
  /** true: the ancestor is listed and serves its own exhibits. */
  listed: boolean;
}

/** The address of an exhibit file: on the lot itself, or on an ancestor as the lot's public data carries it. */
export const exhibitFilePath = (code: string, seq: number, variant: ExhibitVariant, from?: ExhibitSource) =>
  !from || from.lot === code
    ? exhibitPath(code, seq, variant)
    : from.listed
      ? exhibitPath(from.lot, seq, variant)
      : `${publicLotPath(code)}/inherited/${encodeURIComponent(from.lot)}/exhibits/${seq}/${variant}`;

/** The file variants the server keeps of an exhibit. */
export type ExhibitVariant = 'original' | 'web' | 'thumb';

/**
 * The lot's public data. Only the code goes to the server: a tag reference from the page's
 * address is checked in the browser and never sent.
 */
export const publicLotQuery = (code: string) =>
  queryOptions({
    queryKey: ['public-lots', 'detail', code],
    queryFn: async ({ signal }): Promise<PublicLotResult> => {
      // Fetched as the server's preload link names it (CORS mode, this site's cookies only), so
      // the browser hands over the preloaded answer.
      let res: Response;
      try {
        res = await fetch(publicLotPath(code), {
          headers: { Accept: 'application/json' },
          credentials: 'same-origin',
          signal,
        });
      } catch (cause) {
        if ((cause as Error).name === 'AbortError') throw cause;
        throw new ApiError(
          0,
          'network',
          'Beadroll could not be reached. Check the connection and try again.',
        );
      }
      if (res.status === 404) return { found: false };
      if (!res.ok) throw await toApiError(res);
      const data = (await res.json()) as PublicLotResponse;
      if (res.headers.get(SAVED_COPY_HEADER) !== 'true') return { found: true, data };
      const sent = Date.parse(res.headers.get('Date') ?? '');
      return { found: true, data, savedCopy: { at: Number.isNaN(sent) ? null : new Date(sent) } };
    },
    staleTime: 60_000,
  });

/** The bytes of one exhibit file, for the page to check against its recorded SHA-256. */
export const exhibitBytesQuery = (code: string, seq: number, variant: ExhibitVariant, from?: ExhibitSource) =>
  queryOptions({
    queryKey: ['public-lots', 'exhibit', code, seq, variant, from?.lot ?? code],
    queryFn: async ({ signal }): Promise<Uint8Array | null> => {
      const res = await fetch(exhibitFilePath(code, seq, variant, from), {
        signal,
        credentials: 'same-origin',
      });
      if (res.status === 404) return null;
      if (!res.ok) throw new ApiError(res.status, 'http_error', `The server answered ${res.status}.`);
      return new Uint8Array(await res.arrayBuffer());
    },
    staleTime: Infinity,
  });
