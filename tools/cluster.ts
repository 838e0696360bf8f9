// `npm run start:cluster`: Beadroll as it runs past one machine, on this one — two or more app
// instances behind HAProxy on PORT, a PostgreSQL primary with a streaming hot standby, exhibits
// in a local fake S3 — with the demo scenario loaded like `npm start`.
import { join } from 'node:path';
import { DATA_DIR, demoBanner, portFromEnv, readDemoReport, REPO } from './lib/app-env.ts';
import { startCluster, type Cluster } from './lib/cluster.ts';
import { onShutdown, portInUse, runInherit, stopChildren, UserFacingError } from './lib/proc.ts';

let cluster: Cluster | undefined;

async function main(): Promise<void> {
  if (process.env.PGHOST)
    throw new UserFacingError('start:cluster runs its own primary and standby; unset PGHOST to use it.');
  const port = portFromEnv('PORT', 3000);
  const count = Number(process.env.INSTANCES ?? 2);
  if (!Number.isInteger(count) || count < 2 || count > 8)
    throw new UserFacingError('INSTANCES must be a whole number from 2 to 8.');
  if (await portInUse(port)) throw new UserFacingError(`PORT ${port} is already in use on 127.0.0.1.`);
  onShutdown(async () => {
    await cluster?.stop();
    await stopChildren();
  });
  console.log('building core, server and web…');
  if ((await runInherit('npm', ['run', '--silent', 'build'], { cwd: REPO })) !== 0)
    throw new UserFacingError('the build failed (see above).');
  cluster = await startCluster({
    dir: join(DATA_DIR, 'cluster'),
    port,
    pgPort: portFromEnv('PGPORT', 55442),
    instances: count,
    durable: true,
    dataDir: join(DATA_DIR, 'cluster', 'app'),
    demo: true,
  });
  const report = readDemoReport(join(DATA_DIR, 'cluster', 'app'));
  const lines = [
    '',
    `Beadroll (cluster) is running at ${cluster.url}/`,
    `health of one instance: ${cluster.url}/api/health`,
  ];
  if (report) lines.push(...demoBanner(report, cluster.url));
  lines.push('Ctrl+C stops every instance, the balancer, the standby and the primary.', '');
  console.log(lines.join('\n'));
}

main().catch(async (err: unknown) => {
  console.error(err instanceof UserFacingError ? `npm run start:cluster: ${err.message}` : err);
  await cluster?.stop();
  await stopChildren();
  process.exit(1);
});
