import { Entity } from 'typeorm';
import * as Col from '../../database/columns';
import { SingleUseToken } from './single-use-token';

/** One signed-in device: the family of its rotating refresh tokens. Revoking it ends the sign-in. */
@Entity({ name: 'sessions' })
export class Session {
  @Col.UuidPrimary('sessions')
  id: string;

  @Col.Uuid()
  accountId: string;

  @Col.CreatedAt()
  createdAt: Date;

  @Col.Timestamp({ nullable: true })
  revokedAt: Date | null;

  @Col.Varchar(32, { nullable: true })
  revokedWhy: string | null;
}

/** A refresh token, stored as its SHA-256; used once, then replaced by the next in its session. */
@Entity({ name: 'refresh_tokens' })
export class RefreshToken extends SingleUseToken {
  @Col.UuidPrimary('refresh_tokens')
  id: string;

  @Col.Uuid()
  sessionId: string;
}
