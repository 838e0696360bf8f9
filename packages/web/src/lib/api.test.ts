import { afterEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, CSRF_HEADER } from './api';

afterEach(() => vi.unstubAllGlobals());

function stubFetch(status: number, body: unknown) {
  const fetchMock = vi.fn(
    async () =>
      new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } }),
  );
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

describe('api client', () => {
  it('turns the stable error body into an ApiError with field messages', async () => {
    stubFetch(400, {
      error: {
        code: 'validation',
        message: 'Some fields need attention',
        fields: [{ field: 'title', reason: 'title must not be empty' }],
      },
    });
    const err = await api('/api/lots', { body: { title: '' } }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).status).toBe(400);
    expect((err as ApiError).fieldMessage('title')).toBe('title must not be empty');
    expect((err as ApiError).fieldMessage('count')).toBeUndefined();
  });

  it('sends the request header on writes and not on reads', async () => {
    const fetchMock = stubFetch(200, { ok: true });
    await api('/api/x');
    await api('/api/x', { body: { a: 1 } });
    const headersOf = (i: number) =>
      (fetchMock.mock.calls[i] as unknown as [string, RequestInit])[1].headers as Record<string, string>;
    expect(headersOf(0)[CSRF_HEADER]).toBeUndefined();
    expect(headersOf(1)[CSRF_HEADER]).toBe('1');
  });
});
