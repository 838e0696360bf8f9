import * as Col from '../../database/columns';

/**
 * What every single-use token row keeps: the token's SHA-256 (never the token), when it stops
 * working and when it was spent. E-mail link tokens and refresh tokens both extend it.
 */
export abstract class SingleUseToken {
  @Col.Sha256()
  tokenHash: string;

  @Col.Timestamp()
  expiresAt: Date;

  @Col.Timestamp({ nullable: true })
  usedAt: Date | null;

  @Col.CreatedAt()
  createdAt: Date;
}
