import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { Account } from '../accounts/entities/account.entity';
import { AppError } from '../common/app-error';
import { PasswordsService } from './passwords.service';
import { type IssuedSession, SessionsService } from './sessions.service';

/** Sign-in and the flows around it. */
@Injectable()
export class AuthService {
  constructor(
    @InjectRepository(Account) private readonly accounts: Repository<Account>,
    private readonly passwords: PasswordsService,
    private readonly sessions: SessionsService,
  ) {}

  /** Checks e-mail and password and starts a session. Unverified e-mail addresses cannot sign in yet. */
  async signIn(email: string, password: string): Promise<{ account: Account; session: IssuedSession }> {
    const account = await this.findByEmail(email);
    const usable = account && account.status !== 'closed' ? account : null;
    const ok = await this.passwords.verify(password, usable?.passwordHash ?? null);
    if (!usable || !ok) throw new AppError('invalid_credentials', 'The e-mail address or password is wrong.');
    if (!usable.emailVerifiedAt) {
      throw new AppError(
        'email_unverified',
        'Please confirm your e-mail address first: open the link in the message we sent you.',
      );
    }
    return { account: usable, session: await this.sessions.start(usable.id) };
  }

  async me(accountId: string): Promise<Account> {
    const account = await this.accounts.findOne({ where: { id: accountId } });
    if (!account) throw new AppError('unauthenticated', 'Please sign in.');
    return account;
  }

  findByEmail(email: string): Promise<Account | null> {
    return this.accounts
      .createQueryBuilder('a')
      .where('lower(a.email) = lower(:email)', { email: email.trim() })
      .getOne();
  }
}
