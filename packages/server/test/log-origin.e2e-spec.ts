import { openCheckpoint, parseVerifierKey, verifyBundleCheckpoint } from '@beadroll/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Test } from '@nestjs/testing';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { AppModule } from '../src/app.module';
import { configureApp } from '../src/bootstrap';
import { LedgerService } from '../src/ledger/ledger.service';
import { LogSequencer } from '../src/ledger/log-sequencer';
import { CheckpointsService } from '../src/log/checkpoints.service';
import { createAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const FIRST = 'http://beadroll.example:3340';
const SECOND = 'http://beadroll.example:3341';

/** Starts the server again on the same data (database, key file) under another public address. */
async function startAgain(publicBaseUrl: string): Promise<NestExpressApplication> {
  process.env.PUBLIC_BASE_URL = publicBaseUrl;
  const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({ logger: ['error', 'warn'] });
  configureApp(app);
  await app.init();
  return app;
}

describe('the log when the public address changes', () => {
  const t = useTestApp(() => ({ CHECKPOINT_SECONDS: '3600', PUBLIC_BASE_URL: FIRST }));

  /** The checkpoints of one size, oldest first. */
  const checkpointsOf = async (size: number) =>
    (await t.app
      .get(DataSource)
      .query('SELECT "origin" FROM "log_checkpoints" WHERE "size" = $1 ORDER BY "signed_at"', [
        size,
      ])) as Array<{
      origin: string;
    }>;
  const keyOf = async (app: NestExpressApplication) =>
    parseVerifierKey((await request(app.getHttpServer()).get('/api/log/key').expect(200)).text.trim());

  it('signs the same size again under the new origin, keeps the old checkpoint valid, and the public page checks the newest', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const { lot } = await t.app
      .get(LedgerService)
      .register({ actor: dealer.id, description: description({ listed: true }) });
    await t.app.get(LogSequencer).settle();
    expect(await t.app.get(CheckpointsService).signIfDue(true)).toMatchObject({ signed: true });
    const firstKey = await keyOf(t.app);
    const firstNote = (await request(t.app.getHttpServer()).get('/api/log/checkpoint').expect(200)).text;
    const size = openCheckpoint(firstNote, firstKey).size;
    expect(firstNote.split('\n')[0]).toBe('beadroll.example:3340/log');

    // `npm start` again on the same data with another port: the start-up pass signs at once,
    // though the log has not grown and the period has not passed.
    const second = await startAgain(SECOND);
    try {
      const secondKey = await keyOf(second);
      expect(secondKey.name).toBe('beadroll.example:3341/log');
      const note = (await request(second.getHttpServer()).get('/api/log/checkpoint').expect(200)).text;
      expect(openCheckpoint(note, secondKey)).toMatchObject({ origin: 'beadroll.example:3341/log', size });
      // The old checkpoint is kept, and still verifies under the old key.
      expect(await checkpointsOf(size)).toEqual([
        { origin: 'beadroll.example:3340/log' },
        { origin: 'beadroll.example:3341/log' },
      ]);
      expect(openCheckpoint(firstNote, firstKey).size).toBe(size);
      // What the public page checks: the lot's bundle carries the newest checkpoint, which the
      // key the page is served with verifies.
      const pub = await request(second.getHttpServer()).get(`/api/public/lots/${lot}`).expect(200);
      expect(pub.body.bundle.checkpoints[0].note).toBe(note);
      expect(
        verifyBundleCheckpoint(pub.body.bundle.checkpoints[0], pub.body.bundle.rolls, secondKey).ok,
      ).toBe(true);
    } finally {
      await second.close();
    }

    // Back on the first address: its checkpoint of that size is the newest again.
    const third = await startAgain(FIRST);
    try {
      const note = (await request(third.getHttpServer()).get('/api/log/checkpoint').expect(200)).text;
      expect(note).toBe(firstNote);
      expect(await checkpointsOf(size)).toEqual([
        { origin: 'beadroll.example:3341/log' },
        { origin: 'beadroll.example:3340/log' },
      ]);
    } finally {
      await third.close();
      process.env.PUBLIC_BASE_URL = FIRST;
    }
  });
});
