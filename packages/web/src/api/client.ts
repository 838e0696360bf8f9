import createClient from 'openapi-fetch';
import { transport } from '../lib/api';
import type { paths } from './schema';

/**
 * The typed API client: paths, parameters, bodies and answers checked against the server's
 * OpenAPI document. Every call goes through the app's one transport (`lib/api.ts`), so a failure
 * is thrown as an ApiError and a call that returns has its answer.
 */
export const client = /* @__PURE__ */ createClient<paths>({
  // A full address, so the request can be built outside a page too; the transport sends the path.
  baseUrl: typeof location === 'undefined' ? 'http://localhost' : location.origin,
  fetch: transport,
});

/** The answer of a typed call (the transport has thrown for every failure). */
export async function answer<T>(call: Promise<{ data?: T }>): Promise<T> {
  return (await call).data as T;
}

/** Headers naming one user action, for a write whose retries must carry the same key. */
export function actionKey(key: string | undefined): Record<string, string> {
  return key ? { 'Idempotency-Key': key } : {};
}

/**
 * The answer of a typed call, as a `WithCore` type (api/types.ts): where the document says only "an
 * object", the caller names core's type for it.
 */
export async function answerWithCore<T>(call: Promise<{ data?: unknown }>): Promise<T> {
  return (await call).data as T;
}
