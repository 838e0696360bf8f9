/**
 * Writes that were sent but never answered (the connection dropped, the server was restarting),
 * kept in this browser so they can be sent again, with the same idempotency key, after a reload:
 * the server then either does them once or answers from what it already did. Only plain JSON
 * writes to rolls and lots are kept; anything carrying a password or a file is not.
 */
export interface PendingWrite {
  key: string;
  path: string;
  method: string;
  body?: unknown;
  /** When it was first sent (ms since the epoch); the server forgets keys after 24 hours. */
  at: number;
}

const STORAGE_KEY = 'beadroll.pending-writes';
/** A little less than the server's 24 hours, so a kept write is never sent under a forgotten key. */
const MAX_AGE_MS = 23 * 60 * 60 * 1000;

/** Paths whose bodies hold passwords or tokens: never written to the browser's storage. */
export function mayKeep(path: string): boolean {
  return path.startsWith('/api/') && !path.startsWith('/api/auth/') && !path.startsWith('/api/account');
}

function storage(): Storage | undefined {
  try {
    return typeof localStorage === 'undefined' ? undefined : localStorage;
  } catch {
    return undefined;
  }
}

export function pendingWrites(now = Date.now()): PendingWrite[] {
  const raw = storage()?.getItem(STORAGE_KEY);
  if (!raw) return [];
  try {
    const list = JSON.parse(raw) as PendingWrite[];
    return Array.isArray(list)
      ? list.filter((w) => w && typeof w.key === 'string' && now - w.at < MAX_AGE_MS)
      : [];
  } catch {
    return [];
  }
}

function save(list: PendingWrite[]): void {
  const s = storage();
  if (!s) return;
  try {
    if (list.length === 0) s.removeItem(STORAGE_KEY);
    else s.setItem(STORAGE_KEY, JSON.stringify(list));
  } catch {
    // storage full or refused: the write is still retried while the page stays open
  }
}

export function keepPending(w: PendingWrite): void {
  save([...pendingWrites().filter((x) => x.key !== w.key), w]);
}

export function forgetPending(key: string): void {
  save(pendingWrites().filter((x) => x.key !== key));
}
