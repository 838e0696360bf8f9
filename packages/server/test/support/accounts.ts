import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { Account } from '../../src/accounts/entities/account.entity';
import type { AccountStatus, Role } from '../../src/auth/auth.decorators';
import { PasswordsService } from '../../src/auth/passwords.service';
import { readThrough, type TestApp } from './test-app';

/** Every field of a dealer's public card, sorted: nothing the dealer keeps private (e-mail, address). */
export const PUBLIC_CARD_FIELDS = [
  'business',
  'country',
  'displayName',
  'handle',
  'id',
  'role',
  'status',
  'town',
  'verifiedSince',
];

export interface CreateAccountOptions {
  role: Role;
  status?: AccountStatus;
  handle?: string;
  displayName?: string;
  business?: string;
  town?: string;
  country?: string;
}

export interface TestAccount {
  id: string;
  handle: string;
  email: string;
  password: string;
  /** Already signed in: holds the session cookies. Add `.set('X-Beadroll-Request', '1')` on non-GET requests. */
  agent: import('supertest').Agent;
}

let counter = 0;

/**
 * Creates an account straight in the database (e-mail confirmed; verified unless `status` says
 * otherwise) and signs it in through the real sign-in route.
 */
export async function createAccount(t: TestApp, opts: CreateAccountOptions): Promise<TestAccount> {
  counter += 1;
  const handle = opts.handle ?? `${opts.role}-${counter}-${randomBytes(3).toString('hex')}`;
  const email = `${handle}@example.invalid`;
  const password = `pw-${randomBytes(9).toString('base64url')}`;
  const status = opts.status ?? 'verified';
  const repo = t.app.get(DataSource).getRepository(Account);
  const account = await repo.save(
    repo.create({
      role: opts.role,
      status,
      handle,
      email,
      displayName: opts.displayName ?? `Test ${opts.role} ${counter}`,
      business: opts.business ?? `Test Beads ${counter}`,
      town: opts.town ?? 'Incalmo Ford',
      country: opts.country ?? 'Gather Marches',
      passwordHash: await t.app.get(PasswordsService).hash(password),
      emailVerifiedAt: new Date(),
      verifiedAt: status === 'verified' || status === 'suspended' ? new Date() : null,
      statusReason: null,
    }),
  );
  const agent = await signIn(t, email, password);
  return { id: account.id, handle, email, password, agent };
}

/** A new agent signed in with the given e-mail and password (fails the test if sign-in fails). */
export async function signIn(
  t: TestApp,
  email: string,
  password: string,
): Promise<import('supertest').Agent> {
  const agent = request.agent(t.app.getHttpServer());
  await agent.post('/api/auth/sign-in').set('X-Beadroll-Request', '1').send({ email, password }).expect(200);
  return agent;
}

/**
 * An account for the tests of the enclosing `describe`, created (as {@link createAccount} does)
 * before them; declare it after `useTestApp`, whose app it needs. Reads through to the account.
 */
export function useAccount(t: TestApp, opts: CreateAccountOptions): TestAccount {
  let a: TestAccount | undefined;
  beforeAll(async () => {
    a = await createAccount(t, opts);
  });
  return readThrough(() => a, ['id', 'handle', 'email', 'password', 'agent']);
}
