// `npm run audit`: verifies every roll in the database named by PG* and prints each broken one.
// Exit 0: every roll intact. 1: something is broken. 2: the audit could not run.
import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { formatLotCode } from '@beadroll/core';
import { AuditCliModule } from './audit-cli.module';
import { AuditService } from './audit.service';

async function main(): Promise<number> {
  const app = await NestFactory.createApplicationContext(AuditCliModule, {
    logger: ['error'],
    // A module that cannot start is "could not run" (exit 2), not a broken roll (exit 1).
    abortOnError: false,
  });
  try {
    let ok = false;
    for await (const e of app.get(AuditService).run(100)) {
      if (e.type === 'start') console.log(`auditing ${e.lots} lot${e.lots === 1 ? '' : 's'}…`);
      else if (e.type === 'progress')
        console.log(`  ${e.lotsChecked}/${e.lots} lots, ${e.entriesChecked} entries`);
      else if (e.type === 'broken')
        console.log(`  BROKEN ${formatLotCode(e.lot)} at seq ${e.seq}: ${e.reason} (${e.message})`);
      else {
        ok = e.ok;
        console.log(
          e.ok
            ? `every roll intact: ${e.lotsChecked} lots, ${e.entriesChecked} entries`
            : `${e.broken} broken roll${e.broken === 1 ? '' : 's'} of ${e.lotsChecked}`,
        );
      }
    }
    return ok ? 0 : 1;
  } finally {
    await app.close();
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(2);
  },
);
