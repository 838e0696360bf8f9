import 'reflect-metadata';
import { loadConfig } from './config/app-config';
import { createDataSource } from './database/data-source';

/** Runs pending migrations, each in its own transaction, and prints what ran. */
async function main(): Promise<void> {
  const dataSource = createDataSource(loadConfig());
  await dataSource.initialize();
  try {
    const ran = await dataSource.runMigrations({ transaction: 'each' });
    console.log(
      ran.length ? `migrations run: ${ran.map((m) => m.name).join(', ')}` : 'migrations: up to date',
    );
  } finally {
    await dataSource.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
