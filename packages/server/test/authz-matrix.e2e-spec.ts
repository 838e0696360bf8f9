import request from 'supertest';
import { createAccount, signIn } from './support/accounts';
import { type Access, AUTHZ_TABLE } from './support/authz-table';
import { type TestApp, useTestApp } from './support/test-app';

type Who = 'anonymous' | 'pending' | 'suspended' | 'dealer' | 'assessor' | 'registrar';
const WHO: Who[] = ['anonymous', 'pending', 'suspended', 'dealer', 'assessor', 'registrar'];
const GUARD_DENIALS = new Set(['unauthenticated', 'forbidden', 'not_verified']);

function allowed(access: Access, who: Who): boolean {
  if (access === 'public') return true;
  if (who === 'anonymous') return false;
  const role = who === 'pending' || who === 'suspended' ? 'dealer' : who;
  const verified = who !== 'pending' && who !== 'suspended';
  if (access === 'signed-in') return true;
  if (access === 'roll-writer') return verified;
  return access.roles.includes(role) && (!access.writer || verified);
}

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  name?: string;
  handle?: { stack?: Layer[] };
}

/** Every route registered on the Express router Nest built, as 'METHOD /path'. */
function routesOf(t: TestApp): string[] {
  const express = t.app.getHttpAdapter().getInstance() as {
    router?: { stack: Layer[] };
    _router?: { stack: Layer[] };
  };
  const out = new Set<string>();
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        // Handlers bound for every method are Nest's middleware and not-found plumbing, not routes.
        if (Object.keys(layer.route.methods).length > 10) continue;
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') for (const p of paths) out.add(`${method.toUpperCase()} ${p}`);
        }
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk((express.router ?? express._router)!.stack);
  return [...out].sort();
}

/** A concrete path for a route pattern: parameters get a well-formed id that matches nothing. */
function concrete(path: string): string {
  return path
    .replace(/\{?\*[A-Za-z]+\}?/g, 'x')
    .replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
}

describe('authorisation matrix', () => {
  const creds: Partial<Record<Who, { email: string; password: string }>> = {};

  const t = useTestApp();
  beforeAll(async () => {
    creds.pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    creds.suspended = await createAccount(t, { role: 'dealer', status: 'suspended' });
    creds.dealer = await createAccount(t, { role: 'dealer' });
    creds.assessor = await createAccount(t, { role: 'assessor' });
    creds.registrar = await createAccount(t, { role: 'registrar' });
  });

  it('lists every route of the server in the table, and nothing that is not a route', () => {
    const routes = routesOf(t);
    expect(routes.length).toBeGreaterThan(3);
    expect(routes.filter((r) => !(r in AUTHZ_TABLE))).toEqual([]);
    expect(Object.keys(AUTHZ_TABLE).filter((r) => !routes.includes(r))).toEqual([]);
  });

  it.each(Object.entries(AUTHZ_TABLE))(
    '%s answers each kind of account as declared',
    async (route, access) => {
      const [method, path] = route.split(' ');
      for (const who of WHO) {
        // A fresh sign-in per request, so a route that ends sessions cannot spoil the next check.
        const c = creds[who];
        const agent = c ? await signIn(t, c.email, c.password) : request.agent(t.app.getHttpServer());
        let req = agent[method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete'](concrete(path));
        if (method !== 'GET' && method !== 'HEAD') req = req.set('X-Beadroll-Request', '1').send({});
        const res = await req;
        const code: string | undefined = res.body?.error?.code;
        const denied =
          (res.status === 401 || res.status === 403) && code !== undefined && GUARD_DENIALS.has(code);
        expect({ who, route, denied }).toEqual({ who, route, denied: !allowed(access, who) });
      }
    },
  );
});
