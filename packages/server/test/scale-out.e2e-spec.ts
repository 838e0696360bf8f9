import request from 'supertest';
import { DataSource } from 'typeorm';
import { createDataSource } from '../src/database/data-source';
import { loadConfig } from '../src/config/app-config';
import { PgThrottlerStorage } from '../src/auth/pg-throttler.storage';
import { createAccount } from './support/accounts';
import { registerLot } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

// Several instances behind a load balancer share PostgreSQL and nothing else: these checks run
// one instance against the real database; the cluster test (npm run test:cluster) runs several.
describe('past one instance', () => {
  let t: TestApp;
  let code = '';
  const standby = (env: Record<string, string>) => createTestApp({ INSTANCE_NAME: 'app-test', ...env });
  afterEach(async () => {
    await t?.close();
    delete process.env.PG_STANDBY_HOST;
    delete process.env.PG_STANDBY_PORT;
    delete process.env.INSTANCE_NAME;
  });

  async function listedLot(): Promise<string> {
    return (await registerLot(await createAccount(t, { role: 'dealer' }))).code;
  }

  it('counts rate-limited attempts in PostgreSQL, the same for every instance', async () => {
    t = await createTestApp();
    const other = createDataSource(loadConfig(process.env));
    await other.initialize();
    try {
      const a = new PgThrottlerStorage(t.app.get(DataSource));
      const b = new PgThrottlerStorage(other);
      for (let i = 0; i < 3; i++)
        expect((await a.increment('k', 60_000, 3, 0, 'default')).isBlocked).toBe(false);
      const fourth = await b.increment('k', 60_000, 3, 0, 'default');
      expect(fourth).toMatchObject({ totalHits: 4, isBlocked: true });
      expect(fourth.timeToBlockExpire).toBeGreaterThan(0);
      // A window that has ended starts again at one.
      expect((await a.increment('short', 1, 1, 0, 'default')).totalHits).toBe(1);
      await new Promise((r) => setTimeout(r, 20));
      expect(await b.increment('short', 1, 1, 0, 'default')).toMatchObject({
        totalHits: 1,
        isBlocked: false,
      });
    } finally {
      await other.destroy();
    }
  });

  it('names the instance on every answer and in the health report', async () => {
    t = await standby({});
    const res = await request(t.app.getHttpServer()).get('/api/health').expect(200);
    expect(res.headers['beadroll-instance']).toBe('app-test');
    expect(res.body).toMatchObject({ instance: 'app-test', standby: { configured: false, usable: false } });
  });

  it('reads public lot data from the standby when it is usable, from the primary when it is not', async () => {
    // A standby that cannot be reached: public reads fall back to the primary.
    t = await standby({ PG_STANDBY_HOST: '127.0.0.1', PG_STANDBY_PORT: '9' });
    code = await listedLot();
    let res = await request(t.app.getHttpServer()).get(`/api/public/lots/${code}`).expect(200);
    expect(res.headers['beadroll-read-from']).toBe('primary');
    const health = await request(t.app.getHttpServer()).get('/api/health').expect(200);
    expect(health.body.standby).toMatchObject({ configured: true, usable: false, lagMs: null });
    await t.close();
    // The "standby" is the primary itself (not in recovery: read as a primary with no lag).
    t = await standby({ PG_STANDBY_HOST: process.env.PGHOST!, PG_STANDBY_PORT: process.env.PGPORT! });
    code = await listedLot();
    res = await request(t.app.getHttpServer()).get(`/api/public/lots/${code}`).expect(200);
    expect(res.headers['beadroll-read-from']).toBe('standby');
    // A signed-in reader (a dealer who may have just written) reads the primary.
    const signedIn = await createAccount(t, { role: 'dealer' });
    const own = await signedIn.agent.get(`/api/public/lots/${code}`).expect(200);
    expect(own.headers['beadroll-read-from']).toBe('primary');
  });
});
