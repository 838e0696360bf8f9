import { ApiProperty } from '@nestjs/swagger';
import type { Account } from '../../accounts/entities/account.entity';
import type { AccountStatus, Role } from '../auth.decorators';

/** The signed-in account as the web app sees it (its own details, e-mail included). */
export class MeResponse {
  @ApiProperty() id: string;
  @ApiProperty({ enum: ['dealer', 'assessor', 'registrar'] }) role: Role;
  @ApiProperty({ enum: ['pending', 'verified', 'rejected', 'suspended', 'closed'] }) status: AccountStatus;
  @ApiProperty() handle: string;
  @ApiProperty() displayName: string;
  @ApiProperty() email: string;
  @ApiProperty() business: string;
  @ApiProperty() town: string;
  @ApiProperty() country: string;
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
    id: a.id,
    role: a.role,
    status: a.status,
    handle: a.handle,
    displayName: a.displayName,
    email: a.email,
    business: a.business,
    town: a.town,
    country: a.country,
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
