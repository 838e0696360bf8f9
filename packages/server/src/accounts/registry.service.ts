import type { Readable } from 'node:stream';
import { BLOB_STORE, type BlobStore } from '../storage/blob-store';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, IsNull, Not, Repository } from 'typeorm';
import { SessionsService } from '../auth/sessions.service';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import type { Letter } from '../mail/letters';
import { MailService } from '../mail/mail.service';
import { accountLetters } from './account-letters';
import {
  type ApplicantResponse,
  type RegistryPage,
  type RegistryQueryDto,
  toApplicantResponse,
} from './dto/registry.dto';
import { Account } from './entities/account.entity';

const SORT_COLUMNS = { applied: 'createdAt', business: 'business', town: 'town' } as const;

/** One decision of the registrar about an account, as listeners hear of it after it is saved. */
export interface RegistryDecision {
  action: 'approved' | 'rejected' | 'suspended' | 'reinstated';
  /** The registrar's account id. */
  registrar: string;
  account: string;
  reason: string | null;
}

/** Told of every decision once it is saved (the registrar's record, lapsing a suspended account's offers). */
export type RegistryDecisionListener = (d: RegistryDecision) => Promise<void>;

/** The registrar's work: the verification queue, approval, rejection, suspension. */
/** The registrar's decisions that move an account between two statuses, with the letter each sends. */
const MOVES: Record<
  'rejected' | 'suspended' | 'reinstated',
  {
    from: Account['status'];
    to: Account['status'];
    refused: string;
    letter: (name: string, reason: string) => Letter;
  }
> = {
  rejected: {
    from: 'pending',
    to: 'rejected',
    refused: 'only pending applications can be rejected',
    letter: (name, reason) => accountLetters.rejected(name, reason),
  },
  suspended: {
    from: 'verified',
    to: 'suspended',
    refused: 'only verified accounts can be suspended',
    letter: (name, reason) => accountLetters.suspended(name, reason),
  },
  reinstated: {
    from: 'suspended',
    to: 'verified',
    refused: 'only suspended accounts can be reinstated',
    letter: (name) => accountLetters.reinstated(name),
  },
};

@Injectable()
export class RegistryService {
  private readonly logger = new Logger('registry');
  private readonly approvalListeners: Array<(account: Account) => Promise<void>> = [];
  private readonly listeners: RegistryDecisionListener[] = [];

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @InjectRepository(Account) private readonly accounts: Repository<Account>,
    private readonly sessions: SessionsService,
    private readonly mail: MailService,
    @Inject(BLOB_STORE) private readonly blobs: BlobStore,
  ) {}

  /** An applicant's document, for the registrar only: its bytes, type and the name it was sent with. */
  async document(id: string): Promise<{ body: Readable; type: string; name: string; size: number }> {
    const a = await this.target(id);
    if (!a.documentSha256 || !a.documentType)
      throw new AppError('not_found', 'This applicant sent no document.');
    return {
      body: await this.blobs.get(a.documentSha256),
      type: a.documentType,
      name: a.documentName ?? 'document',
      size: a.documentSize ?? 0,
    };
  }

  /**
   * Adds work to run after an account is verified (for example offers waiting for it). A
   * listener's failure is logged; it never undoes the approval.
   */
  onApproved(listener: (account: Account) => Promise<void>): void {
    this.approvalListeners.push(listener);
  }

  /** Adds a listener told of every decision after it is saved. */
  onDecision(listener: RegistryDecisionListener): void {
    this.listeners.push(listener);
  }

  private async decided(d: RegistryDecision): Promise<void> {
    for (const l of this.listeners) await l(d);
  }

  /** Dealer and assessor accounts by status; the pending queue holds only confirmed e-mail addresses. */
  async list(q: RegistryQueryDto): Promise<RegistryPage> {
    const desc = q.sort.startsWith('-');
    const column = SORT_COLUMNS[q.sort.replace('-', '') as keyof typeof SORT_COLUMNS];
    const [rows, total] = await this.accounts.findAndCount({
      where: {
        role: In(['dealer', 'assessor']),
        status: q.status,
        ...(q.status === 'pending' ? { emailVerifiedAt: Not(IsNull()) } : {}),
      },
      order: { [column]: desc ? 'DESC' : 'ASC', id: 'ASC' },
      skip: (q.page - 1) * q.pageSize,
      take: q.pageSize,
    });
    return { items: rows.map(toApplicantResponse), total, page: q.page, pageSize: q.pageSize };
  }

  async approve(id: string, registrar: string): Promise<ApplicantResponse> {
    const a = await this.target(id);
    if (a.status !== 'pending' && a.status !== 'rejected') {
      throw new AppError(
        'conflict',
        `This account is ${a.status}; only pending or rejected applications can be approved.`,
      );
    }
    if (!a.emailVerifiedAt)
      throw new AppError('conflict', 'This applicant has not confirmed their e-mail address yet.');
    a.status = 'verified';
    a.verifiedAt ??= new Date();
    a.statusReason = null;
    await this.accounts.save(a);
    await this.decided({ action: 'approved', registrar, account: a.id, reason: null });
    await this.mail.send(
      a.email,
      accountLetters.approved(a.displayName, `${this.config.publicBaseUrl}/sign-in`),
    );
    for (const listener of this.approvalListeners) {
      try {
        await listener(a);
      } catch (err) {
        this.logger.error(`after approving ${a.id}: ${(err as Error).message}`);
      }
    }
    return toApplicantResponse(a);
  }

  async reject(id: string, reason: string, registrar: string): Promise<ApplicantResponse> {
    return this.move(id, registrar, 'rejected', reason);
  }

  /** Suspends a verified account: it keeps reading, writes nothing, and is signed out everywhere. */
  async suspend(id: string, reason: string, registrar: string): Promise<ApplicantResponse> {
    return this.move(id, registrar, 'suspended', reason);
  }

  async reinstate(id: string, registrar: string): Promise<ApplicantResponse> {
    return this.move(id, registrar, 'reinstated', null);
  }

  /**
   * One registrar decision that moves an account from one status to another ({@link MOVES}):
   * refused (409) from any other status; recorded, told to its listeners and mailed to the
   * account. A suspended account is signed out everywhere.
   */
  private async move(
    id: string,
    registrar: string,
    action: keyof typeof MOVES,
    reason: string | null,
  ): Promise<ApplicantResponse> {
    const m = MOVES[action];
    const a = await this.target(id);
    if (a.status !== m.from) throw new AppError('conflict', `This account is ${a.status}; ${m.refused}.`);
    a.status = m.to;
    a.statusReason = reason;
    await this.accounts.save(a);
    if (m.to === 'suspended') await this.sessions.revokeAll(a.id, 'suspended');
    await this.decided({ action, registrar, account: a.id, reason });
    await this.mail.send(a.email, m.letter(a.displayName, reason ?? ''));
    return toApplicantResponse(a);
  }

  private async target(id: string): Promise<Account> {
    const a = await this.accounts.findOne({ where: { id } });
    if (!a || a.role === 'registrar') throw new AppError('not_found', 'No such dealer or assessor account.');
    return a;
  }
}
