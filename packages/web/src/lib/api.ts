import { forgetPending, keepPending, mayKeep, pendingWrites } from './pending-writes';

/** One field-level problem from the server's 400 body. */
export interface FieldProblem {
  field: string;
  reason: string;
}

/** An error answered by the API, carrying the stable body `{ error: { code, message, fields? } }`. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldProblem[] = [],
    readonly requestId?: string,
  ) {
    super(message);
  }

  /** The reasons for one field (joined), for a Fluent Field's validationMessage. */
  fieldMessage(field: string): string | undefined {
    const reasons = this.fields
      .filter((f) => f.field === field || f.field.startsWith(`${field}.`))
      .map((f) => f.reason);
    return reasons.length ? reasons.join('; ') : undefined;
  }
}

/** Header that every non-GET request carries; the server refuses state changes without it. */
export const CSRF_HEADER = 'X-Beadroll-Request';

/** Header naming one user action: its retries carry the same key, so the server writes it once. */
export const IDEMPOTENCY_HEADER = 'Idempotency-Key';

/** Pauses before each retry of a write that got no answer or a 5xx (milliseconds). */
export const RETRY_DELAYS_MS = [400, 1200, 3000];

/** A fresh idempotency key for one user action. */
export function newIdempotencyKey(): string {
  return crypto.randomUUID();
}

/** Whether a failed write may be sent again with its key: no answer, or the server's own failure. */
export function isRetryable(err: unknown): boolean {
  return err instanceof ApiError && (err.status === 0 || err.status >= 500);
}

const sleep = (ms: number, signal?: AbortSignal) =>
  new Promise<void>((resolve, reject) => {
    const timer = setTimeout(resolve, ms);
    signal?.addEventListener(
      'abort',
      () => {
        clearTimeout(timer);
        reject(new DOMException('Aborted', 'AbortError'));
      },
      { once: true },
    );
  });

/**
 * Runs `attempt` and repeats it after each pause of {@link RETRY_DELAYS_MS} while it fails with no
 * answer or a 5xx. The caller keeps the same idempotency key across attempts.
 */
export async function withRetries<T>(attempt: () => Promise<T>, signal?: AbortSignal): Promise<T> {
  for (let i = 0; ; i++) {
    try {
      return await attempt();
    } catch (err) {
      if (!isRetryable(err) || i >= RETRY_DELAYS_MS.length) throw err;
      await sleep(RETRY_DELAYS_MS[i]!, signal);
    }
  }
}

type Json = Record<string, unknown> | unknown[];

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: Json | FormData;
  signal?: AbortSignal;
  /** The write's idempotency key; a fresh one per call when omitted. */
  idempotencyKey?: string;
}

/** Turns any failed response into an ApiError with a message a person can read. */
export async function toApiError(res: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await res.json();
  } catch {
    body = undefined;
  }
  const err = (
    body as { error?: { code?: string; message?: string; fields?: FieldProblem[]; requestId?: string } }
  )?.error;
  if (err?.code)
    return new ApiError(
      res.status,
      err.code,
      err.message ?? 'The request failed.',
      err.fields ?? [],
      err.requestId,
    );
  if (res.status === 404) return new ApiError(404, 'not_found', 'Not found.');
  return new ApiError(res.status, 'http_error', `The server answered ${res.status}. Please try again.`);
}

let refreshing: Promise<boolean> | undefined;

/** Renews the session cookies once (shared by concurrent callers); false when the sign-in has ended. */
function refreshSession(): Promise<boolean> {
  refreshing ??= fetch('/api/auth/session/refresh', {
    method: 'POST',
    headers: { Accept: 'application/json', [CSRF_HEADER]: '1' },
    credentials: 'same-origin',
  })
    .then((r) => r.ok)
    .catch(() => false)
    .finally(() => {
      refreshing = undefined;
    });
  return refreshing;
}

/**
 * The transport under every API call: JSON in and out, cookies included, errors as ApiError. A
 * lapsed access cookie is renewed once through the refresh route and the request repeated. A
 * write carries one idempotency key for all its attempts, is repeated after no answer or a 5xx,
 * and is kept across a reload until it is answered. Resolves with the answered (2xx) response.
 */
export async function deliver(path: string, opts: RequestOptions = {}): Promise<Response> {
  const method = opts.method ?? (opts.body ? 'POST' : 'GET');
  if (method === 'GET') return once(path, opts);
  // One user action: one key for every attempt, kept across a reload until it is answered.
  const key = opts.idempotencyKey ?? newIdempotencyKey();
  const keep = mayKeep(path) && !(opts.body instanceof FormData);
  if (keep) keepPending({ key, path, method, body: opts.body, at: Date.now() });
  try {
    const out = await withRetries(() => once(path, { ...opts, method, idempotencyKey: key }), opts.signal);
    if (keep) forgetPending(key);
    return out;
  } catch (err) {
    // Answered, even with a refusal: nothing left to send again. Unanswered: kept for a reload.
    if (keep && !isRetryable(err)) forgetPending(key);
    throw err;
  }
}

/** A call through {@link deliver} whose answer is read as JSON (or text, or nothing for a 204). */
export async function api<T>(path: string, opts: RequestOptions = {}): Promise<T> {
  return readAnswer<T>(await deliver(path, opts));
}

/** An answered response's body: JSON, or text, or nothing for a 204. */
async function readAnswer<T>(res: Response): Promise<T> {
  if (res.status === 204) return undefined as T;
  const type = res.headers.get('content-type') ?? '';
  return (type.includes('application/json') ? await res.json() : await res.text()) as T;
}

/**
 * {@link deliver} for a request built by the typed client (`src/api/client.ts`): the same
 * headers, retries, kept writes and errors. An idempotency key the caller put in the request's
 * headers is used for all attempts.
 */
export async function transport(request: Request): Promise<Response> {
  const url = new URL(request.url);
  const method = request.method as NonNullable<RequestOptions['method']>;
  let body: Json | FormData | undefined;
  if (method !== 'GET') {
    const type = request.headers.get('content-type') ?? '';
    if (type.includes('multipart/form-data')) body = await request.formData();
    else {
      const text = await request.text();
      body = text ? (JSON.parse(text) as Json) : undefined;
    }
  }
  return deliver(url.pathname + url.search, {
    method,
    body,
    signal: request.signal,
    idempotencyKey: request.headers.get(IDEMPOTENCY_HEADER) ?? undefined,
  });
}

/**
 * Sends again, each with its own key, the writes an earlier page sent but never saw answered;
 * the server does each once at most. Called once when the app starts.
 */
export async function sendPendingWrites(): Promise<void> {
  for (const w of pendingWrites()) {
    try {
      await once(w.path, {
        method: w.method as RequestOptions['method'],
        body: w.body as Json | undefined,
        idempotencyKey: w.key,
      });
      forgetPending(w.key);
    } catch (err) {
      if (!isRetryable(err)) forgetPending(w.key);
    }
  }
}

/** One attempt with the caller's idempotency key, renewing a lapsed session once (for queued writes). */
export async function sendOnce<T>(path: string, opts: RequestOptions): Promise<T> {
  return readAnswer<T>(await once(path, opts));
}

/** One attempt, renewing a lapsed session once. */
async function once(path: string, opts: RequestOptions): Promise<Response> {
  try {
    return await request(path, opts);
  } catch (err) {
    const renewable =
      err instanceof ApiError &&
      err.status === 401 &&
      err.code === 'unauthenticated' &&
      !path.startsWith('/api/auth/');
    if (renewable && (await refreshSession())) return request(path, opts);
    throw err;
  }
}

const answerListeners = new Set<() => void>();

/**
 * Calls `listener` whenever the server answers a request, whatever the answer: the signal is
 * there. Returns the unsubscribe.
 */
export function onServerAnswer(listener: () => void): () => void {
  answerListeners.add(listener);
  return () => answerListeners.delete(listener);
}

async function request(path: string, opts: RequestOptions): Promise<Response> {
  const method = opts.method ?? (opts.body ? 'POST' : 'GET');
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers[CSRF_HEADER] = '1';
  if (method !== 'GET' && opts.idempotencyKey) headers[IDEMPOTENCY_HEADER] = opts.idempotencyKey;
  let body: BodyInit | undefined;
  if (opts.body instanceof FormData) body = opts.body;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  let res: Response;
  try {
    res = await fetch(path, { method, headers, body, credentials: 'same-origin', signal: opts.signal });
  } catch (cause) {
    if ((cause as Error).name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'Beadroll could not be reached. Check the connection and try again.');
  }
  for (const l of answerListeners) l();
  if (!res.ok) throw await toApiError(res);
  return res;
}
