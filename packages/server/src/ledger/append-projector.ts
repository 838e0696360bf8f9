import { Injectable, type OnModuleInit } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import { LedgerService } from './ledger.service';
import type { AppendedEntry, RollProjector } from './ledger.types';

/**
 * A projector that keeps a feature's rows in step with the rolls: once its module has started,
 * it runs inside every append transaction of the ledger.
 */
@Injectable()
export abstract class AppendProjector implements RollProjector, OnModuleInit {
  constructor(private readonly ledger: LedgerService) {}

  onModuleInit(): void {
    this.ledger.addProjector(this);
  }

  abstract project(m: EntityManager, lotId: string, entry: AppendedEntry): Promise<void>;
}
