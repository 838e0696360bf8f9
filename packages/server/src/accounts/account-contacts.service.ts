import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Not, Repository } from 'typeorm';
import { Account } from './entities/account.entity';

/** Where to write to an account: its address and the name letters greet it by. */
export interface AccountContact {
  id: string;
  email: string;
  displayName: string;
}

/** The accounts module's answer to "how do we reach this account", for other modules' letters. */
@Injectable()
export class AccountContactsService {
  constructor(@InjectRepository(Account) private readonly accounts: Repository<Account>) {}

  /** The contact of an account that is not closed, or null (a closed account has no address). */
  async contactOf(id: string): Promise<AccountContact | null> {
    // Roll actors such as the system account are not account ids.
    if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) return null;
    const a = await this.accounts.findOne({ where: { id, status: Not('closed') } });
    return a ? { id: a.id, email: a.email, displayName: a.displayName } : null;
  }
}
