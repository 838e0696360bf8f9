import { ApiProperty } from '@nestjs/swagger';
import type { AccountStatus, Role } from '../../auth/auth.decorators';
import type { Account } from '../entities/account.entity';

/**
 * The fields that open every full view of an account, for its holder and for the registrar alike.
 * Not a schema of its own: each response extends it and adds what its reader may see.
 */
export abstract class AccountIdentity {
  @ApiProperty() id: string;
  @ApiProperty({ enum: ['dealer', 'assessor', 'registrar'] }) role: Role;
  @ApiProperty({ enum: ['pending', 'verified', 'rejected', 'suspended', 'closed'] }) status: AccountStatus;
  @ApiProperty() handle: string;
  @ApiProperty() displayName: string;
  @ApiProperty() email: string;
  @ApiProperty() business: string;
  @ApiProperty() town: string;
  @ApiProperty() country: string;
}

export function toAccountIdentity(a: Account): AccountIdentity {
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
  };
}
