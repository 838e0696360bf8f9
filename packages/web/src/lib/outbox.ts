import { createStore, get, update, type UseStore } from 'idb-keyval';
import {
  ApiError,
  api,
  isRetryable,
  newIdempotencyKey,
  onServerAnswer,
  sendOnce,
  type RequestOptions,
} from './api';
import { forgetPending } from './pending-writes';

/**
 * Writes made with no signal (a sale at a fair stand), kept in this browser's IndexedDB so a
 * reload keeps them, and sent in the order they were made once the signal returns. Each keeps
 * the idempotency key it was given when it was made: however often it is sent, the server
 * writes it once. A write the server refuses stays in the list with the server's reason until
 * the dealer dismisses it.
 */
export interface QueuedWrite {
  key: string;
  path: string;
  method: 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: Record<string, unknown>;
  /** What it is, in the dealer's words: "sale of 7K2Q-M9XA-T". */
  label: string;
  /** When it was made (ms since the epoch). */
  at: number;
  /**
   * When it was first sent (ms since the epoch), whether or not an answer came: from then on
   * the server may hold its key, which it keeps for 24 hours.
   */
  firstSent?: number;
  /** Set when the server answered with a refusal, or when it is too old to resend: the reason. */
  refused?: string;
  /**
   * The account that made it. It is sent only while that account is signed in on this
   * browser, so a phone passed to another dealer never sends the first one's sale as theirs.
   * (Absent on writes kept before accounts were recorded: they go with whoever signs in.)
   */
  account?: string;
}

/**
 * How long after its first sending a write may still be sent again. The server forgets an
 * idempotency key after 24 hours; an hour less leaves room for a phone's clock being off.
 */
export const SAFE_RESEND_MS = 23 * 60 * 60 * 1000;

export const TOO_OLD_TO_RESEND =
  'Not sent again: it was first sent more than 23 hours ago and may already be recorded. Look at the lot’s history before making it again.';

const LIST_KEY = 'writes';
let started = false;
let store: UseStore | undefined;
function db(): UseStore {
  store ??= createStore('beadroll-outbox', 'queue');
  return store;
}

/** What a page shows of the list: the signed-in account's writes, and how many are another's. */
export interface OutboxView {
  mine: QueuedWrite[];
  /** Writes another account made on this browser: kept until it signs in here again. */
  others: number;
}

type Listener = (list: QueuedWrite[]) => void;
const listeners = new Set<Listener>();
const sentListeners = new Set<(w: QueuedWrite) => void>();
let current: QueuedWrite[] = [];
/** The account signed in on this browser (null: nobody, or not known yet). */
let signedIn: string | null = null;
let view: OutboxView = { mine: [], others: 0 };

const belongsToSignedIn = (w: QueuedWrite) => signedIn !== null && (w.account ?? signedIn) === signedIn;

function changed(): void {
  const mine = current.filter(belongsToSignedIn);
  view = { mine, others: current.length - mine.length };
  for (const l of listeners) l(current);
}

/** The signed-in account's part of the list as last read or written (stable between changes). */
export function outboxSnapshot(): OutboxView {
  return view;
}

export async function readOutbox(): Promise<QueuedWrite[]> {
  current = ((await get<QueuedWrite[]>(LIST_KEY, db())) ?? []).filter((w) => w && typeof w.key === 'string');
  changed();
  return current;
}

/**
 * Tells the list who is signed in on this browser (null when nobody is). Only that account's
 * writes are shown and sent; when an account signs in, what it left waiting is sent.
 */
export function setOutboxAccount(account: string | null): void {
  if (account === signedIn) return;
  signedIn = account;
  changed();
  if (account !== null && started) void flushOutbox().catch(() => undefined);
}

/** Changes the list in one IndexedDB transaction, so two changes never lose one another. */
async function write(change: (list: QueuedWrite[]) => QueuedWrite[]): Promise<void> {
  await update<QueuedWrite[]>(
    LIST_KEY,
    (old) => {
      current = change(old ?? []);
      return current;
    },
    db(),
  );
  changed();
}

/** Calls `listener` with the list whenever it changes; returns the unsubscribe. */
export function watchOutbox(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** Calls `listener` after each queued write the server accepted. */
export function onQueuedWriteSent(listener: (w: QueuedWrite) => void): () => void {
  sentListeners.add(listener);
  return () => sentListeners.delete(listener);
}

/** Keeps a write, as made by the signed-in account unless it names its own. */
export function queueWrite(w: Omit<QueuedWrite, 'at' | 'refused'>): Promise<void> {
  const kept: QueuedWrite = { ...w, at: Date.now() };
  if (kept.account === undefined && signedIn !== null) kept.account = signedIn;
  return write((list) => [...list.filter((x) => x.key !== w.key), kept]);
}

/** Removes one write from the list (a refused one the dealer has read). */
export function dismissQueuedWrite(key: string): Promise<void> {
  return write((list) => list.filter((x) => x.key !== key));
}

function refusal(err: ApiError): string {
  const fields = err.fields.map((f) => f.reason).filter(Boolean);
  return fields.length ? `${err.message} (${fields.join('; ')})` : err.message;
}

let flushing: Promise<void> | undefined;

/**
 * Sends the signed-in account's waiting writes one after the other, oldest first. Stops at the
 * first that gets no answer (still no signal) and leaves it and the rest waiting; one the server
 * refuses is marked with its reason and the next one is sent. With nobody signed in nothing is
 * sent. Concurrent calls share one pass.
 */
export function flushOutbox(): Promise<void> {
  flushing ??= (async () => {
    try {
      const waiting = (await readOutbox())
        .filter((w) => !w.refused && belongsToSignedIn(w))
        .sort((a, b) => a.at - b.at);
      for (const w of waiting) {
        const now = Date.now();
        if (w.firstSent !== undefined && now - w.firstSent > SAFE_RESEND_MS) {
          await write((list) =>
            list.map((x) => (x.key === w.key ? { ...x, refused: TOO_OLD_TO_RESEND } : x)),
          );
          continue;
        }
        if (w.firstSent === undefined)
          await write((list) => list.map((x) => (x.key === w.key ? { ...x, firstSent: now } : x)));
        try {
          await sendOnce(w.path, {
            method: w.method,
            body: w.body,
            idempotencyKey: w.key,
          } satisfies RequestOptions);
          await write((list) => list.filter((x) => x.key !== w.key));
          for (const l of sentListeners) l(w);
        } catch (err) {
          if (err instanceof ApiError && !isRetryable(err)) {
            await write((list) => list.map((x) => (x.key === w.key ? { ...x, refused: refusal(err) } : x)));
          } else break;
        }
      }
    } finally {
      flushing = undefined;
    }
  })();
  return flushing;
}

export type SendResult<T> = { sent: true; answer: T } | { sent: false; queued: QueuedWrite };

/**
 * Sends a write now if there is a signal, or keeps it in the list to send later. A write that
 * gets no answer after its retries is kept too, under the same key: if the server did do it
 * and only the answer was lost, sending it again does nothing more.
 */
export async function sendOrQueue<T>(
  w: Pick<QueuedWrite, 'path' | 'method' | 'body' | 'label'>,
): Promise<SendResult<T>> {
  const key = newIdempotencyKey();
  const account = signedIn ?? undefined;
  const queue = async (firstSent?: number): Promise<SendResult<T>> => {
    const kept = { ...w, key, account, ...(firstSent === undefined ? {} : { firstSent }) };
    await queueWrite(kept);
    return { sent: false, queued: { ...kept, at: Date.now() } };
  };
  if (typeof navigator !== 'undefined' && navigator.onLine === false) return queue();
  const firstSent = Date.now();
  try {
    return {
      sent: true,
      answer: await api<T>(w.path, { method: w.method, body: w.body, idempotencyKey: key }),
    };
  } catch (err) {
    if (!isRetryable(err)) throw err;
    forgetPending(key); // kept here instead, where the dealer sees it waiting
    return queue(firstSent);
  }
}

const RETRY_EVERY_MS = 5_000;
/** However many answers come, a pass is started by them at most this often. */
const NUDGE_EVERY_MS = 2_000;

/**
 * Sends what is waiting now, whenever the browser says the signal is back, whenever the server
 * answers any other request, and every 5 s while anything waits. A phone may say it is online
 * before the fair's network lets it out, or never say that the signal came back at all. Passes
 * never overlap, and a pass with no signal stops at its first request.
 */
export function startOutbox(): void {
  if (started || typeof indexedDB === 'undefined') return;
  started = true;
  const flush = () => void flushOutbox().catch(() => undefined);
  const waiting = () => view.mine.some((w) => !w.refused);
  window.addEventListener('online', flush);
  setInterval(() => {
    if (navigator.onLine !== false && waiting()) flush();
  }, RETRY_EVERY_MS);
  let nudged = 0;
  onServerAnswer(() => {
    if (flushing || !waiting() || Date.now() - nudged < NUDGE_EVERY_MS) return;
    nudged = Date.now();
    flush();
  });
  void readOutbox().then(flush);
}
