import type { AppConfig } from '../src/config/app-config';
import { APP_CONFIG } from '../src/config/config.module';
import { seedExhibits } from '../src/demo/demo-exhibits';
import type { SeedContext } from '../src/demo/seed';
import { createAccount } from './support/accounts';
import { leftovers, rollOf } from './support/exhibit-http';
import { description } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

let t: TestApp;
afterAll(() => t?.close());

it('gives demo lots drawn exhibits through the upload service, once', async () => {
  t = await createTestApp();
  const dealer = await createAccount(t, { role: 'dealer' });
  const codes: string[] = [];
  for (const title of ['White wound beads with pink roses', 'Uranium glass pressed beads']) {
    const res = await dealer.agent
      .post('/api/lots')
      .set('X-Beadroll-Request', '1')
      .send({ description: description({ title }) })
      .expect(201);
    codes.push((res.body as { code: string }).code);
  }
  const ctx: SeedContext = {
    accounts: {},
    report: { signIns: [], publicLots: [] },
    config: t.app.get<AppConfig>(APP_CONFIG),
  };
  await seedExhibits(t.app, ctx);
  const [roses, uranium] = codes;

  const list = await dealer.agent.get(`/api/lots/${roses}/exhibits`).expect(200);
  const shown = list.body.exhibits as Array<{ kind: string; sealed: boolean; original: { width: number } }>;
  expect(shown.map((x) => [x.kind, x.sealed])).toEqual([
    ['whole-lot', false],
    ['hole', false],
    ['receipt', true],
  ]);
  expect(shown[0].original.width).toBe(1200);
  const uv = await dealer.agent.get(`/api/lots/${uranium}/exhibits`).expect(200);
  expect((uv.body.exhibits as Array<{ kind: string }>).map((x) => x.kind)).toEqual(['whole-lot', 'uv-a']);
  for (const code of codes) {
    const v = await dealer.agent.get(`/api/lots/${code}/verification`).expect(200);
    expect(v.body).toMatchObject({ ok: true });
  }
  expect(leftovers(t)).toEqual([]);

  // A second load finds them and adds nothing.
  const before = (await rollOf(dealer.agent, roses)).length;
  await seedExhibits(t.app, ctx);
  expect((await rollOf(dealer.agent, roses)).length).toBe(before);
}, 120_000);
