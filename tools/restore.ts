// `npm run restore -- DIR`: restores a backup made by `npm run backup` into an EMPTY database
// (the private cluster's, or the one PGHOST names) and an empty exhibit store, then audits every
// roll and checks every exhibit file against its digest. Exit 0 only when both pass.
import { join } from 'node:path';
import { DATA_DIR, portFromEnv } from './lib/app-env.ts';
import { buildServer, restore } from './lib/backup.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from './lib/pg.ts';
import { portInUse, UserFacingError } from './lib/proc.ts';

async function main(): Promise<number> {
  const dir = process.argv[2];
  if (!dir) throw new UserFacingError('usage: npm run restore -- DIR');
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
    const r = await restore(dir, env);
    return r.auditOk && r.exhibitsOk ? 0 : 1;
  } finally {
    cluster?.stop();
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof UserFacingError ? `npm run restore: ${err.message}` : err);
    process.exit(2);
  },
);
