import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository, type EntityManager } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { Account } from './entities/account.entity';

/** The columns a new account is made with (the id, stamps and defaults are the table's). */
export type NewAccount = Pick<
  Account,
  | 'role'
  | 'status'
  | 'handle'
  | 'email'
  | 'displayName'
  | 'business'
  | 'town'
  | 'country'
  | 'passwordHash'
  | 'emailVerifiedAt'
  | 'verifiedAt'
  | 'statusReason'
> &
  Partial<
    Pick<
      Account,
      | 'id'
      | 'address'
      | 'website'
      | 'tradeReferences'
      | 'documentSha256'
      | 'documentType'
      | 'documentSize'
      | 'documentName'
    >
  >;

/** The name a closed account goes by. */
const FORMER_NAME = 'Former dealer';

/** A uuid: roll actors such as the system account are not account ids. */
const ACCOUNT_ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The accounts table and nothing else: sign-in, sign-up, letters and offers read and change
 * accounts through this service.
 */
@Injectable()
export class AccountsService {
  constructor(@InjectRepository(Account) private readonly accounts: Repository<Account>) {}

  /** The account with this id, whatever its status, or null. */
  find(id: string): Promise<Account | null> {
    return this.accounts.findOne({ where: { id } });
  }

  /** The accounts with these ids (ids that are not account ids are left out), in no order. */
  async findMany(ids: readonly string[]): Promise<Account[]> {
    const valid = [...new Set(ids)].filter((id) => ACCOUNT_ID.test(id));
    return valid.length ? this.accounts.find({ where: { id: In(valid) } }) : [];
  }

  /** The account with this address, without regard to case, or null. */
  findByEmail(email: string): Promise<Account | null> {
    return this.accounts.createQueryBuilder('a').where('lower(a.email) = lower(:email)', { email }).getOne();
  }

  /** The account with this handle, or null. */
  findByHandle(handle: string): Promise<Account | null> {
    return this.accounts.findOne({ where: { handle } });
  }

  handleTaken(handle: string): Promise<boolean> {
    return this.accounts.exists({ where: { handle } });
  }

  /** Stores a new account; a taken handle or address fails with the database's unique violation. */
  create(fields: NewAccount, m?: EntityManager): Promise<Account> {
    const accounts = m ? m.getRepository(Account) : this.accounts;
    return accounts.save(accounts.create(fields));
  }

  /** Changes the given columns of one account. */
  async update(id: string, patch: Partial<Pick<Account, 'passwordHash' | 'emailVerifiedAt'>>): Promise<void> {
    await this.accounts.update({ id }, patch);
  }

  /** The verified registrars (who hear of new applications). */
  registrars(): Promise<Account[]> {
    return this.accounts.find({ where: { role: 'registrar', status: 'verified' } });
  }

  /** Verified dealers other than `except` whose name, handle or business contains `q`; at most `limit`. */
  searchDealers(q: string, except: string, limit: number): Promise<Account[]> {
    const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    return this.accounts
      .createQueryBuilder('a')
      .where(`a.role = 'dealer' AND a.status = 'verified' AND a.id <> :me`, { me: except })
      .andWhere('(a.displayName ILIKE :like OR a.handle ILIKE :like OR a.business ILIKE :like)', { like })
      .orderBy('a.displayName', 'ASC')
      .limit(limit)
      .getMany();
  }

  /** Whether the id names a verified assessor (ids that are not account ids never do). */
  async isVerifiedAssessor(id: string, manager?: EntityManager): Promise<boolean> {
    if (!ACCOUNT_ID.test(id)) return false;
    const accounts = manager ? manager.getRepository(Account) : this.accounts;
    return accounts.exists({ where: { id, role: 'assessor', status: 'verified' } });
  }

  /** Verified assessors by display name whose name, handle or business contains `text` (all when empty); at most 50. */
  searchAssessors(text: string): Promise<Account[]> {
    const q = this.accounts
      .createQueryBuilder('a')
      .where(`a.role = 'assessor' AND a.status = 'verified'`)
      .orderBy('a.displayName', 'ASC')
      .limit(50);
    if (text !== '')
      q.andWhere('(a.displayName ILIKE :like OR a.handle ILIKE :like OR a.business ILIKE :like)', {
        like: `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
      });
    return q.getMany();
  }

  /**
   * Closes an account in the caller's transaction: its name, contact details, document and
   * password are replaced or cleared, its handle and address become unusable placeholders.
   * The id stays (roll entries keep it).
   */
  async close(id: string, m: EntityManager): Promise<void> {
    const anon = id.replace(/-/g, '');
    await m.getRepository(Account).update(
      { id },
      {
        status: 'closed',
        handle: `former-${anon.slice(0, 24)}`,
        email: `${anon}@closed.beadroll.invalid`,
        displayName: FORMER_NAME,
        business: '',
        town: '',
        country: '',
        address: '',
        website: null,
        tradeReferences: '',
        documentSha256: null,
        documentType: null,
        documentSize: null,
        documentName: null,
        passwordHash: null,
        statusReason: null,
      },
    );
  }

  /** Whether an account's application document is the file with this SHA-256. */
  namesDocument(sha256: string, m: EntityManager): Promise<boolean> {
    return m.getRepository(Account).exists({ where: { documentSha256: sha256 } });
  }

  /** The principal of an account that is not closed, as the guard hands it to routes; or null. */
  async principal(id: string): Promise<Principal | null> {
    const a = ACCOUNT_ID.test(id) ? await this.accounts.findOne({ where: { id } }) : null;
    if (!a || a.status === 'closed') return null;
    return { id: a.id, role: a.role, status: a.status, handle: a.handle, displayName: a.displayName };
  }
}
