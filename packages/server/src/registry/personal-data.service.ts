import { Inject, Injectable, Logger } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { AccountsService } from '../accounts/accounts.service';
import { applicantDocumentOf } from '../accounts/dto/registry.dto';
import type { Account } from '../accounts/entities/account.entity';
import { EmailTokensService } from '../auth/email-tokens.service';
import { PasswordsService } from '../auth/passwords.service';
import { SessionsService } from '../auth/sessions.service';
import { AppError } from '../common/app-error';
import { ExhibitsService } from '../exhibits/exhibits.service';
import { MailService } from '../mail/mail.service';
import { OfferLapseService } from '../transfers/offer-lapse.service';
import { registryLetters } from './registry-letters';
import { LotViewsService } from '../lots/lot-views.service';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { lockBlobNames } from '../storage/blob-locks';
import { BLOB_STORE, type BlobStore } from '../storage/blob-store';
import type { PersonalDataResponse } from './dto/personal-data.dto';

/** A dealer's own data: the download of everything held about them, and closing the account. */
@Injectable()
export class PersonalDataService {
  private readonly log = new Logger('personal-data');

  constructor(
    private readonly ledger: LedgerService,
    private readonly reader: RollReaderService,
    private readonly views: LotViewsService,
    private readonly dataSource: DataSource,
    private readonly accounts: AccountsService,
    private readonly passwords: PasswordsService,
    private readonly sessions: SessionsService,
    private readonly emailTokens: EmailTokensService,
    private readonly exhibits: ExhibitsService,
    private readonly lapse: OfferLapseService,
    private readonly mail: MailService,
    @Inject(BLOB_STORE) private readonly blobs: BlobStore,
  ) {}

  async export(accountId: string): Promise<PersonalDataResponse> {
    const a = await this.account(accountId);
    const q = <T>(sql: string): Promise<T[]> => this.dataSource.query(sql, [accountId]);
    const sessions = await this.sessions.historyOf(accountId);
    const entries = await this.reader.entriesBy(accountId);
    const sealed = await this.reader.sealedVisibleTo(accountId);
    const held = await this.views.heldBy(accountId);
    const asSent = await this.exhibits.sentBy(accountId);
    const requests = await q<{ lot: string; seq: number; note: string; status: string; created_at: Date }>(
      `SELECT "lot", "seq", "note", "status", "created_at" FROM "redaction_requests" WHERE "requester" = $1 ORDER BY "created_at"`,
    );
    const decisions = await q<{ at: Date; action: string; reason: string | null }>(
      `SELECT "at", "action", "reason" FROM "registrar_actions" WHERE "subject" = $1::text ORDER BY "at", "id"`,
    );
    return {
      format: 'beadroll-personal-data',
      version: 1,
      exportedAt: new Date().toISOString(),
      account: {
        id: a.id,
        role: a.role,
        status: a.status,
        handle: a.handle,
        email: a.email,
        displayName: a.displayName,
        business: a.business,
        town: a.town,
        country: a.country,
        address: a.address,
        website: a.website,
        tradeReferences: a.tradeReferences,
        document: applicantDocumentOf(a),
        emailConfirmedAt: a.emailVerifiedAt?.toISOString() ?? null,
        verifiedSince: a.verifiedAt?.toISOString() ?? null,
        statusReason: a.statusReason,
        createdAt: a.createdAt.toISOString(),
      },
      sessions: sessions.map((s) => ({
        createdAt: s.createdAt.toISOString(),
        revokedAt: s.revokedAt?.toISOString() ?? null,
        revokedWhy: s.revokedWhy,
      })),
      entries,
      sealedDetails: sealed.map((s) => ({ ...s, value: JSON.parse(s.value) as unknown })),
      lotsHeld: held.map((h) => h.code),
      exhibitsAsSent: asSent,
      redactionRequests: requests.map((r) => ({
        lot: r.lot,
        seq: r.seq,
        note: r.note,
        status: r.status,
        createdAt: r.created_at.toISOString(),
      })),
      registrarDecisions: decisions.map((d) => ({
        at: d.at.toISOString(),
        action: d.action,
        reason: d.reason,
      })),
    };
  }

  /**
   * Closes the account: its name and contact details are replaced, its password and sign-ins
   * end, the sealed values it recorded for itself are deleted (their salted commitments stay in the
   * headers, so every roll still verifies) and its open offers lapse. Roll entries keep the
   * opaque account id.
   */
  async close(accountId: string, password: string): Promise<{ message: string }> {
    const a = await this.account(accountId);
    if (a.role === 'registrar') throw new AppError('forbidden', 'A registrar account cannot be closed here.');
    if (!(await this.passwords.verify(password, a.passwordHash)))
      throw AppError.validation([{ field: 'password', reason: 'is not your current password' }]);
    const oldEmail = a.email;
    const oldName = a.displayName;
    await this.dataSource.transaction(async (m) => {
      await this.accounts.close(a.id, m);
      await this.ledger.forgetSealedValuesOf(a.id, m);
      await this.views.forgetPrivateSearchOf(a.id, m);
      await this.emailTokens.deleteAllOf(a.id, m);
    });
    // The document's bytes go after the commit, so a failed close keeps them.
    if (a.documentSha256) await this.forgetDocument(a.documentSha256);
    await this.sessions.revokeAll(a.id, 'closed');
    await this.lapse.lapseOffersOf(a.id);
    await this.mail.send(oldEmail, registryLetters.accountClosed(oldName));
    return { message: 'Your account is closed.' };
  }

  /**
   * Deletes a closed account's application document from the blob store unless the same bytes
   * are still named: blobs are shared by content, so another applicant's document or an exhibit
   * may be the same file. Checked and deleted under the name's exclusive lock, which exhibit
   * uploads hold shared while they store a file.
   */
  private async forgetDocument(sha256: string): Promise<void> {
    try {
      await this.dataSource.transaction(async (m) => {
        await lockBlobNames(m, [sha256], 'exclusive');
        const named =
          (await this.accounts.namesDocument(sha256, m)) || (await this.exhibits.namesBlob(sha256, m));
        if (!named) await this.blobs.delete(sha256);
      });
    } catch (err) {
      // The account is closed either way; the bytes stay, and this says so in the log.
      this.log.warn(`could not delete a closed account's document: ${(err as Error).message}`);
    }
  }

  /** The signed-in account (it exists: the guard read it for this request). */
  private async account(id: string): Promise<Account> {
    const a = await this.accounts.find(id);
    if (!a) throw new Error(`no account ${id}`);
    return a;
  }
}
