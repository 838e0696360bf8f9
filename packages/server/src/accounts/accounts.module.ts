import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { AccountController } from './account.controller';
import { DealerCardsService } from './dealer-cards.service';
import { DealersController } from './dealers.controller';
import { RegistryController } from './registry.controller';
import { RegistryService } from './registry.service';
import { AccountContactsService } from './account-contacts.service';

/** The account page, the registrar's queue and the public dealer cards. Import it for DealerCardsService. */
@Module({
  imports: [AuthModule],
  controllers: [AccountController, RegistryController, DealersController],
  providers: [RegistryService, DealerCardsService, AccountContactsService],
  exports: [DealerCardsService, RegistryService, AccountContactsService],
})
export class AccountsModule {}
