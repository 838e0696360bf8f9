// `npm run audit`: the registrar's full-ledger audit from the command line. Verifies every roll
// in the database `npm start` uses (or the one PGHOST names) and prints each broken roll.
// Exit 0: every roll intact. 1: a roll is broken. 2: the audit could not run.
import { join } from 'node:path';
import { AUDIT_NODE_OPTIONS, DATA_DIR, portFromEnv, REPO } from './lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from './lib/pg.ts';
import { portInUse, runInherit, UserFacingError } from './lib/proc.ts';

async function main(): Promise<number> {
  let cluster: PrivateCluster | undefined;
  let env: NodeJS.ProcessEnv = process.env;
  if (!process.env.PGHOST) {
    const port = portFromEnv('PGPORT', 55432);
    // Leave a cluster that `npm start` is running as it is; stop only one started here.
    const wasRunning = await portInUse(port);
    const c = await startPrivateCluster({ base: join(DATA_DIR, 'pg'), port, durable: true });
    if (!wasRunning) cluster = c;
    env = { ...process.env, ...pgEnv(c.target) };
  }
  try {
    if ((await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/core'], { cwd: REPO })) !== 0)
      throw new UserFacingError('the build failed (see above).');
    if (
      (await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/server'], { cwd: REPO })) !== 0
    )
      throw new UserFacingError('the build failed (see above).');
    return await runInherit(
      'node',
      [...AUDIT_NODE_OPTIONS, join(REPO, 'packages/server/dist/audit/audit-cli.js')],
      {
        cwd: REPO,
        env,
      },
    );
  } finally {
    cluster?.stop();
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof UserFacingError ? `npm run audit: ${err.message}` : err);
    process.exit(2);
  },
);
