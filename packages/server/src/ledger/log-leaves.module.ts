import { Module } from '@nestjs/common';
import { LogLeavesService } from './log-leaves.service';
import { LogSequencer } from './log-sequencer';

/**
 * The ledger's numbering of entries for the ledger-wide log: the sequencer that gives each
 * committed entry its log index (and keeps the log's size), and the reads of both. Apart from
 * the rest of the ledger so the log module can import it without a cycle.
 */
@Module({
  providers: [LogSequencer, LogLeavesService],
  exports: [LogSequencer, LogLeavesService],
})
export class LogLeavesModule {}
