// A worker thread of the audit's replay pool: reads the entry rows of a range of lots on its own
// connection, replays each roll through core's verifier and sends back what the audit's other
// checks need of each lot (see replay-pool.ts).
import { parentPort, workerData } from 'node:worker_threads';
import { Pool } from 'pg';
import { ENTRIES_BY_LOT_RANGE, replayLots, type EntryRowOf } from './lot-replay';
import type { ReplayJob, ReplayJobResult, ReplayWorkerData } from './replay-pool';

const db = new Pool({ ...(workerData as ReplayWorkerData).db, max: 1 });

parentPort!.on('message', (job: ReplayJob) => {
  const answer = (a: ReplayJobResult) => parentPort!.postMessage(a);
  db.query<EntryRowOf>({ text: ENTRIES_BY_LOT_RANGE, values: [job.from, job.to], rowMode: 'array' }).then(
    (r) => answer({ id: job.id, replays: replayLots(job.lots, r.rows) }),
    (e: unknown) => answer({ id: job.id, error: e instanceof Error ? e.message : String(e) }),
  );
});
