import { ApiProperty } from '@nestjs/swagger';
import type { Account } from '../../accounts/entities/account.entity';
import { AccountIdentity, toAccountIdentity } from '../../accounts/dto/account-identity.dto';

/** The signed-in account as the web app sees it (its own details, e-mail included). */
export class MeResponse extends AccountIdentity {
  @ApiProperty() emailVerified: boolean;
  @ApiProperty({ type: String, nullable: true }) verifiedSince: string | null;
  @ApiProperty({ type: String, nullable: true }) statusReason: string | null;
  @ApiProperty() createdAt: string;
}

export class SessionResponse {
  @ApiProperty({ type: MeResponse, nullable: true }) account: MeResponse | null;
}

export function toMeResponse(a: Account): MeResponse {
  return {
    ...toAccountIdentity(a),
    emailVerified: a.emailVerifiedAt !== null,
    verifiedSince: a.verifiedAt?.toISOString() ?? null,
    statusReason: a.statusReason,
    createdAt: a.createdAt.toISOString(),
  };
}

/** The account a sign-in or a renewal has just opened a session for. */
export class SignedInResponse {
  @ApiProperty({ type: MeResponse }) account: MeResponse;
}
