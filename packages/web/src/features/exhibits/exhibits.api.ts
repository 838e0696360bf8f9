import { EXHIBIT_KINDS, type ExhibitDerivative, type ExhibitFile, type ExhibitKind } from '@beadroll/core';
import { queryOptions } from '@tanstack/react-query';
import { answerWithCore, client } from '../../api/client';
import type { Schemas, WithCore } from '../../api/types';
import { ApiError, CSRF_HEADER, IDEMPOTENCY_HEADER, newIdempotencyKey, withRetries } from '../../lib/api';

/** Screen labels of the exhibit kinds on a roll. */
export const EXHIBIT_KIND_LABELS: Record<ExhibitKind, string> = {
  'whole-lot': 'Whole lot',
  'close-up': 'Close-up',
  hole: 'Hole',
  'uv-a': 'Under UV-A',
  'reference-page': 'Reference page',
  receipt: 'Receipt (always private)',
  other: 'Other',
};
export const EXHIBIT_KIND_OPTIONS: readonly ExhibitKind[] = EXHIBIT_KINDS;

/** The variants a page can ask for. */
export type ExhibitVariant = 'original' | 'web' | 'thumb';

/** One exhibit of a lot as the signed-in viewer may see it (its files as core names them). */
export type ExhibitResponse = WithCore<
  Schemas['ExhibitResponse'],
  { original: ExhibitFile; derivatives: ExhibitDerivative[] }
>;

export type ExhibitListResponse = WithCore<Schemas['ExhibitListResponse'], { exhibits: ExhibitResponse[] }>;

export type UploadResult = WithCore<Schemas['AddExhibitResponse'], { exhibit: ExhibitResponse }>;

export const exhibitKeys = {
  list: (code: string) => ['lots', 'detail', code, 'exhibits'] as const,
};

/** The exhibits of one lot. */
export function exhibitsQuery(code: string) {
  return queryOptions({
    queryKey: exhibitKeys.list(code),
    queryFn: ({ signal }) =>
      answerWithCore<ExhibitListResponse>(
        client.GET('/api/lots/{code}/exhibits', { params: { path: { code } }, signal }),
      ),
  });
}

export interface UploadMeta {
  kind: ExhibitKind;
  caption: string;
  sealed: boolean;
}

/**
 * Sends one file as one exhibit. XMLHttpRequest rather than fetch, because only it reports
 * upload progress; `onProgress` gets the fraction sent (0–1).
 */
export function uploadExhibit(
  code: string,
  file: File,
  meta: UploadMeta,
  onProgress: (fraction: number) => void,
  signal?: AbortSignal,
): Promise<UploadResult> {
  // One key for the upload: a retry after no answer or a 5xx adds the exhibit once at most.
  const key = newIdempotencyKey();
  return withRetries(() => sendExhibit(code, file, meta, onProgress, key, signal), signal);
}

function sendExhibit(
  code: string,
  file: File,
  meta: UploadMeta,
  onProgress: (fraction: number) => void,
  key: string,
  signal?: AbortSignal,
): Promise<UploadResult> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/lots/${encodeURIComponent(code)}/exhibits`);
    xhr.setRequestHeader(CSRF_HEADER, '1');
    xhr.setRequestHeader(IDEMPOTENCY_HEADER, key);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.withCredentials = true;
    xhr.responseType = 'text';
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve(body as UploadResult);
        return;
      }
      const err = (body as { error?: { code?: string; message?: string; fields?: ApiError['fields'] } })
        ?.error;
      reject(
        new ApiError(
          xhr.status,
          err?.code ?? 'http_error',
          err?.message ?? `The server answered ${xhr.status}. Please try again.`,
          err?.fields ?? [],
        ),
      );
    };
    xhr.onerror = () =>
      reject(
        new ApiError(0, 'network', 'Beadroll could not be reached. Check the connection and try again.'),
      );
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    form.append('kind', meta.kind);
    if (meta.caption) form.append('caption', meta.caption);
    form.append('sealed', meta.sealed || meta.kind === 'receipt' ? 'true' : 'false');
    form.append('file', file);
    xhr.send(form);
  });
}
