// `npm run backup -- DIR`: the database (pg_dump, custom format) and every exhibit file, with a
// manifest of SHA-256 digests, into DIR (new or empty). Uses the database `npm start` uses (or
// the one PGHOST names) and the exhibit store of the same settings (STORAGE_DRIVER…).
import { join } from 'node:path';
import { DATA_DIR, portFromEnv } from './lib/app-env.ts';
import { backup, buildServer } from './lib/backup.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from './lib/pg.ts';
import { portInUse, UserFacingError } from './lib/proc.ts';

async function main(): Promise<void> {
  const dir = process.argv[2];
  if (!dir) throw new UserFacingError('usage: npm run backup -- DIR');
  let cluster: PrivateCluster | undefined;
  let env: NodeJS.ProcessEnv = { DATA_DIR, ...process.env };
  if (!process.env.PGHOST) {
    const port = portFromEnv('PGPORT', 55432);
    const wasRunning = await portInUse(port);
    const c = await startPrivateCluster({ base: join(DATA_DIR, 'pg'), port, durable: true });
    if (!wasRunning) cluster = c;
    env = { ...env, ...pgEnv(c.target) };
  }
  try {
    if (!process.env.BEADROLL_SKIP_BUILD) await buildServer();
    await backup(dir, env);
  } finally {
    cluster?.stop();
  }
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    console.error(err instanceof UserFacingError ? `npm run backup: ${err.message}` : err);
    process.exit(1);
  },
);
