import { queryOptions } from '@tanstack/react-query';
import type { Bundle } from '@beadroll/core';
import type { Schemas } from '../../api/types';
import { ApiError } from '../../lib/api';
import { browserMemory, checkLog, type LogCheckDeps, type LogCheckResult } from './log-check';

async function text(path: string, signal?: AbortSignal): Promise<string> {
  const res = await fetch(path, { signal, credentials: 'same-origin' });
  if (!res.ok) throw new ApiError(res.status, 'http_error', `The server answered ${res.status}.`);
  return res.text();
}

/** The log's verifier key written into the page by the server (empty in development). */
export function builtInLogKey(): string {
  return document.querySelector('meta[name="beadroll-log-key"]')?.getAttribute('content')?.trim() ?? '';
}

/** The browser's way to the log: the page's own key, the API, local storage. */
export function browserLogDeps(signal?: AbortSignal): LogCheckDeps {
  return {
    builtInKey: builtInLogKey(),
    fetchKey: () => text('/api/log/key', signal),
    fetchWitnessKeys: () => text('/api/log/witnesses', signal),
    fetchConsistency: async (from, to) =>
      (
        JSON.parse(
          await text(`/api/log/proof/consistency?from=${from}&to=${to}`, signal),
        ) as Schemas['ConsistencyProofResponse']
      ).proof,
    ...browserMemory,
  };
}

/** The log check of one lot's bundle, run in this browser. */
export const logCheckQuery = (code: string, bundle: Bundle, deps?: LogCheckDeps) =>
  queryOptions({
    queryKey: ['log', 'check', code, bundle.checkpoints],
    queryFn: ({ signal }): Promise<LogCheckResult> => checkLog(code, bundle, deps ?? browserLogDeps(signal)),
    staleTime: Infinity,
  });
