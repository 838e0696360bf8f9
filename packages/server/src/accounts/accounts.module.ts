import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuthModule } from '../auth/auth.module';
import { AccountController } from './account.controller';
import { DealerCardsService } from './dealer-cards.service';
import { DealersController } from './dealers.controller';
import { RegistryController } from './registry.controller';
import { RegistryService } from './registry.service';
import { AccountContactsService } from './account-contacts.service';
import { AccountRecordsModule } from './account-records.module';
import { Account } from './entities/account.entity';

/**
 * The account page, the registrar's queue and the public dealer cards. Import it for
 * DealerCardsService, or for AccountsService (re-exported from AccountRecordsModule).
 */
@Module({
  imports: [AuthModule, AccountRecordsModule, TypeOrmModule.forFeature([Account])],
  controllers: [AccountController, RegistryController, DealersController],
  providers: [RegistryService, DealerCardsService, AccountContactsService],
  exports: [DealerCardsService, RegistryService, AccountContactsService, AccountRecordsModule],
})
export class AccountsModule {}
