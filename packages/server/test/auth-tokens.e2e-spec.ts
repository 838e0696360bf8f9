import { createHmac } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { PasswordsService } from '../src/auth/passwords.service';
import { loadConfig } from '../src/config/app-config';
import { createAccount } from './support/accounts';
import { createTestApp, type TestApp, useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };

function b64url(value: object | string): string {
  return Buffer.from(typeof value === 'string' ? value : JSON.stringify(value)).toString('base64url');
}

/** A compact JWS (RFC 7515) signed with HMAC-SHA256 (RFC 7518 §3.2) — or not signed at all for alg "none". */
function jwt(header: object, payload: object, key?: string): string {
  const input = `${b64url(header)}.${b64url(payload)}`;
  const sig = key ? createHmac('sha256', key).update(input).digest('base64url') : '';
  return `${input}.${sig}`;
}

function cookieValue(setCookie: string[] | string | undefined, name: string): string {
  const line = ([] as string[]).concat(setCookie ?? []).find((c) => c.startsWith(`${name}=`));
  if (!line) throw new Error(`no ${name} cookie`);
  return line.slice(name.length + 1).split(';')[0];
}

describe('session tokens: tampering, expiry, rotation and reuse', () => {
  let secret: string;
  const t = useTestApp();
  beforeAll(async () => {
    secret = readFileSync(join(t.dataDir, 'jwt.key'), 'utf8').trim();
  });

  async function claimsOf(agentCookie: string): Promise<{ sub: string; sid: string }> {
    return JSON.parse(Buffer.from(agentCookie.split('.')[1], 'base64url').toString('utf8'));
  }

  async function signInRaw(email: string, password: string) {
    const res = await request(t.app.getHttpServer())
      .post('/api/auth/sign-in')
      .set(W)
      .send({ email, password });
    expect(res.status).toBe(200);
    return {
      access: cookieValue(res.headers['set-cookie'], 'beadroll_access'),
      refresh: cookieValue(res.headers['set-cookie'], 'beadroll_refresh'),
    };
  }

  const asAccess = (token: string) =>
    request(t.app.getHttpServer()).get('/api/account').set('Cookie', `beadroll_access=${token}`);

  it('accepts a good token and refuses alg none, a wrong signature and an expired token', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const { access } = await signInRaw(a.email, a.password);
    await asAccess(access).expect(200);
    const { sub, sid } = await claimsOf(access);
    const now = Math.floor(Date.now() / 1000);

    // RFC 7519 §6: an unsecured JWT has alg "none" and an empty signature.
    const none = jwt({ alg: 'none', typ: 'JWT' }, { sub, sid, iat: now, exp: now + 600 });
    expect((await asAccess(none)).status).toBe(401);

    const wrongKey = jwt(
      { alg: 'HS256', typ: 'JWT' },
      { sub, sid, iat: now, exp: now + 600 },
      'not the secret',
    );
    expect((await asAccess(wrongKey)).status).toBe(401);

    const [h, , s] = access.split('.');
    const swapped = `${h}.${b64url({ sub: '00000000-0000-4000-8000-000000000000', sid, iat: now, exp: now + 600 })}.${s}`;
    expect((await asAccess(swapped)).status).toBe(401);

    const expired = jwt({ alg: 'HS256', typ: 'JWT' }, { sub, sid, iat: now - 3600, exp: now - 60 }, secret);
    const res = await asAccess(expired);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');

    // A correctly signed token for a revoked session is refused too.
    const good = jwt({ alg: 'HS256', typ: 'JWT' }, { sub, sid, iat: now, exp: now + 600 }, secret);
    await asAccess(good).expect(200);
    await request(t.app.getHttpServer())
      .post('/api/auth/session/sign-out')
      .set(W)
      .set('Cookie', `beadroll_access=${access}`)
      .expect(204);
    expect((await asAccess(good)).status).toBe(401);
  });

  it('rotates the refresh token, and a reused one ends the whole session', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const first = await signInRaw(a.email, a.password);
    const refresh = (token: string) =>
      request(t.app.getHttpServer())
        .post('/api/auth/session/refresh')
        .set(W)
        .set('Cookie', `beadroll_refresh=${token}`);

    const r1 = await refresh(first.refresh).expect(200);
    const second = {
      access: cookieValue(r1.headers['set-cookie'], 'beadroll_access'),
      refresh: cookieValue(r1.headers['set-cookie'], 'beadroll_refresh'),
    };
    expect(second.refresh).not.toBe(first.refresh);
    await asAccess(second.access).expect(200);

    // The first token again: someone copied it. The session ends for everyone holding it.
    const reuse = await refresh(first.refresh).expect(401);
    expect(reuse.body.error.code).toBe('session_invalid');
    await refresh(second.refresh).expect(401);
    expect((await asAccess(second.access)).status).toBe(401);

    await refresh('made-up-token').expect(401);
    const none = await request(t.app.getHttpServer()).post('/api/auth/session/refresh').set(W).expect(200);
    expect(none.body).toEqual({ account: null });
  });

  it('stores refresh and e-mail tokens only as SHA-256 digests', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const { refresh } = await signInRaw(a.email, a.password);
    const { DataSource } = await import('typeorm');
    const rows: Array<{ token_hash: string }> = await t.app
      .get(DataSource)
      .query(`SELECT token_hash FROM refresh_tokens`);
    expect(rows.some((r) => r.token_hash.includes(refresh))).toBe(false);
    // FIPS 180-4 SHA-256 of the raw token, hex: what the table holds.
    const { createHash } = await import('node:crypto');
    expect(rows.map((r) => r.token_hash)).toContain(createHash('sha256').update(refresh).digest('hex'));
  });

  it('hashes at the production scrypt cost (N=2^17, r=8, p=1) and verifies the result', async () => {
    const production = loadConfig({});
    expect(production.scrypt).toEqual({ cost: 131072, blockSize: 8, parallelization: 1, concurrency: 1 });
    const service = new PasswordsService(production);
    const hash = await service.hash('correct horse battery staple');
    expect(hash).toMatch(/^scrypt\$131072\$8\$1\$/);
    expect(await service.verify('correct horse battery staple', hash)).toBe(true);
    expect(await service.verify('correct horse battery stapl', hash)).toBe(false);
  });

  it('matches the scrypt test vector of RFC 7914 §12 through node:crypto', async () => {
    const { scryptSync } = await import('node:crypto');
    // RFC 7914 §12: P="password", S="NaCl", N=1024, r=8, p=16, dkLen=64.
    const dk = scryptSync('password', 'NaCl', 64, { N: 1024, r: 8, p: 16 }).toString('hex');
    expect(dk).toBe(
      'fdbabe1c9d3472007856e7190d01e9fe7c6ad7cbc8237830e77376634b3731622eaf30d92e22a3886ff109279d9830dac727afb94a83ee6d8360cbdfa2cc0640',
    );
  });
});

describe('rate limits and the development mailbox', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ THROTTLE_LIMIT: '3', THROTTLE_TTL_MS: '60000', DEV_MAILBOX: 'false' });
  });
  afterAll(async () => {
    await t.close();
  });

  it('locks out repeated sign-in attempts and says when to retry', async () => {
    const attempt = () =>
      request(t.app.getHttpServer())
        .post('/api/auth/sign-in')
        .set(W)
        .send({ email: 'who@example.invalid', password: 'guess guess guess' });
    for (let i = 0; i < 3; i++) expect((await attempt()).status).toBe(401);
    const locked = await attempt();
    expect(locked.status).toBe(429);
    expect(locked.body.error.code).toBe('rate_limited');
    expect(locked.body.error.message).toMatch(/try again in \d+ (seconds|minutes)/);
    expect(Number(locked.headers['retry-after'])).toBeGreaterThan(0);
  });

  it('has no mailbox page unless DEV_MAILBOX is on', async () => {
    await request(t.app.getHttpServer()).get('/dev/mailbox').expect(404);
  });
});
