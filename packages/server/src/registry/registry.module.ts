import { Module, type OnModuleInit } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsModule } from '../accounts/accounts.module';
import { RegistryService } from '../accounts/registry.service';
import { AuthModule } from '../auth/auth.module';
import { LedgerModule } from '../ledger/ledger.module';
import { StorageModule } from '../storage/storage.module';
import { TransfersModule } from '../transfers/transfers.module';
import { BlockedDigestsModule } from './blocked-digests.module';
import { ExhibitsModule } from '../exhibits/exhibits.module';
import { RedactionRequest } from './entities/redaction-request.entity';
import { RegistrarAction } from './entities/registrar-action.entity';
import { Report } from './entities/report.entity';
import { OfferLapseService } from '../transfers/offer-lapse.service';
import { PersonalDataController } from './personal-data.controller';
import { PersonalDataService } from './personal-data.service';
import { RedactionRequestsController, RedactionsController } from './redactions.controller';
import { RedactionsService } from './redactions.service';
import { RegistrarRecordController } from './registrar-record.controller';
import { RegistrarRecordService } from './registrar-record.service';
import { PublicReportsController, ReportsController } from './reports.controller';
import { ReportsService } from './reports.service';
import { LotViewsModule } from '../lots/lot-views.module';

/**
 * The registrar's tools: redaction (and holders' requests), the blocked-digest list, reports
 * from public pages, the append-only record of decisions, lapsing a suspended account's open
 * offers, and a dealer's own data (download, closing the account). The blocked-digest list is
 * its own small module (BlockedDigestsModule), which uploads import.
 */
@Module({
  imports: [
    TypeOrmModule.forFeature([RegistrarAction, RedactionRequest, Report]),
    BlockedDigestsModule,
    AuthModule,
    AccountsModule,
    LedgerModule,
    StorageModule,
    TransfersModule,
    LotViewsModule,
    ExhibitsModule,
  ],
  controllers: [
    RedactionsController,
    RedactionRequestsController,
    PublicReportsController,
    ReportsController,
    RegistrarRecordController,
    PersonalDataController,
  ],
  providers: [RegistrarRecordService, RedactionsService, ReportsService, PersonalDataService],
  exports: [BlockedDigestsModule, RedactionsService, RegistrarRecordService],
})
export class RegistryToolsModule implements OnModuleInit {
  constructor(
    private readonly registry: RegistryService,
    private readonly record: RegistrarRecordService,
    private readonly lapse: OfferLapseService,
  ) {}

  onModuleInit(): void {
    this.registry.onDecision(async (d) => {
      await this.record.record({
        actor: d.registrar,
        action: d.action,
        subject: d.account,
        reason: d.reason,
      });
      if (d.action === 'suspended') await this.lapse.lapseOffersOf(d.account);
    });
  }
}
