import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, CSRF_HEADER, IDEMPOTENCY_HEADER, RETRY_DELAYS_MS, sendPendingWrites } from './api';
import { actionKey, answer, client } from '../api/client';
import { pendingWrites } from './pending-writes';

function stubFetch(status: number, body: unknown) {
  const fetchMock = vi.fn(
    async () =>
      new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } }),
  );
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

/** A browser with no signal: every request fails as fetch fails then. */
function stubNoSignal() {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => {
      throw new TypeError('Failed to fetch');
    }),
  );
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

describe('writes with idempotency keys', () => {
  const saved = [...RETRY_DELAYS_MS];
  beforeEach(() => {
    RETRY_DELAYS_MS.splice(0, RETRY_DELAYS_MS.length, 0, 0, 0);
    localStorage.clear();
  });
  afterEach(() => {
    RETRY_DELAYS_MS.splice(0, RETRY_DELAYS_MS.length, ...saved);
  });

  const keyOf = (call: unknown) =>
    ((call as [string, RequestInit])[1].headers as Record<string, string>)[IDEMPOTENCY_HEADER];

  it('sends a fresh key per action and the same key on each retry after no answer or a 5xx', async () => {
    const answers: Array<() => Promise<Response>> = [
      async () => {
        throw new TypeError('Failed to fetch');
      },
      async () => new Response('{}', { status: 502 }),
      async () =>
        new Response('{"ok":true}', { status: 201, headers: { 'Content-Type': 'application/json' } }),
      async () =>
        new Response('{"ok":true}', { status: 201, headers: { 'Content-Type': 'application/json' } }),
    ];
    const fetchMock = vi.fn(() => answers.shift()!());
    vi.stubGlobal('fetch', fetchMock);
    expect(await api('/api/lots', { body: { a: 1 } })).toEqual({ ok: true });
    await api('/api/lots', { body: { a: 1 } });
    const keys = fetchMock.mock.calls.map(keyOf);
    expect(keys[0]).toMatch(/^[0-9a-f-]{36}$/);
    expect(keys.slice(0, 3)).toEqual([keys[0], keys[0], keys[0]]);
    expect(keys[3]).not.toBe(keys[0]);
    expect(keyOf(fetchMock.mock.calls[0])).toBeDefined();
    expect(localStorage.getItem('beadroll.pending-writes')).toBeNull();
  });

  it('does not repeat a write the server refused', async () => {
    const fetchMock = stubFetch(409, { error: { code: 'roll_rule', message: 'no' } });
    await expect(
      api('/api/lots/X/listing', { method: 'PUT', body: { listed: true } }),
    ).rejects.toBeInstanceOf(ApiError);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(pendingWrites()).toEqual([]);
  });

  it('keeps an unanswered write across a reload and sends it again with its key', async () => {
    stubNoSignal();
    await expect(
      api('/api/lots/X/observations', { body: { observations: { foil: 'none' } } }),
    ).rejects.toMatchObject({
      code: 'network',
    });
    const [kept] = pendingWrites();
    expect(kept).toMatchObject({ path: '/api/lots/X/observations', method: 'POST' });
    // The next page load:
    const fetchMock = stubFetch(201, { ok: true });
    await sendPendingWrites();
    expect(keyOf(fetchMock.mock.calls[0])).toBe(kept!.key);
    expect(
      JSON.parse((fetchMock.mock.calls[0] as unknown as [string, RequestInit])[1].body as string),
    ).toEqual({
      observations: { foil: 'none' },
    });
    expect(pendingWrites()).toEqual([]);
  });

  it('never keeps a body holding a password', async () => {
    stubNoSignal();
    await expect(
      api('/api/auth/sign-in', { body: { email: 'a@example.invalid', password: 'secret words' } }),
    ).rejects.toBeDefined();
    await expect(api('/api/account/password', { body: { password: 'secret words' } })).rejects.toBeDefined();
    expect(localStorage.getItem('beadroll.pending-writes')).toBeNull();
  });
});

describe('the typed client', () => {
  beforeEach(() => localStorage.clear());

  it('goes through the same transport: request header and idempotency key on writes, none on reads', async () => {
    const fetchMock = stubFetch(200, { listed: ['7K2QM9XAT'] });
    await client.GET('/api/tags/lots/{code}', { params: { path: { code: '7K2QM9XAT' } } });
    const out = await answer(client.POST('/api/tags/list', { body: { lots: ['7K2QM9XAT'] } }));
    expect(out).toEqual({ listed: ['7K2QM9XAT'] });
    const [readPath, read] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    const [writePath, write] = fetchMock.mock.calls[1] as unknown as [string, RequestInit];
    expect(readPath).toBe('/api/tags/lots/7K2QM9XAT');
    expect((read.headers as Record<string, string>)[CSRF_HEADER]).toBeUndefined();
    expect(writePath).toBe('/api/tags/list');
    expect((write.headers as Record<string, string>)[CSRF_HEADER]).toBe('1');
    expect((write.headers as Record<string, string>)[IDEMPOTENCY_HEADER]).toMatch(/^[0-9a-f-]{36}$/);
    expect(JSON.parse(write.body as string)).toEqual({ lots: ['7K2QM9XAT'] });
  });

  it('throws the server refusal as an ApiError with its field messages', async () => {
    stubFetch(400, {
      error: {
        code: 'validation',
        message: 'Some fields need attention',
        fields: [{ field: 'lots', reason: 'must name at least one lot' }],
      },
    });
    const err = await answer(client.POST('/api/tags/list', { body: { lots: [] } })).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).fieldMessage('lots')).toBe('must name at least one lot');
  });

  it('keeps the key a caller gives for every retry of one write', async () => {
    const saved = [...RETRY_DELAYS_MS];
    RETRY_DELAYS_MS.splice(0, RETRY_DELAYS_MS.length, 0, 0, 0);
    try {
      const answers = [
        async () => new Response('{}', { status: 503 }),
        async () =>
          new Response('{"listed":[]}', { status: 200, headers: { 'Content-Type': 'application/json' } }),
      ];
      const fetchMock = vi.fn(() => answers.shift()!());
      vi.stubGlobal('fetch', fetchMock);
      await answer(client.POST('/api/tags/list', { body: { lots: ['A'] }, headers: actionKey('key-1') }));
      const keys = fetchMock.mock.calls.map(
        (c) =>
          ((c as unknown as [string, RequestInit])[1].headers as Record<string, string>)[IDEMPOTENCY_HEADER],
      );
      expect(keys).toEqual(['key-1', 'key-1']);
    } finally {
      RETRY_DELAYS_MS.splice(0, RETRY_DELAYS_MS.length, ...saved);
    }
  });
});
