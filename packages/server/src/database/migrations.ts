import type { MigrationInterface } from 'typeorm';
import { CreateAccounts1767200000000 } from '../migrations/1767200000000-CreateAccounts';
import { CreateLedger1796157689568 } from '../migrations/1796157689568-CreateLedger';
import { CreateTransfers1796159943028 } from '../migrations/1796159943028-CreateTransfers';
import { CreateRegistrarTools1796161169142 } from '../migrations/1796161169142-CreateRegistrarTools';
import { CreateExhibits1796160000000 } from '../migrations/1796160000000-CreateExhibits';
import { AddExhibitSentDigest1796172657749 } from '../migrations/1796172657749-AddExhibitSentDigest';
import { AddSaleVoidedKind1796180000000 } from '../migrations/1796180000000-AddSaleVoidedKind';

// Every migration class, in order: add new ones at the end, never edit one that has landed.
export const MIGRATIONS: Array<new () => MigrationInterface> = [
  CreateAccounts1767200000000,
  CreateLedger1796157689568,
  CreateTransfers1796159943028,
  CreateExhibits1796160000000,
  CreateRegistrarTools1796161169142,
  AddExhibitSentDigest1796172657749,
  AddSaleVoidedKind1796180000000,
];
