import request from 'supertest';
import { createAccount } from './support/accounts';
import { useTestApp } from './support/test-app';

describe('sign-in, the global guard and CSRF', () => {
  const t = useTestApp();

  it('signs in with httpOnly SameSite=Lax cookies and reports the session', async () => {
    const a = await createAccount(t, { role: 'dealer', displayName: 'Ada Glass' });
    const res = await a.agent.get('/api/auth/session').expect(200);
    expect(res.body.account).toMatchObject({
      id: a.id,
      handle: a.handle,
      role: 'dealer',
      status: 'verified',
    });
    const login = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Beadroll-Request', '1')
      .send({ email: a.email.toUpperCase(), password: a.password })
      .expect(200);
    const cookies = ([] as string[]).concat(login.headers['set-cookie'] ?? []);
    const access = cookies.find((c) => c.startsWith('beadroll_access='))!;
    const refresh = cookies.find((c) => c.startsWith('beadroll_refresh='))!;
    expect(access).toMatch(/HttpOnly/i);
    expect(access).toMatch(/SameSite=Lax/i);
    expect(access).toMatch(/Path=\//);
    expect(refresh).toMatch(/Path=\/api\/auth\/session/);
    expect(refresh).toMatch(/HttpOnly/i);
  });

  it('refuses a wrong password with one message for both unknown address and wrong password', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const wrong = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Beadroll-Request', '1')
      .send({ email: a.email, password: 'not the password' })
      .expect(401);
    const unknown = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Beadroll-Request', '1')
      .send({ email: 'nobody@example.invalid', password: 'not the password' })
      .expect(401);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
  });

  it('refuses a write without the CSRF header with 403 csrf, before anything else', async () => {
    const res = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .send({ email: 'x@example.invalid', password: 'y' })
      .expect(403);
    expect(res.body.error.code).toBe('csrf');
    const wrongValue = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Beadroll-Request', 'yes')
      .send({})
      .expect(403);
    expect(wrongValue.body.error.code).toBe('csrf');
  });

  it('signs out: the session ends for its access and refresh tokens', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const login = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Beadroll-Request', '1')
      .send({ email: a.email, password: a.password })
      .expect(200);
    const cookies = ([] as string[]).concat(login.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]);
    await request(t.app.getHttpServer())
      .post('/api/auth/session/sign-out')
      .set('X-Beadroll-Request', '1')
      .set('Cookie', cookies.join('; '))
      .expect(204);
    const res = await request(t.app.getHttpServer())
      .get('/api/auth/session')
      .set('Cookie', cookies.join('; '))
      .expect(200);
    expect(res.body.account).toBeNull();
    await request(t.app.getHttpServer())
      .post('/api/auth/session/refresh')
      .set('X-Beadroll-Request', '1')
      .set('Cookie', cookies.join('; '))
      .expect(401);
    // The other sign-in of the same account is untouched.
    await a.agent.get('/api/account').expect(200);
  });
});
