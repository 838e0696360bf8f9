import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { ApiError, api, toApiError } from '../../lib/api';

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

export interface Report {
  id: string;
  lot: string;
  category: ReportCategory;
  text: string;
  answerWanted: boolean;
  reporterEmail: string | null;
  status: 'open' | 'closed';
  resolution: string | null;
  closedAt: string | null;
  createdAt: string;
}

export interface Paged<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface RegistrarAction {
  id: string;
  at: string;
  actor: string;
  action: string;
  subject: string;
  reason: string | null;
  details: Record<string, unknown>;
}

export interface RedactionRequest {
  id: string;
  lot: string;
  seq: number;
  kind: string;
  requester: string;
  note: string;
  status: 'open' | 'approved' | 'declined';
  createdAt: string;
}

export interface Redaction {
  lot: string;
  seq: number;
  redactionSeq: number;
  reason: RedactionReason;
  time: string;
  blockedDigests: string[];
}

/** One line of the full-ledger audit stream. */
export type AuditEvent =
  | { type: 'start'; lots: number; startedAt: string }
  | { type: 'progress'; lotsChecked: number; lots: number; entriesChecked: number }
  | { type: 'broken'; lot: string; seq: number; reason: string; message: string }
  | {
      type: 'done';
      lotsChecked: number;
      entriesChecked: number;
      broken: number;
      ok: boolean;
      finishedAt: string;
    };

export const reportsQuery = (p: { status: 'open' | 'closed'; page: number; pageSize: number }) =>
  queryOptions({
    queryKey: ['registry', 'reports', p],
    queryFn: ({ signal }) =>
      api<Paged<Report>>(`/api/registry/reports?status=${p.status}&page=${p.page}&pageSize=${p.pageSize}`, {
        signal,
      }),
    placeholderData: keepPreviousData,
  });

export const actionsQuery = (p: { page: number; pageSize: number }) =>
  queryOptions({
    queryKey: ['registry', 'actions', p],
    queryFn: ({ signal }) =>
      api<Paged<RegistrarAction>>(`/api/registry/actions?page=${p.page}&pageSize=${p.pageSize}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const redactionRequestsQuery = () =>
  queryOptions({
    queryKey: ['registry', 'redaction-requests', 'open'],
    queryFn: ({ signal }) =>
      api<RedactionRequest[]>('/api/registry/redaction-requests?status=open', { signal }),
  });

export const registryToolsApi = {
  fileReport: (code: string, body: { category: string; text: string; email?: string }) =>
    api<{ id: string; message: string }>(`/api/public/lots/${encodeURIComponent(code)}/reports`, { body }),
  closeReport: (id: string, resolution: string) =>
    api<Report>(`/api/registry/reports/${id}/close`, { body: { resolution } }),
  redact: (body: { lot: string; seq: number; reason: RedactionReason; note?: string }) =>
    api<Redaction>('/api/registry/redactions', { body }),
  approveRequest: (id: string) =>
    api<Redaction>(`/api/registry/redaction-requests/${id}/approve`, { body: {} }),
  declineRequest: (id: string, reason: string) =>
    api<RedactionRequest>(`/api/registry/redaction-requests/${id}/decline`, { body: { reason } }),
  requestRemoval: (code: string, body: { seq: number; note: string }) =>
    api<RedactionRequest>(`/api/lots/${encodeURIComponent(code)}/redaction-requests`, { body }),
  closeAccount: (password: string) => api<{ message: string }>('/api/account/close', { body: { password } }),
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
