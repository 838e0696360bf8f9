import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { LogLeavesModule } from '../ledger/log-leaves.module';
import { CheckpointsService } from './checkpoints.service';
import { LogController } from './log.controller';
import { LogTreeService } from './log-tree.service';
import { LogService } from './log.service';
import { WitnessesController } from './witnesses.controller';
import { WitnessesService } from './witnesses.service';

/**
 * The ledger-wide log: signed checkpoints, proofs, and witnesses. The ledger gives entries their
 * log indices (ledger/log-sequencer); this module reads them through LogLeavesService.
 */
@Module({
  imports: [AuthModule, LogLeavesModule],
  controllers: [LogController, WitnessesController],
  providers: [LogTreeService, CheckpointsService, LogService, WitnessesService],
  exports: [LogService, CheckpointsService],
})
export class LogModule {}
