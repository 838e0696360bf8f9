import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import type { LotReplay } from './lot-replay';

/** Consecutive lots (in id order) whose rolls one worker reads and replays. */
export interface ReplayJob {
  id: number;
  from: string;
  to: string;
  lots: Array<{ id: string; code: string }>;
}

export type ReplayJobResult = { id: number; replays: LotReplay[] } | { id: number; error: string };

/** How a worker connects to the database. */
export interface ReplayWorkerData {
  db: {
    host?: string;
    port?: number;
    user?: string;
    password?: string;
    database?: string;
    application_name: string;
  };
}

/** Each worker's own heap: a job holds a few thousand rows. */
const WORKER_HEAP_MB = 64;

interface Pending {
  worker: Worker;
  here: () => Promise<LotReplay[]>;
  resolve: (r: LotReplay[]) => void;
  reject: (e: unknown) => void;
}

/**
 * Reads and replays rolls in a small pool of worker threads, each on its own connection: one per
 * core but two, one left for this thread (which reads the lots' other rows and compares the
 * stored copies) and one for PostgreSQL. On two cores that is none: measured there, a worker
 * took more CPU (its own connection, heap and collector) for no shorter audit, as the other
 * processes had the second core anyway. When the pool has no worker or cannot start (no built
 * worker beside this file, as when run from the TypeScript sources) or a worker fails, a job is
 * done in this thread instead by the caller's `here`.
 */
export class ReplayPool {
  private workers: Worker[] = [];
  private pending = new Map<number, Pending>();
  private load = new Map<Worker, number>();
  private next = 0;

  constructor(data: ReplayWorkerData, size = Math.max(0, availableParallelism() - 2)) {
    const file = join(__dirname, 'replay.worker.js');
    if (size === 0 || !__filename.endsWith('.js') || !existsSync(file)) return;
    try {
      for (let i = 0; i < size; i++) {
        const w = new Worker(file, {
          workerData: data,
          resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB },
        });
        w.on('message', (r: ReplayJobResult) => this.answered(w, r));
        w.on('error', () => this.drop(w));
        w.on('exit', () => this.drop(w));
        this.workers.push(w);
        this.load.set(w, 0);
      }
    } catch {
      this.close();
    }
  }

  /** Whether jobs go to worker threads. */
  get threaded(): boolean {
    return this.workers.length > 0;
  }

  /** Each lot's replay, in the order given: by a worker, or by `here` in this thread. */
  replay(job: Omit<ReplayJob, 'id'>, here: () => Promise<LotReplay[]>): Promise<LotReplay[]> {
    if (this.workers.length === 0) return here();
    const id = this.next++;
    let worker = this.workers[0]!;
    for (const w of this.workers) if (this.load.get(w)! < this.load.get(worker)!) worker = w;
    this.load.set(worker, this.load.get(worker)! + 1);
    return new Promise((resolve, reject) => {
      this.pending.set(id, { worker, here, resolve, reject });
      worker.postMessage({ id, ...job } satisfies ReplayJob);
    });
  }

  /** Ends the workers. Jobs still out are for batches no one will check now. */
  close(): void {
    const workers = this.workers;
    this.workers = [];
    this.pending.clear();
    for (const w of workers) void w.terminate();
  }

  private answered(worker: Worker, r: ReplayJobResult): void {
    const p = this.pending.get(r.id);
    if (!p) return;
    this.pending.delete(r.id);
    this.load.set(worker, this.load.get(worker)! - 1);
    if ('replays' in r) p.resolve(r.replays);
    else p.here().then(p.resolve, p.reject);
  }

  /** A worker that failed or ended: its jobs are done in this thread. */
  private drop(worker: Worker): void {
    if (!this.workers.includes(worker)) return;
    this.workers = this.workers.filter((w) => w !== worker);
    void worker.terminate();
    for (const [id, p] of [...this.pending]) {
      if (p.worker !== worker) continue;
      this.pending.delete(id);
      p.here().then(p.resolve, p.reject);
    }
  }
}
