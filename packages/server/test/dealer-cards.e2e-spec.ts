import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { createAccount } from './support/accounts';
import { useTestApp } from './support/test-app';

describe('public dealer cards by account id', () => {
  const t = useTestApp();

  it('answers the cards of verified accounts and leaves out pending and unknown ids', async () => {
    const dealer = await createAccount(t, {
      role: 'dealer',
      displayName: 'Marit Quellby',
      business: 'Quellby Glass',
    });
    const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    const unknown = randomUUID();
    const res = await request(t.app.getHttpServer())
      .get(`/api/public/dealers?ids=${dealer.id},${pending.id},${unknown}`)
      .expect(200);
    expect(Object.keys(res.body.cards)).toEqual([dealer.id]);
    expect(res.body.cards[dealer.id]).toMatchObject({
      id: dealer.id,
      displayName: 'Marit Quellby',
      business: 'Quellby Glass',
      status: 'verified',
    });
  });

  it('refuses a missing, malformed or over-long list with 400 naming ids', async () => {
    const http = () => request(t.app.getHttpServer());
    for (const q of [
      '',
      '?ids=',
      '?ids=not-an-id',
      `?ids=${Array.from({ length: 101 }, () => randomUUID()).join(',')}`,
    ]) {
      const res = await http().get(`/api/public/dealers${q}`).expect(400);
      expect(res.body.error.code).toBe('validation');
      expect(res.body.error.fields[0].field).toBe('ids');
    }
  });
});
