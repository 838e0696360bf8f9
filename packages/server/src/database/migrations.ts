import type { MigrationInterface } from 'typeorm';
import { CreateAccounts1767200000000 } from '../migrations/1767200000000-CreateAccounts';
import { CreateLedger1796157689568 } from '../migrations/1796157689568-CreateLedger';
import { CreateTransfers1796159943028 } from '../migrations/1796159943028-CreateTransfers';
import { CreateRegistrarTools1796161169142 } from '../migrations/1796161169142-CreateRegistrarTools';
import { CreateExhibits1796160000000 } from '../migrations/1796160000000-CreateExhibits';
import { AddExhibitSentDigest1796172657749 } from '../migrations/1796172657749-AddExhibitSentDigest';
import { CreateRateLimits1796470946374 } from '../migrations/1796470946374-CreateRateLimits';
import { RefreshCachedRollState1796471607047 } from '../migrations/1796471607047-RefreshCachedRollState';
import { CreateIdempotencyKeys1796480000000 } from '../migrations/1796480000000-CreateIdempotencyKeys';
import { CreateLog1796490000000 } from '../migrations/1796490000000-CreateLog';
import { InventorySearch1796490300000 } from '../migrations/1796490300000-InventorySearch';
import { OpinionRequests1796490400000 } from '../migrations/1796490400000-OpinionRequests';
import { ApplicantDetails1796490500000 } from '../migrations/1796490500000-ApplicantDetails';
import { AddSaleVoidedKind1796490600000 } from '../migrations/1796490600000-AddSaleVoidedKind';
import { InheritedAttributionInSearch1796490800000 } from '../migrations/1796490800000-InheritedAttributionInSearch';
import { OpinionRequestsOnTheRoll1796490900000 } from '../migrations/1796490900000-OpinionRequestsOnTheRoll';
import { ApplicantDocument1796491000000 } from '../migrations/1796491000000-ApplicantDocument';
import { CheckpointOrigins1796491100000 } from '../migrations/1796491100000-CheckpointOrigins';
import { HolderInventoryOrder1796491200000 } from '../migrations/1796491200000-HolderInventoryOrder';

// Every migration class, in order: add new ones at the end, never edit one that has landed.
export const MIGRATIONS: Array<new () => MigrationInterface> = [
  CreateAccounts1767200000000,
  CreateLedger1796157689568,
  CreateTransfers1796159943028,
  CreateExhibits1796160000000,
  CreateRegistrarTools1796161169142,
  AddExhibitSentDigest1796172657749,
  CreateRateLimits1796470946374,
  RefreshCachedRollState1796471607047,
  CreateIdempotencyKeys1796480000000,
  CreateLog1796490000000,
  InventorySearch1796490300000,
  OpinionRequests1796490400000,
  ApplicantDetails1796490500000,
  AddSaleVoidedKind1796490600000,
  InheritedAttributionInSearch1796490800000,
  OpinionRequestsOnTheRoll1796490900000,
  ApplicantDocument1796491000000,
  CheckpointOrigins1796491100000,
  HolderInventoryOrder1796491200000,
];
