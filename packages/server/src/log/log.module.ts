import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { CheckpointsService } from './checkpoints.service';
import { LogController } from './log.controller';
import { LogTreeService } from './log-tree.service';
import { LogService } from './log.service';
import { WitnessesController } from './witnesses.controller';
import { WitnessesService } from './witnesses.service';

/**
 * The ledger-wide log: signed checkpoints, proofs, and witnesses. Entries get their log indices
 * in the ledger's append transaction (ledger/log-sequencer); this module reads them.
 */
@Module({
  imports: [AuthModule],
  controllers: [LogController, WitnessesController],
  providers: [LogTreeService, CheckpointsService, LogService, WitnessesService],
  exports: [LogService, CheckpointsService],
})
export class LogModule {}
