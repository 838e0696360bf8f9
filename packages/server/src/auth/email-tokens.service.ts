import { randomBytes } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, IsNull, Repository, type EntityManager } from 'typeorm';
import { EmailToken, type EmailTokenPurpose } from './entities/email-token.entity';
import { AppError } from '../common/app-error';
import { sha256Hex } from './sessions.service';

/** How long each kind of e-mailed link stays valid. */
export const TOKEN_TTL_SECONDS: Record<EmailTokenPurpose, number> = {
  'verify-email': 24 * 3600,
  'reset-password': 3600,
  'set-password': 72 * 3600,
};

/** Single-use, short-lived tokens for e-mailed links; only their SHA-256 is stored. */
@Injectable()
export class EmailTokensService {
  constructor(@InjectRepository(EmailToken) private readonly tokens: Repository<EmailToken>) {}

  /** Deletes every e-mailed token of an account, in the caller's transaction (the account is closing). */
  async deleteAllOf(accountId: string, m: EntityManager): Promise<void> {
    await m.query(`DELETE FROM "email_tokens" WHERE "account_id" = $1`, [accountId]);
  }

  /** A new token for the account; earlier unused ones for the same purpose stop working. */
  async issue(accountId: string, purpose: EmailTokenPurpose): Promise<string> {
    await this.tokens.update({ accountId, purpose, usedAt: IsNull() }, { usedAt: new Date() });
    const raw = randomBytes(32).toString('base64url');
    await this.tokens.save(
      this.tokens.create({
        accountId,
        purpose,
        tokenHash: sha256Hex(raw),
        expiresAt: new Date(Date.now() + TOKEN_TTL_SECONDS[purpose] * 1000),
        usedAt: null,
      }),
    );
    return raw;
  }

  /** Uses a token up (atomically) and returns it; unknown, used, expired or wrong-purpose tokens are refused. */
  async consume(
    raw: string,
    purposes: EmailTokenPurpose[],
  ): Promise<Pick<EmailToken, 'id' | 'accountId' | 'purpose'>> {
    const invalid = () =>
      new AppError('token_invalid', 'This link has expired or was already used. Ask for a new one.', [
        { field: 'token', reason: 'has expired or was already used' },
      ]);
    const result = await this.tokens
      .createQueryBuilder()
      .update()
      .set({ usedAt: () => 'now()' })
      .where({ tokenHash: sha256Hex(raw), purpose: In(purposes), usedAt: IsNull() })
      .andWhere('expires_at > now()')
      .returning('id, account_id, purpose')
      .execute();
    const row = (result.raw as Array<{ id: string; account_id: string; purpose: EmailTokenPurpose }>)[0];
    if (!row) throw invalid();
    return { id: row.id, accountId: row.account_id, purpose: row.purpose };
  }
}
