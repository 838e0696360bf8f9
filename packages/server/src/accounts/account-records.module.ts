import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsService } from './accounts.service';
import { Account } from './entities/account.entity';

/**
 * The accounts table behind {@link AccountsService}. It needs nothing else, so the sign-in module
 * (which the account pages need) can import it without a cycle.
 */
@Module({
  imports: [TypeOrmModule.forFeature([Account])],
  providers: [AccountsService],
  exports: [AccountsService],
})
export class AccountRecordsModule {}
