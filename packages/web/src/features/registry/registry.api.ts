import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';
import { api, ApiError, toApiError } from '../../lib/api';

export type RedactionReason = 'personal-data' | 'unlawful-content' | 'abuse' | 'holder-request';
export const REDACTION_REASON_LABEL: Record<RedactionReason, string> = {
  'personal-data': 'Personal data',
  'unlawful-content': 'Unlawful content',
  abuse: 'Abuse',
  'holder-request': 'At the holder’s request',
};

export type ReportCategory = 'wrong-attribution' | 'counterfeit' | 'personal-data' | 'other';
export const REPORT_CATEGORY_LABEL: Record<ReportCategory, string> = {
  'wrong-attribution': 'Wrong attribution claim',
  counterfeit: 'Suspected counterfeit or imitation',
  'personal-data': 'Personal data on the page',
  other: 'Something else',
};
/** The longest report the server takes. */
export const REPORT_TEXT_MAX = 2000;

export type Report = Schemas['ReportResponse'];
export type RegistrarAction = Schemas['RegistrarActionResponse'];
export type RedactionRequest = Schemas['RedactionRequestResponse'];
export type Redaction = Schemas['RedactionResponse'];

/** One line of the full-ledger audit stream. */
export type AuditEvent =
  | Schemas['AuditStartEvent']
  | Schemas['AuditProgressEvent']
  | Schemas['AuditBrokenEvent']
  | Schemas['AuditDoneEvent'];

export const reportsQuery = (p: { status: 'open' | 'closed'; page: number; pageSize: number }) =>
  queryOptions({
    queryKey: ['registry', 'reports', p],
    queryFn: ({ signal }) => answer(client.GET('/api/registry/reports', { params: { query: p }, signal })),
    placeholderData: keepPreviousData,
  });

export const actionsQuery = (p: { page: number; pageSize: number }) =>
  queryOptions({
    queryKey: ['registry', 'actions', p],
    queryFn: ({ signal }) => answer(client.GET('/api/registry/actions', { params: { query: p }, signal })),
    placeholderData: keepPreviousData,
  });

export const redactionRequestsQuery = () =>
  queryOptions({
    queryKey: ['registry', 'redaction-requests', 'open'],
    queryFn: ({ signal }) =>
      answer(
        client.GET('/api/registry/redaction-requests', { params: { query: { status: 'open' } }, signal }),
      ),
  });

const byId = (id: string) => ({ params: { path: { id } } });

/**
 * Files a report from the public page. Through `lib/api` rather than the typed client: the public
 * page's bundle stays without the client (the answer's type is still the generated one).
 */
export function fileReport(
  code: string,
  body: { category: string; text: string; email?: string },
): Promise<Schemas['FiledReportResponse']> {
  return api(`/api/public/lots/${encodeURIComponent(code)}/reports`, { body });
}

export const registryToolsApi = {
  fileReport,
  closeReport: (id: string, resolution: string) =>
    answer(client.POST('/api/registry/reports/{id}/close', { ...byId(id), body: { resolution } })),
  redact: (body: { lot: string; seq: number; reason: RedactionReason; note?: string }) =>
    answer(client.POST('/api/registry/redactions', { body })),
  approveRequest: (id: string) =>
    answer(client.POST('/api/registry/redaction-requests/{id}/approve', { ...byId(id), body: {} })),
  declineRequest: (id: string, reason: string) =>
    answer(client.POST('/api/registry/redaction-requests/{id}/decline', { ...byId(id), body: { reason } })),
  requestRemoval: (code: string, body: { seq: number; note: string }) =>
    answer(client.POST('/api/lots/{code}/redaction-requests', { params: { path: { code } }, body })),
  closeAccount: (password: string) => answer(client.POST('/api/account/close', { body: { password } })),
};

/** Runs the full-ledger audit, calling `onEvent` for each line of the stream as it arrives. */
export async function runAudit(onEvent: (e: AuditEvent) => void, signal?: AbortSignal): Promise<void> {
  let res: Response;
  try {
    res = await fetch('/api/audit/ledger', { credentials: 'same-origin', signal });
  } catch (cause) {
    if ((cause as Error).name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'Beadroll could not be reached. Check the connection and try again.');
  }
  if (!res.ok || !res.body) throw await toApiError(res);
  const reader = res.body.getReader();
  const decoder = new TextDecoder();
  let buffered = '';
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffered += decoder.decode(value, { stream: true });
    let nl: number;
    while ((nl = buffered.indexOf('\n')) >= 0) {
      const line = buffered.slice(0, nl).trim();
      buffered = buffered.slice(nl + 1);
      if (line) onEvent(JSON.parse(line) as AuditEvent);
    }
    if (done) break;
  }
  if (buffered.trim()) onEvent(JSON.parse(buffered) as AuditEvent);
}
