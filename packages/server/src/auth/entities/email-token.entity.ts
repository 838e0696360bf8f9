import { Entity } from 'typeorm';
import * as Col from '../../database/columns';
import { SingleUseToken } from './single-use-token';

export type EmailTokenPurpose = 'verify-email' | 'reset-password' | 'set-password';

/** A single-use, short-lived token sent in an e-mail link; only its SHA-256 is stored. */
@Entity({ name: 'email_tokens' })
export class EmailToken extends SingleUseToken {
  @Col.UuidPrimary('email_tokens')
  id: string;

  @Col.Uuid()
  accountId: string;

  @Col.Word()
  purpose: EmailTokenPurpose;
}
