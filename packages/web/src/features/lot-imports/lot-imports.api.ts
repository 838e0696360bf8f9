import type { Schemas } from '../../api/types';
import { ApiError, CSRF_HEADER, toApiError } from '../../lib/api';

/** One column a lot may take from the sheet. */
export type ImportField = Schemas['ImportFieldResponse'];

/** A read sheet: its header row, the first rows, and the mapping its headers suggest. */
export type SheetInfo = Schemas['SheetResponse'];

/** The dry run's answer: rows with problems (sheet row numbers; the header is row 1). */
export type CheckResult = Schemas['CheckResponse'];

/** Field key → column index; null = not in the file. */
export type Mapping = Record<string, number | null>;

function form(file: File, mapping?: Mapping): FormData {
  const f = new FormData();
  if (mapping) f.append('mapping', JSON.stringify(mapping));
  f.append('file', file);
  return f;
}

async function post<T>(path: string, body: FormData): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method: 'POST',
      headers: { Accept: 'application/json', [CSRF_HEADER]: '1' },
      body,
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'network', 'Beadroll could not be reached. Check the connection and try again.');
  }
  if (!res.ok) throw await toApiError(res);
  return (await res.json()) as T;
}

export const lotImportsApi = {
  templateUrl: (format: 'csv' | 'xlsx') => `/api/lot-imports/template?format=${format}`,
  sheet: (file: File) => post<SheetInfo>('/api/lot-imports/sheets', form(file)),
  check: (file: File, mapping: Mapping) => post<CheckResult>('/api/lot-imports/checks', form(file, mapping)),
  /**
   * Runs the import (all or none). The server answers line by line; `onProgress` hears each
   * count written. Resolves with the new lots' codes.
   */
  async run(
    file: File,
    mapping: Mapping,
    onProgress: (done: number, total: number) => void,
  ): Promise<string[]> {
    const res = await fetch('/api/lot-imports', {
      method: 'POST',
      headers: { Accept: 'application/x-ndjson', [CSRF_HEADER]: '1' },
      body: form(file, mapping),
      credentials: 'same-origin',
    });
    if (!res.ok || !res.body) throw await toApiError(res);
    const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
    let buffered = '';
    let total = 0;
    for (;;) {
      const { value, done } = await reader.read();
      if (value) buffered += value;
      const lines = buffered.split('\n');
      buffered = lines.pop() ?? '';
      for (const l of lines.filter(Boolean)) {
        const msg = JSON.parse(l) as Schemas['ImportLineResponse'];
        if (msg.total !== undefined && msg.done === undefined) {
          total = msg.total;
          onProgress(0, total);
        }
        if (msg.done !== undefined) onProgress(msg.done, msg.total ?? total);
        if (msg.codes) return msg.codes;
        if (msg.error) throw new ApiError(500, msg.error.code, msg.error.message);
      }
      if (done)
        throw new ApiError(0, 'network', 'The import stopped before it finished; nothing was imported.');
    }
  },
};
