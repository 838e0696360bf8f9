// Sign-ins at the production password cost (scrypt N = 2^17, about 128 MiB each): twenty at
// once must keep the server's resident memory under 400 MB, because they wait in line.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { PgTarget } from '../lib/pg.ts';
import { account, Client, type Row, ServerProcess, sleep } from './harness.ts';

const LIMIT_MB = 400;

function rssMb(pid: number, field: 'VmRSS' | 'VmHWM'): number {
  const m = new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : 0;
}

export async function memorySection(
  target: PgTarget,
  database: string,
  work: string,
  burst: number,
): Promise<Row[]> {
  const server = await ServerProcess.create(target, database, join(work, 'memory'), {
    SCRYPT_COST: '131072',
  });
  await server.start();
  try {
    const who = await account(target, database, 'dealer', 131072);
    const before = rssMb(server.pid, 'VmRSS');
    let peak = before;
    let sampling = true;
    const sampler = (async () => {
      while (sampling) {
        peak = Math.max(peak, rssMb(server.pid, 'VmRSS'));
        await sleep(5);
      }
    })();
    const started = Date.now();
    const results = await Promise.all(
      Array.from({ length: burst }, async () => {
        const c = new Client(server);
        try {
          await c.signIn(who.email, who.password);
          return true;
        } catch {
          return false;
        }
      }),
    );
    sampling = false;
    await sampler;
    peak = Math.max(peak, rssMb(server.pid, 'VmHWM'));
    const signedIn = results.filter(Boolean).length;
    return [
      {
        section: 'memory',
        check: `${burst} sign-ins at once (scrypt N=2^17)`,
        detail: `${signedIn}/${burst} signed in in ${((Date.now() - started) / 1000).toFixed(1)} s; peak RSS ${peak.toFixed(0)} MB (idle ${before.toFixed(0)} MB, limit ${LIMIT_MB} MB)`,
        ok: signedIn === burst && peak < LIMIT_MB,
      },
    ];
  } finally {
    await server.stop();
  }
}
