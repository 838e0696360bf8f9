// `npm run create-registrar -- EMAIL`: builds the server, makes sure the database is up and
// migrated (the private cluster unless PGHOST is set), then runs the server's create-registrar script.
import { join } from 'node:path';
import { DATA_DIR, ensureJwtSecret, REPO } from './lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PgTarget } from './lib/pg.ts';
import { runInherit, UserFacingError } from './lib/proc.ts';

async function main(): Promise<void> {
  const email = process.argv[2];
  if (!email) throw new UserFacingError('usage: npm run create-registrar -- EMAIL');
  let target: PgTarget | undefined;
  if (!process.env.PGHOST) {
    const port = Number(process.env.PGPORT ?? 55432);
    target = (await startPrivateCluster({ base: join(DATA_DIR, 'pg'), port, durable: true })).target;
  }
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...(target ? pgEnv(target) : {}),
    DATA_DIR,
    JWT_SECRET_FILE: ensureJwtSecret(DATA_DIR),
  };
  if ((await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/core'], { cwd: REPO })) !== 0)
    throw new UserFacingError('the build failed (see above).');
  if ((await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/server'], { cwd: REPO })) !== 0)
    throw new UserFacingError('the build failed (see above).');
  const server = join(REPO, 'packages/server/dist');
  if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0)
    throw new UserFacingError('database migrations failed (see above).');
  const code = await runInherit('node', [join(server, 'cli/create-registrar.js'), email], { cwd: REPO, env });
  process.exit(code);
}

main().catch((err: unknown) => {
  console.error(err instanceof UserFacingError ? `create-registrar: ${err.message}` : err);
  process.exit(1);
});
