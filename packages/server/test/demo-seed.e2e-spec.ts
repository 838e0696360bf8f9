import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { runSeed } from '../src/demo/seed';
import { signIn } from './support/accounts';
import { useTestApp } from './support/test-app';

describe('demo scenario: accounts', () => {
  const t = useTestApp();

  it('loads once, a second run changes nothing, and every printed sign-in works', async () => {
    const first = await runSeed(t.app);
    const ids = await t.app.get(DataSource).query(`SELECT id, handle FROM accounts ORDER BY handle`);
    const second = await runSeed(t.app);
    expect(await t.app.get(DataSource).query(`SELECT id, handle FROM accounts ORDER BY handle`)).toEqual(ids);
    expect(second).toEqual(first);
    const report = JSON.parse(readFileSync(join(t.dataDir, 'demo-report.json'), 'utf8'));
    expect(report).toEqual(first);
    const roles = first.signIns.map((s) => s.role).sort();
    expect(roles.filter((r) => r === 'registrar')).toHaveLength(1);
    expect(roles.filter((r) => r === 'assessor')).toHaveLength(1);
    expect(roles.filter((r) => r === 'dealer').length).toBeGreaterThanOrEqual(4);
    for (const s of first.signIns) await signIn(t, s.email, s.password);
  });
});
