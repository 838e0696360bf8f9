import { createHash, randomBytes } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectRepository } from '@nestjs/typeorm';
import { IsNull, Not, Repository } from 'typeorm';
import { AccountsService } from '../accounts/accounts.service';
import { RefreshToken, Session } from './entities/session.entity';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import type { Principal } from './auth.decorators';

/** What an access token carries: the account and the session it belongs to. Nothing else is trusted. */
export interface AccessClaims {
  sub: string;
  sid: string;
}

export interface IssuedSession {
  sessionId: string;
  accountId: string;
  access: string;
  refresh: string;
}

export type RevokeReason = 'sign-out' | 'reuse' | 'password' | 'suspended' | 'closed';

export function sha256Hex(value: string): string {
  return createHash('sha256').update(value).digest('hex');
}

/** Sessions: short-lived access tokens and rotating refresh tokens (stored hashed) with reuse detection. */
@Injectable()
export class SessionsService {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly jwt: JwtService,
    private readonly accounts: AccountsService,
    @InjectRepository(Session) private readonly sessions: Repository<Session>,
    @InjectRepository(RefreshToken) private readonly tokens: Repository<RefreshToken>,
  ) {}

  /** Starts a new session for the account (a sign-in). */
  async start(accountId: string): Promise<IssuedSession> {
    const session = await this.sessions.save(this.sessions.create({ accountId, revokedAt: null }));
    return this.issue(session.id, accountId);
  }

  /**
   * Exchanges a refresh token for a new pair. A token that was already used means it was copied:
   * the whole session is revoked, for the thief and the owner alike.
   */
  async refresh(raw: string | undefined): Promise<IssuedSession> {
    const invalid = () => new AppError('session_invalid', 'Your sign-in has ended. Please sign in again.');
    if (!raw || raw.length > 200) throw invalid();
    const token = await this.tokens.findOne({ where: { tokenHash: sha256Hex(raw) } });
    if (!token) throw invalid();
    const session = await this.sessions.findOne({ where: { id: token.sessionId } });
    if (!session || session.revokedAt) throw invalid();
    const claimed = await this.tokens
      .createQueryBuilder()
      .update()
      .set({ usedAt: () => 'now()' })
      .where('id = :id AND used_at IS NULL', { id: token.id })
      .execute();
    if (!claimed.affected) {
      await this.revoke(session.id, 'reuse');
      throw invalid();
    }
    if (token.expiresAt.getTime() <= Date.now()) throw invalid();
    const account = await this.accounts.principal(session.accountId);
    if (!account) throw invalid();
    return this.issue(session.id, session.accountId);
  }

  /** Sign-out: ends the session named by the access token or, when that has lapsed, by the refresh token. */
  async signOut(sessionId: string | undefined, refresh: string | undefined): Promise<void> {
    let id = sessionId;
    if (!id && refresh && refresh.length <= 200) {
      id = (await this.tokens.findOne({ where: { tokenHash: sha256Hex(refresh) } }))?.sessionId;
    }
    if (id) await this.revoke(id, 'sign-out');
  }

  /** Ends one session (its refresh tokens stop working, and so do its access tokens). */
  async revoke(sessionId: string, why: RevokeReason): Promise<void> {
    await this.sessions.update(
      { id: sessionId, revokedAt: IsNull() },
      { revokedAt: new Date(), revokedWhy: why },
    );
  }

  /** Ends every session of an account, except `keep` (the one changing its password). */
  async revokeAll(accountId: string, why: RevokeReason, keep?: string): Promise<void> {
    await this.sessions.update(
      { accountId, revokedAt: IsNull(), ...(keep ? { id: Not(keep) } : {}) },
      { revokedAt: new Date(), revokedWhy: why },
    );
  }

  /** Every session of an account, oldest first (the account's own data download). */
  async historyOf(
    accountId: string,
  ): Promise<Array<{ createdAt: Date; revokedAt: Date | null; revokedWhy: string | null }>> {
    const rows: Array<{ created_at: Date; revoked_at: Date | null; revoked_why: string | null }> =
      await this.sessions.query(
        `SELECT "created_at", "revoked_at", "revoked_why" FROM "sessions" WHERE "account_id" = $1 ORDER BY "created_at"`,
        [accountId],
      );
    return rows.map((r) => ({ createdAt: r.created_at, revokedAt: r.revoked_at, revokedWhy: r.revoked_why }));
  }

  /** The principal for verified access claims, read from the database (role and status are never taken from the token). */
  async principalFor(claims: AccessClaims): Promise<(Principal & { sessionId: string }) | null> {
    // Both reads at once, on two connections: every signed-in request waits for them.
    const [principal, open] = await Promise.all([
      this.accounts.principal(claims.sub),
      this.sessions.exists({ where: { id: claims.sid, accountId: claims.sub, revokedAt: IsNull() } }),
    ]);
    return principal && open ? { ...principal, sessionId: claims.sid } : null;
  }

  private async issue(sessionId: string, accountId: string): Promise<IssuedSession> {
    const refresh = randomBytes(32).toString('base64url');
    await this.tokens.save(
      this.tokens.create({
        sessionId,
        tokenHash: sha256Hex(refresh),
        expiresAt: new Date(Date.now() + this.config.session.refreshTtlSeconds * 1000),
        usedAt: null,
      }),
    );
    const claims: AccessClaims = { sub: accountId, sid: sessionId };
    const access = await this.jwt.signAsync(claims);
    return { sessionId, accountId, access, refresh };
  }
}
