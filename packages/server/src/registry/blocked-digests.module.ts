import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BlockedDigestsService } from './blocked-digests.service';
import { BlockedDigest } from './entities/blocked-digest.entity';

/**
 * The blocked-digest list on its own, so that uploads can consult it without depending on the
 * rest of the registrar's tools (which depend on accounts, auth and the ledger).
 */
@Module({
  imports: [TypeOrmModule.forFeature([BlockedDigest])],
  providers: [BlockedDigestsService],
  exports: [BlockedDigestsService],
})
export class BlockedDigestsModule {}
