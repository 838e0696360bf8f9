import type { Account } from '../../accounts/entities/account.entity';
import type { AccountStatus, Role } from '../auth.decorators';

/** The signed-in account as the web app sees it (its own details, e-mail included). */
export interface MeResponse {
  id: string;
  role: Role;
  status: AccountStatus;
  handle: string;
  displayName: string;
  email: string;
  business: string;
  town: string;
  country: string;
  emailVerified: boolean;
  verifiedSince: string | null;
  statusReason: string | null;
  createdAt: string;
}

export interface SessionResponse {
  account: MeResponse | null;
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
