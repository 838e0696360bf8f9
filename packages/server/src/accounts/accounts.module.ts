import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { AccountController } from './account.controller';
import { DealerCardsService } from './dealer-cards.service';
import { DealersController } from './dealers.controller';
import { RegistryController } from './registry.controller';
import { RegistryService } from './registry.service';

/** The account page, the registrar's queue and the public dealer cards. Import it for DealerCardsService. */
@Module({
  imports: [AuthModule],
  controllers: [AccountController, RegistryController, DealersController],
  providers: [RegistryService, DealerCardsService],
  exports: [DealerCardsService, RegistryService],
})
export class AccountsModule {}
