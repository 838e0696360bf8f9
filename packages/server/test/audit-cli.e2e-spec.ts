import { NestFactory } from '@nestjs/core';
import { SchedulerRegistry } from '@nestjs/schedule';
import { DataSource } from 'typeorm';
import { AuditCliModule } from '../src/audit/audit-cli.module';
import { AuditService } from '../src/audit/audit.service';
import { LogSequencer } from '../src/ledger/log-sequencer';
import { useAccount } from './support/accounts';
import { registerLot } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

describe('the command-line audit', () => {
  const t = useTestApp(() => ({ CHECKPOINT_SECONDS: '3600' }));
  const dealer = useAccount(t, { role: 'dealer' });

  const checkpointSizes = async () =>
    (
      (await t.app.get(DataSource).query('SELECT "size" FROM "log_checkpoints" ORDER BY "size"')) as Array<{
        size: string;
      }>
    ).map((r) => Number(r.size));

  it('reads the ledger and starts no log job: it signs no checkpoint and keeps no timer', async () => {
    await registerLot(dealer);
    await registerLot(dealer);
    await t.app.get(LogSequencer).settle();
    const before = await checkpointSizes();
    // The log has grown since its last checkpoint, and with this period a signing pass would sign it.
    const period = process.env.CHECKPOINT_SECONDS;
    process.env.CHECKPOINT_SECONDS = '1';
    await new Promise((r) => setTimeout(r, 1100));
    const cli = await NestFactory.createApplicationContext(AuditCliModule, { logger: ['error'] });
    try {
      expect(cli.get(SchedulerRegistry).getIntervals()).toEqual([]);
      const events = [];
      for await (const e of cli.get(AuditService).run()) events.push(e);
      expect(events.at(-1)).toMatchObject({ type: 'done', ok: true, lotsChecked: 2 });
    } finally {
      await cli.close();
      process.env.CHECKPOINT_SECONDS = period;
    }
    expect(await checkpointSizes()).toEqual(before);
  });
});
