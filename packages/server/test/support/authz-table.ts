import type { Role } from '../../src/auth/auth.decorators';

/**
 * Who may reach each route.
 * - 'public': anyone, signed in or not;
 * - 'signed-in': any signed-in account, whatever its role or status;
 * - 'roll-writer': a signed-in account the registrar has verified (not pending, not suspended);
 * - { roles, writer? }: only these roles (and, with writer, only when verified).
 * Every route the server has must be listed: the matrix test fails on a missing one.
 */
export type Access = 'public' | 'signed-in' | 'roll-writer' | { roles: Role[]; writer?: boolean };

export const AUTHZ_TABLE: Record<string, Access> = {
  // foundation
  'GET /api/health': 'public',
  'GET /api/docs': 'public',
  'GET /api/docs/': 'public',
  'GET /api/docs/index.html': 'public',
  'GET /api/docs/swagger-ui-init.js': 'public',
  'GET /api/docs/docs/swagger-ui-init.js': 'public',
  'GET /api/docs/LICENSE': 'public',
  'GET /api/docs-json': 'public',
  'GET /api/docs-yaml': 'public',
  // accounts: sign-in and sessions
  'GET /api/auth/session': 'public',
  'POST /api/auth/sign-in': 'public',
  'POST /api/auth/session/refresh': 'public',
  'POST /api/auth/session/sign-out': 'public',
  'POST /api/auth/sign-up': 'public',
  'POST /api/auth/verify-email': 'public',
  'POST /api/auth/forgot-password': 'public',
  'POST /api/auth/reset-password': 'public',
  // accounts: own account, registry, public cards
  'GET /api/account': 'signed-in',
  'POST /api/account/password': 'signed-in',
  'GET /api/registry/accounts': { roles: ['registrar'] },
  'GET /api/registry/accounts/:id/document': { roles: ['registrar'] },
  'POST /api/registry/accounts/:id/approve': { roles: ['registrar'] },
  'POST /api/registry/accounts/:id/reject': { roles: ['registrar'] },
  'POST /api/registry/accounts/:id/suspend': { roles: ['registrar'] },
  'POST /api/registry/accounts/:id/reinstate': { roles: ['registrar'] },
  'GET /api/public/dealers': 'public',
  'GET /api/public/dealers/:handle': 'public',
  // lots and their rolls
  'POST /api/lots': { roles: ['dealer'], writer: true },
  'GET /api/lots': 'signed-in',
  'GET /api/lots/export': 'signed-in',
  'GET /api/lots/:code': 'signed-in',
  'POST /api/lots/:code/descriptions': { roles: ['dealer'], writer: true },
  'POST /api/lots/:code/observations': { roles: ['dealer'], writer: true },
  'PUT /api/lots/:code/listing': { roles: ['dealer'], writer: true },
  'GET /api/lots/:code/roll': 'signed-in',
  'GET /api/lots/:code/verification': 'signed-in',
  'GET /api/lots/:code/bundle': 'signed-in',
  'GET /api/public/lots/:code': 'public',
  'GET /api/public/lots/:code/bundle': 'public',
  // splits, combinations and ancestry
  'POST /api/lots/:code/splits': { roles: ['dealer'], writer: true },
  'POST /api/combinations': { roles: ['dealer'], writer: true },
  'GET /api/lots/:code/ancestry': 'signed-in',
  'GET /api/audit/ledger': { roles: ['registrar'] },
  // transfers between dealers and sales to private buyers
  'GET /api/transfers/dealers': { roles: ['dealer'] },
  'POST /api/transfers/offers': { roles: ['dealer'], writer: true },
  'GET /api/transfers/offers': { roles: ['dealer'] },
  'GET /api/transfers/offers/:id': { roles: ['dealer'] },
  'POST /api/transfers/offers/:id/accept': { roles: ['dealer'], writer: true },
  'POST /api/transfers/offers/:id/decline': { roles: ['dealer'], writer: true },
  'POST /api/transfers/offers/:id/withdraw': { roles: ['dealer'], writer: true },
  'GET /api/transfers/invitations': { roles: ['dealer'] },
  'POST /api/transfers/invitations/:id/offer': { roles: ['dealer'], writer: true },
  'POST /api/transfers/invitations/:id/cancel': { roles: ['dealer'] },
  'POST /api/transfers/sales': { roles: ['dealer'], writer: true },
  'GET /api/transfers/sales': { roles: ['dealer'] },
  'POST /api/transfers/sales/:code/void': { roles: ['dealer'], writer: true },
  // importing lots from a spreadsheet
  'GET /api/lot-imports/template': { roles: ['dealer'] },
  'POST /api/lot-imports/sheets': { roles: ['dealer'] },
  'POST /api/lot-imports/checks': { roles: ['dealer'] },
  'POST /api/lot-imports': { roles: ['dealer'], writer: true },
  // registrar's tools: redaction, reports, the record, a dealer's own data
  'POST /api/registry/redactions': { roles: ['registrar'] },
  'GET /api/registry/redaction-requests': { roles: ['registrar'] },
  'POST /api/registry/redaction-requests/:id/approve': { roles: ['registrar'] },
  'POST /api/registry/redaction-requests/:id/decline': { roles: ['registrar'] },
  'POST /api/lots/:code/redaction-requests': { roles: ['dealer'] },
  'POST /api/public/lots/:code/reports': 'public',
  'GET /api/registry/reports': { roles: ['registrar'] },
  'GET /api/registry/witnesses': { roles: ['registrar'] },
  'POST /api/registry/witnesses': { roles: ['registrar'] },
  'GET /api/log/key': 'public',
  'GET /api/log/checkpoint': 'public',
  'GET /api/log/witnesses': 'public',
  'GET /api/log/proof/inclusion': 'public',
  'GET /api/log/proof/consistency': 'public',
  'GET /api/log/leaves': 'public',
  'POST /api/log/cosignatures': 'public',
  'POST /api/registry/reports/:id/close': { roles: ['registrar'] },
  'GET /api/registry/actions': { roles: ['registrar'] },
  'GET /api/registry/actions/export': { roles: ['registrar'] },
  'GET /api/account/personal-data': 'signed-in',
  'POST /api/account/close': { roles: ['dealer', 'assessor'] },
  // opinions and the attribution aid (the aid is pure computation over what is sent: public)
  'GET /api/lots/:code/opinions': 'signed-in',
  'POST /api/lots/:code/opinions': { roles: ['dealer', 'assessor'], writer: true },
  'POST /api/lots/:code/opinions/:seq/withdrawal': { roles: ['dealer', 'assessor'], writer: true },
  'POST /api/lots/:code/opinions/:seq/replies': { roles: ['dealer'], writer: true },
  'POST /api/attribution-aid': 'public',
  // tags: printing writes nothing; listing writes described entries
  'GET /api/tags/layouts': { roles: ['dealer'] },
  'GET /api/tags/lots/:code': { roles: ['dealer'] },
  'POST /api/tags/pdf': { roles: ['dealer'] },
  'POST /api/tags/list': { roles: ['dealer'], writer: true },
  // opinions on request
  'POST /api/opinion-requests': { roles: ['dealer'], writer: true },
  'GET /api/opinion-requests': { roles: ['dealer', 'assessor'] },
  'GET /api/opinion-requests/assessors': { roles: ['dealer'] },
  'POST /api/opinion-requests/:id/cancel': { roles: ['dealer'] },
  // the dealer's own stock and sales figures
  'GET /api/stock/summary': { roles: ['dealer'] },
  'GET /api/stock/export': { roles: ['dealer'] },
  // exhibits
  'POST /api/lots/:code/exhibits': { roles: ['dealer', 'assessor'], writer: true },
  'GET /api/lots/:code/exhibits': 'signed-in',
  'GET /api/lots/:code/exhibits/:seq/:variant': 'signed-in',
  'GET /api/public/lots/:code/exhibits/:seq/:variant': 'public',
  // the offline verifier page
  'GET /verify': 'public',
  'GET /verify/download': 'public',
  'GET /api/public/lots/:code/inherited/:lot/exhibits/:seq/:variant': 'public',
  // development mailbox (only with DEV_MAILBOX, loopback only)
  'GET /dev/mailbox': 'public',
  'GET /dev/mailbox/:id': 'public',
};
