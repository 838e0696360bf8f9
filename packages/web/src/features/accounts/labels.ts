import type { AccountStatus, Role } from './accounts.api';

export const ROLE_LABEL: Record<Role, string> = {
  dealer: 'Dealer',
  assessor: 'Assessor',
  registrar: 'Registrar',
};

export const STATUS_LABEL: Record<AccountStatus, string> = {
  pending: 'Waiting for the registrar',
  verified: 'Verified',
  rejected: 'Not accepted',
  suspended: 'Suspended',
  closed: 'Closed',
};
