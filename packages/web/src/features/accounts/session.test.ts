import { afterEach, describe, expect, it, vi } from 'vitest';
import { outboxSnapshot } from '../../lib/outbox';
import { rememberSession, sessionQuery, type Me } from './accounts.api';

const odile = {
  id: 'acct-odile',
  role: 'dealer',
  status: 'verified',
  handle: 'odile',
  displayName: 'Odile of Vennmark',
  email: 'odile@vennmark.example',
} as Me;

const json = (body: unknown, status = 200) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

/** The session query's answer; its retries' pauses pass at once. A failure is thrown after them. */
async function askSession() {
  const q = sessionQuery();
  const run = (q.queryFn as () => Promise<unknown>)().then(
    (value) => ({ value }),
    (error: unknown) => ({ error }),
  );
  await vi.runAllTimersAsync();
  const r = await run;
  if ('error' in r) throw r.error;
  return r.value;
}

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  localStorage.clear();
});

describe('the session with no signal', () => {
  it('answers with the account last signed in here, marked offline, and forgets it on sign-out', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout'] });
    vi.stubGlobal('fetch', async () => json({ account: odile }));
    expect(await askSession()).toEqual(odile);

    vi.stubGlobal('fetch', async () => {
      throw new TypeError('no signal');
    });
    expect(await askSession()).toEqual({ ...odile, email: '', statusReason: null, offline: true });
    // The browser keeps what the header needs, not the dealer's e-mail address.
    expect(localStorage.getItem('beadroll.session')).not.toContain(odile.email);

    // Signing out forgets the account: with no signal there is then nobody to show.
    rememberSession(null);
    await expect(askSession()).rejects.toMatchObject({ status: 0 });
  });

  it('a server that says nobody is signed in forgets the remembered account', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout'] });
    rememberSession(odile);
    vi.stubGlobal('fetch', async (url: RequestInfo | URL) =>
      String(url).includes('refresh')
        ? json({ error: { code: 'unauthorized', message: 'Sign in again.' } }, 401)
        : json({ account: null }),
    );
    expect(await askSession()).toBeNull();
    expect(outboxSnapshot().mine).toEqual([]);
    vi.stubGlobal('fetch', async () => {
      throw new TypeError('no signal');
    });
    await expect(askSession()).rejects.toMatchObject({ status: 0 });
  });
});
