import { createParamDecorator, type ExecutionContext, SetMetadata } from '@nestjs/common';

export type Role = 'dealer' | 'assessor' | 'registrar';

/**
 * Where an account stands with the registrar. Only `verified` accounts write to rolls;
 * the others can sign in and read.
 */
export type AccountStatus = 'pending' | 'verified' | 'rejected' | 'suspended' | 'closed';

/** The signed-in account, loaded from the database for the request (never trusted from the token). */
export interface Principal {
  /** Opaque, immutable account id: the actor on every roll entry. */
  id: string;
  role: Role;
  status: AccountStatus;
  handle: string;
  displayName: string;
}

export const IS_PUBLIC = 'beadroll:public';
export const ROLES = 'beadroll:roles';
export const ROLL_WRITER = 'beadroll:roll-writer';

/** The route answers without a sign-in. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** The route needs a signed-in account with one of these roles. */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES, roles);

/**
 * The route writes to a roll: the account must be verified by the registrar and not suspended,
 * checked against the database on every request.
 */
export const RollWriter = () => SetMetadata(ROLL_WRITER, true);

/** The principal the auth guard attached to the request (undefined on public routes without a sign-in). */
export const CurrentAccount = createParamDecorator(
  (_data: unknown, ctx: ExecutionContext): Principal | undefined => {
    const req = ctx.switchToHttp().getRequest<{ account?: Principal }>();
    return req.account;
  },
);
