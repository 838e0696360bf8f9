import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { IDEMPOTENCY_HEADER, api } from './api';
import {
  SAFE_RESEND_MS,
  TOO_OLD_TO_RESEND,
  dismissQueuedWrite,
  flushOutbox,
  outboxSnapshot,
  readOutbox,
  sendOrQueue,
  setOutboxAccount,
  startOutbox,
} from './outbox';

const json = (body: unknown, status = 200) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

let online = true;
let fetchMock: ReturnType<typeof vi.fn>;

beforeEach(async () => {
  online = true;
  vi.spyOn(navigator, 'onLine', 'get').mockImplementation(() => online);
  setOutboxAccount('acct-odile');
  for (const w of await readOutbox()) await dismissQueuedWrite(w.key);
});
afterEach(() => {
  vi.restoreAllMocks();
  vi.unstubAllGlobals();
});

function serve(handler: (init: RequestInit) => Response | Promise<Response>) {
  fetchMock = vi.fn(async (_url: RequestInfo | URL, init?: RequestInit) => handler(init ?? {}));
  vi.stubGlobal('fetch', fetchMock);
}
const keyOf = (init: RequestInit) => (init.headers as Record<string, string>)[IDEMPOTENCY_HEADER];
const sale = (lot: string) => ({
  path: '/api/transfers/sales',
  method: 'POST' as const,
  body: { lot, date: '2026-12-05', price: { amount: 4500, currency: 'EUR' } },
  label: `sale of ${lot}`,
});

describe('writes kept with no signal', () => {
  it('sends at once with a signal, and keeps nothing', async () => {
    serve(() => json({ id: 's1' }, 201));
    const r = await sendOrQueue(sale('7K2QM9XAT'));
    expect(r).toEqual({ sent: true, answer: { id: 's1' } });
    expect(await readOutbox()).toEqual([]);
  });

  it('keeps writes made with no signal and sends them in order, each once, under its own key', async () => {
    online = false;
    serve(() => {
      throw new TypeError('offline');
    });
    const a = await sendOrQueue(sale('AAAAAAAAA'));
    const b = await sendOrQueue(sale('BBBBBBBBB'));
    expect(a.sent || b.sent).toBe(false);
    expect(fetchMock).not.toHaveBeenCalled();
    expect((await readOutbox()).map((w) => w.label)).toEqual(['sale of AAAAAAAAA', 'sale of BBBBBBBBB']);

    online = true;
    const seen: { lot: string; key: string }[] = [];
    serve((init) => {
      seen.push({ lot: (JSON.parse(String(init.body)) as { lot: string }).lot, key: keyOf(init)! });
      return json({ ok: true }, 201);
    });
    await flushOutbox();
    expect(seen.map((s) => s.lot)).toEqual(['AAAAAAAAA', 'BBBBBBBBB']);
    expect(seen.map((s) => s.key)).toEqual([!a.sent && a.queued.key, !b.sent && b.queued.key]);
    expect(await readOutbox()).toEqual([]);
  });

  it('keeps a write whose answer never came, and sends it again under the same key', async () => {
    const keys: string[] = [];
    serve((init) => {
      keys.push(keyOf(init)!);
      throw new TypeError('connection reset');
    });
    vi.useFakeTimers({ toFake: ['setTimeout'] });
    const pending = sendOrQueue(sale('CCCCCCCCC'));
    await vi.runAllTimersAsync();
    const r = await pending;
    vi.useRealTimers();
    expect(r.sent).toBe(false);
    expect(new Set(keys).size).toBe(1);
    serve((init) => {
      keys.push(keyOf(init)!);
      return json({ ok: true }, 201);
    });
    await flushOutbox();
    expect(new Set(keys).size).toBe(1);
    expect(await readOutbox()).toEqual([]);
  });

  it('keeps a refused write with the server’s reason and sends the next one', async () => {
    online = false;
    await sendOrQueue(sale('DDDDDDDDD'));
    await sendOrQueue(sale('EEEEEEEEE'));
    online = true;
    serve((init) =>
      (JSON.parse(String(init.body)) as { lot: string }).lot === 'DDDDDDDDD'
        ? json({ error: { code: 'conflict', message: 'This lot is offered to another dealer.' } }, 409)
        : json({ ok: true }, 201),
    );
    await flushOutbox();
    const left = await readOutbox();
    expect(left).toHaveLength(1);
    expect(left[0]).toMatchObject({
      label: 'sale of DDDDDDDDD',
      refused: 'This lot is offered to another dealer.',
    });
    // A refused write is not sent again.
    fetchMock.mockClear();
    await flushOutbox();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('stops at the first write that gets no answer and keeps the rest waiting', async () => {
    online = false;
    await sendOrQueue(sale('FFFFFFFFF'));
    await sendOrQueue(sale('GGGGGGGGG'));
    online = true;
    serve(() => {
      throw new TypeError('still no signal');
    });
    await flushOutbox();
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect((await readOutbox()).filter((w) => !w.refused)).toHaveLength(2);
  });

  it('never resends a write first sent longer ago than the server keeps its key', async () => {
    // Sent once, no answer (the server may have recorded it), then kept.
    const start = Date.now();
    serve(() => {
      throw new TypeError('connection dropped');
    });
    const r = await sendOrQueue(sale('CCCCCCCCC'));
    expect(r.sent).toBe(false);
    const tries = fetchMock.mock.calls.length;
    expect(tries).toBeGreaterThan(0);
    const [kept] = await readOutbox();
    expect(kept!.firstSent).toBeGreaterThanOrEqual(start);

    // A day later the signal returns: it is not sent again, and says why.
    vi.spyOn(Date, 'now').mockReturnValue(kept!.firstSent! + SAFE_RESEND_MS + 1);
    serve(() => json({ ok: true }, 201));
    await flushOutbox();
    expect(fetchMock).not.toHaveBeenCalled();
    expect((await readOutbox())[0]).toMatchObject({ key: kept!.key, refused: TOO_OLD_TO_RESEND });
  });

  it('a write made with no signal counts its age from its first sending, not from when it was made', async () => {
    online = false;
    serve(() => {
      throw new TypeError('offline');
    });
    await sendOrQueue(sale('DDDDDDDDD'));
    const [made] = await readOutbox();
    expect(made!.firstSent).toBeUndefined();
    online = true;
    vi.spyOn(Date, 'now').mockReturnValue(made!.at + 2 * SAFE_RESEND_MS);
    serve(() => json({ ok: true }, 201));
    await flushOutbox();
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(await readOutbox()).toEqual([]);
  });

  it('sends a write only while the account that made it is signed in on this browser', async () => {
    online = false;
    const made = await sendOrQueue(sale('HHHHHHHHH'));
    expect(!made.sent && made.queued.account).toBe('acct-odile');
    online = true;
    serve(() => json({ ok: true }, 201));

    // Another dealer signs in on the same phone: the first one's sale is neither shown nor sent.
    setOutboxAccount('acct-halvard');
    await flushOutbox();
    expect(fetchMock).not.toHaveBeenCalled();
    expect(outboxSnapshot()).toEqual({ mine: [], others: 1 });
    // Nobody signed in: nothing is sent either.
    setOutboxAccount(null);
    await flushOutbox();
    expect(fetchMock).not.toHaveBeenCalled();

    // The dealer who made it signs in again: it is sent, once.
    setOutboxAccount('acct-odile');
    await flushOutbox();
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(await readOutbox()).toEqual([]);
    expect(outboxSnapshot()).toEqual({ mine: [], others: 0 });
  });
});

// Last in the file: once started, the list listens to every answer for the rest of it.
describe('when the signal returns', () => {
  it('sends a waiting write as soon as the server answers any other request, with no online event', async () => {
    online = false;
    serve(() => {
      throw new TypeError('offline');
    });
    await sendOrQueue(sale('JJJJJJJJJ'));
    startOutbox();
    await vi.waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(outboxSnapshot().mine).toHaveLength(1);

    // The signal is back but the browser never says so; the page asks the server for something.
    online = true;
    const sent: string[] = [];
    serve((init) => {
      if (init.method === 'POST') sent.push(keyOf(init)!);
      return json({ ok: true }, init.method === 'POST' ? 201 : 200);
    });
    await api('/api/auth/session');
    await vi.waitFor(async () => expect(await readOutbox()).toEqual([]));
    expect(sent).toHaveLength(1);
    expect(outboxSnapshot()).toEqual({ mine: [], others: 0 });
  });
});
