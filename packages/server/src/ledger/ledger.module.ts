import { Module } from '@nestjs/common';
import { secureRandom } from '@beadroll/core';
import { BundleService } from './bundle.service';
import { LedgerClock } from './ledger.clock';
import { LedgerService } from './ledger.service';
import { LEDGER_RANDOM } from './ledger.tokens';
import { RollReaderService } from './roll-reader.service';
import { LogModule } from '../log/log.module';
import { LogLeavesModule } from './log-leaves.module';

/** The ledger: the one append path, roll reading and bundles. */
@Module({
  imports: [LogModule, LogLeavesModule],
  providers: [
    LedgerService,
    RollReaderService,
    BundleService,
    LedgerClock,
    { provide: LEDGER_RANDOM, useValue: secureRandom },
  ],
  exports: [LedgerService, RollReaderService, BundleService, LedgerClock, LogLeavesModule, LogModule],
})
export class LedgerModule {}
