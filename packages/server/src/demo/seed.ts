// The demo loader (`node dist/demo/seed.js`, run by `npm start` and the browser tests): loads the
// invented scenario in seed-demo/ through the server's own services, idempotently and the same way
// on every machine, then writes DATA_DIR/demo-report.json for the start banner.
import 'reflect-metadata';
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { INestApplicationContext } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { AccountsService } from '../accounts/accounts.service';
import type { Account } from '../accounts/entities/account.entity';
import { AppModule } from '../app.module';
import { PasswordsService } from '../auth/passwords.service';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { seedTransfers } from '../transfers/demo-transfers';
import { seedOpinions } from '../opinions/demo-opinions';
import { seedLots } from './demo-lots';
import { loadDemoLineage } from '../lineage/lineage.seed';
import { seedExhibits } from './demo-exhibits';

/** Where the scenario files live (the repository's seed-demo folder). */
export const SEED_DIR = resolve(__dirname, '..', '..', '..', '..', 'seed-demo');

/** What the start command prints: the demo sign-ins and a few public lot pages. */
export interface DemoReport {
  signIns: { role: string; name: string; email: string; password: string }[];
  publicLots: { code: string; why: string }[];
}

/** Shared between steps: account ids by handle (filled by the accounts step) and the report. */
export interface SeedContext {
  accounts: Record<string, string>;
  report: DemoReport;
  config: AppConfig;
}

/** One part of the scenario. Each step must be idempotent: a second run finds its data and changes nothing. */
export type SeedStep = (app: INestApplicationContext, ctx: SeedContext) => Promise<void>;

/** An account of the demo, as seed-demo/accounts.json gives it. */
type DemoAccount = Pick<
  Account,
  'role' | 'status' | 'handle' | 'email' | 'displayName' | 'business' | 'town' | 'country'
>;

/** Reads a JSON file from seed-demo/. */
export function readSeedFile<T>(name: string): T {
  return JSON.parse(readFileSync(join(SEED_DIR, name), 'utf8')) as T;
}

/** A stable account id for a demo handle, so ids (and anything derived from them) match on every machine. */
function demoId(handle: string): string {
  const h = createHash('sha256').update(`beadroll demo account ${handle}`).digest('hex');
  const variant = ((parseInt(h[16], 16) & 0x3) | 0x8).toString(16);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** The demo accounts: a registrar, verified dealers, a verified assessor and one pending applicant. */
export const seedAccounts: SeedStep = async (app, ctx) => {
  const file = readSeedFile<{ password: string; accounts: DemoAccount[] }>('accounts.json');
  const accounts = app.get(AccountsService);
  const passwords = app.get(PasswordsService);
  const hash = await passwords.hash(file.password);
  // The scenario's dates are fixed so the cards read the same everywhere.
  const since = new Date('2025-03-01T09:00:00Z');
  for (const a of file.accounts) {
    const row =
      (await accounts.findByHandle(a.handle)) ??
      (await accounts.create({
        ...a,
        id: demoId(a.handle),
        passwordHash: hash,
        emailVerifiedAt: since,
        verifiedAt: a.status === 'verified' ? since : null,
        statusReason: null,
      }));
    ctx.accounts[a.handle] = row.id;
    ctx.report.signIns.push({ role: a.role, name: a.displayName, email: a.email, password: file.password });
  }
};

/** A split strand and a combined necklace; one listed split child goes on the start banner. */
export const seedLineage: SeedStep = async (app, ctx) => {
  const { splitChildren, piece } = await loadDemoLineage(app, readSeedFile('lineage.json'), ctx.accounts);
  ctx.report.publicLots.push({ code: splitChildren[0]!, why: 'split child' });
  ctx.report.publicLots.push({ code: piece, why: 'combined piece' });
};

/** Every step, in order. A feature adds its own with one line here. */
export const SEED_STEPS: SeedStep[] = [
  seedAccounts,
  seedLots,
  seedExhibits,
  seedOpinions,
  seedTransfers,
  seedLineage,
];

/** Runs every step on an application context and writes the report. */
export async function runSeed(
  app: INestApplicationContext,
  steps: SeedStep[] = SEED_STEPS,
): Promise<DemoReport> {
  const config = app.get<AppConfig>(APP_CONFIG);
  const ctx: SeedContext = { accounts: {}, report: { signIns: [], publicLots: [] }, config };
  for (const step of steps) await step(app, ctx);
  mkdirSync(config.dataDir, { recursive: true });
  writeFileSync(join(config.dataDir, 'demo-report.json'), JSON.stringify(ctx.report, null, 2) + '\n');
  return ctx.report;
}

async function main(): Promise<void> {
  const app = await NestFactory.createApplicationContext(AppModule, { logger: ['error', 'warn'] });
  try {
    if (!app.get<AppConfig>(APP_CONFIG).demoMode) {
      throw new Error('the demo scenario loads only in demo mode (DEMO_MODE=true): its passwords are public');
    }
    const report = await runSeed(app);
    console.log(`demo scenario: ${report.signIns.length} sign-ins, ${report.publicLots.length} public lots`);
  } finally {
    await app.close();
  }
}

if (require.main === module) {
  main().catch((err: unknown) => {
    console.error(err instanceof Error ? (err.stack ?? err.message) : err);
    process.exit(1);
  });
}
