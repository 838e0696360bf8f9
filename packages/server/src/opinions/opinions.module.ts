import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsModule } from '../accounts/accounts.module';
import { Account } from '../accounts/entities/account.entity';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { AttributionAidController } from './attribution-aid.controller';
import { OpinionsController } from './opinions.controller';
import { OpinionsService } from './opinions.service';

/** Attribution opinions, their withdrawal and the holder's answers; the attribution aid route. */
@Module({
  imports: [LedgerModule, LotsModule, AccountsModule, TypeOrmModule.forFeature([Account])],
  controllers: [OpinionsController, AttributionAidController],
  providers: [OpinionsService],
})
export class OpinionsModule {}
