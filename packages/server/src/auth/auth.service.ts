import { randomBytes } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { accountLetters } from '../accounts/account-letters';
import { AccountsService } from '../accounts/accounts.service';
import type { Account } from '../accounts/entities/account.entity';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { MailService } from '../mail/mail.service';
import { lockBlobNames } from '../storage/blob-locks';
import { BLOB_STORE, type BlobStore } from '../storage/blob-store';
import { checkApplicantDocument, storeApplicantDocument, type UploadedDocument } from './applicant-document';
import type { SignUpDto } from './dto/sign-up.dto';
import type { MessageResponse } from './dto/tokens.dto';
import { EmailTokensService } from './email-tokens.service';
import { PasswordsService } from './passwords.service';
import { type IssuedSession, SessionsService } from './sessions.service';

const CHECK_MAIL: MessageResponse = {
  message: 'Check your e-mail: we sent a message to that address with what to do next.',
};

function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === '23505';
}

/** Sign-up, sign-in and the e-mailed flows around them. */
@Injectable()
export class AuthService {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly accounts: AccountsService,
    private readonly passwords: PasswordsService,
    private readonly sessions: SessionsService,
    private readonly tokens: EmailTokensService,
    private readonly mail: MailService,
    @Inject(BLOB_STORE) private readonly blobs: BlobStore,
    private readonly dataSource: DataSource,
  ) {}

  private link(path: string, token?: string): string {
    return `${this.config.publicBaseUrl}${path}${token ? `?token=${encodeURIComponent(token)}` : ''}`;
  }

  /**
   * Applies for a dealer or assessor account. The answer is the same whether or not the address
   * is known: a known address gets a notice instead of a second account.
   */
  async signUp(dto: SignUpDto, document?: UploadedDocument): Promise<MessageResponse> {
    const existing = await this.findByEmail(dto.email);
    if (existing) {
      await this.mail.send(
        existing.email,
        accountLetters.alreadyRegistered(existing.displayName, this.link('/forgot-password')),
      );
      return CHECK_MAIL;
    }
    const handleTaken = () => AppError.validation([{ field: 'handle', reason: 'is already taken' }]);
    if (await this.accounts.handleTaken(dto.handle)) throw handleTaken();
    // Checked before anything is written: a refused file loses nothing else.
    const doc = document ? checkApplicantDocument(document) : null;
    const passwordHash = await this.passwords.hash(dto.password);
    let account: Account;
    try {
      account = await this.dataSource.transaction(async (m) => {
        // The name's shared lock until commit: an account closing with the same bytes deletes
        // them under its exclusive lock, so it either ends first (and the bytes are stored again
        // below) or waits and then sees this account naming them.
        if (doc) await lockBlobNames(m, [doc.sha256], 'shared');
        const created = await this.accounts.create(
          {
            role: dto.role,
            status: 'pending',
            handle: dto.handle,
            email: dto.email,
            displayName: dto.displayName,
            business: dto.business,
            town: dto.town,
            country: dto.country,
            address: dto.address,
            website: dto.website ?? null,
            tradeReferences: dto.tradeReferences,
            documentSha256: doc?.sha256 ?? null,
            documentType: doc?.type ?? null,
            documentSize: doc?.size ?? null,
            documentName: doc?.name ?? null,
            passwordHash,
            emailVerifiedAt: null,
            verifiedAt: null,
            statusReason: null,
          },
          m,
        );
        // Stored inside the transaction: a failed put leaves no account naming missing bytes
        // (they are content-addressed, so a retry stores nothing new).
        if (document && doc) await storeApplicantDocument(this.blobs, document, doc);
        return created;
      });
    } catch (err) {
      // Two sign-ups racing for the same handle or address: the loser learns nothing new.
      if (!isUniqueViolation(err)) throw err;
      if (String((err as { constraint?: string }).constraint).includes('handle')) throw handleTaken();
      return CHECK_MAIL;
    }
    const token = await this.tokens.issue(account.id, 'verify-email');
    await this.mail.send(
      account.email,
      accountLetters.verifyEmail(account.displayName, this.link('/verify-email', token)),
    );
    return CHECK_MAIL;
  }

  /** Confirms an e-mail address from the link's token; registrars hear of the new application. */
  async verifyEmail(token: string): Promise<MessageResponse> {
    const used = await this.tokens.consume(token, ['verify-email']);
    const account = await this.accountOf(used.accountId);
    if (!account.emailVerifiedAt) {
      await this.accounts.update(account.id, { emailVerifiedAt: new Date() });
      if (account.status === 'pending') {
        const registrars = await this.accounts.registrars();
        for (const r of registrars) {
          await this.mail.send(
            r.email,
            accountLetters.newApplication(account.displayName, account.business, this.link('/registry')),
          );
        }
      }
    }
    return { message: 'Thank you: your e-mail address is confirmed. You can sign in now.' };
  }

  async forgotPassword(email: string): Promise<MessageResponse> {
    const account = await this.findByEmail(email);
    if (account && account.status !== 'closed') {
      const token = await this.tokens.issue(account.id, 'reset-password');
      await this.mail.send(
        account.email,
        accountLetters.resetPassword(account.displayName, this.link('/reset-password', token)),
      );
    }
    return CHECK_MAIL;
  }

  /** Sets a new password from a reset or set-password link; every session of the account ends. */
  async resetPassword(token: string, password: string): Promise<MessageResponse> {
    const used = await this.tokens.consume(token, ['reset-password', 'set-password']);
    const account = await this.accountOf(used.accountId);
    // Following the e-mailed link proves the address.
    await this.accounts.update(account.id, {
      passwordHash: await this.passwords.hash(password),
      emailVerifiedAt: account.emailVerifiedAt ?? new Date(),
    });
    await this.sessions.revokeAll(account.id, 'password');
    return { message: 'Your new password is set. Please sign in with it.' };
  }

  /** Changes the password of the signed-in account and ends every other session. */
  async changePassword(
    accountId: string,
    sessionId: string | undefined,
    current: string,
    next: string,
  ): Promise<MessageResponse> {
    const account = await this.accountOf(accountId);
    if (!(await this.passwords.verify(current, account.passwordHash))) {
      throw AppError.validation([{ field: 'currentPassword', reason: 'is not your current password' }]);
    }
    await this.accounts.update(account.id, { passwordHash: await this.passwords.hash(next) });
    await this.sessions.revokeAll(account.id, 'password', sessionId);
    return { message: 'Your password is changed. Every other sign-in has ended.' };
  }

  /** Checks e-mail and password and starts a session. Unconfirmed e-mail addresses cannot sign in yet. */
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
    const account = await this.accounts.find(accountId);
    if (!account) throw new AppError('unauthenticated', 'Please sign in.');
    return account;
  }

  findByEmail(email: string): Promise<Account | null> {
    return this.accounts.findByEmail(email.trim());
  }

  /** The account a used token names (it exists: a token goes with its account). */
  private async accountOf(id: string): Promise<Account> {
    const account = await this.accounts.find(id);
    if (!account) throw new Error(`no account ${id}`);
    return account;
  }

  /** Creates (or finds) the registrar for an address and e-mails a set-password link; returns the link. */
  async createRegistrar(email: string): Promise<{ account: Account; link: string; created: boolean }> {
    let account = await this.findByEmail(email);
    const created = !account;
    if (account && account.role !== 'registrar') {
      throw new AppError('conflict', `${email} already belongs to a ${account.role} account.`);
    }
    account ??= await this.accounts.create({
      role: 'registrar',
      status: 'verified',
      handle: `registrar-${randomBytes(3).toString('hex')}`,
      email: email.trim(),
      displayName: 'Registrar',
      business: 'Beadroll registry',
      town: '-',
      country: '-',
      passwordHash: null,
      emailVerifiedAt: null,
      verifiedAt: new Date(),
      statusReason: null,
    });
    const token = await this.tokens.issue(account.id, 'set-password');
    const link = this.link('/reset-password', token);
    await this.mail.send(account.email, accountLetters.setPassword(link));
    return { account, link, created };
  }
}
