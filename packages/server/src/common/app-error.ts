import { HttpStatus } from '@nestjs/common';

/** One field-level problem in a request, as shown beside that field. */
export interface FieldProblem {
  field: string;
  reason: string;
}

/**
 * Error codes and the HTTP status each maps to. Features add their codes here so the mapping
 * stays in one place and the error body stays stable.
 */
export const ERROR_STATUS = {
  validation: HttpStatus.BAD_REQUEST,
  bad_request: HttpStatus.BAD_REQUEST,
  unauthenticated: HttpStatus.UNAUTHORIZED,
  invalid_credentials: HttpStatus.UNAUTHORIZED,
  session_invalid: HttpStatus.UNAUTHORIZED,
  email_unverified: HttpStatus.FORBIDDEN,
  not_verified: HttpStatus.FORBIDDEN,
  token_invalid: HttpStatus.BAD_REQUEST,
  forbidden: HttpStatus.FORBIDDEN,
  csrf: HttpStatus.FORBIDDEN,
  not_found: HttpStatus.NOT_FOUND,
  conflict: HttpStatus.CONFLICT,
  /** A write the rules of a roll do not allow in the lot's present state. */
  roll_rule: HttpStatus.CONFLICT,
  /** The offer was already answered, withdrawn or lapsed. */
  offer_closed: HttpStatus.CONFLICT,
  /** An upload of bytes the registrar removed (their digest is on the blocked list). */
  blocked_content: HttpStatus.CONFLICT,
  /** An idempotency key sent again with a different request. */
  idempotency_key_reused: HttpStatus.UNPROCESSABLE_ENTITY,
  payload_too_large: HttpStatus.PAYLOAD_TOO_LARGE,
  unsupported_media_type: HttpStatus.UNSUPPORTED_MEDIA_TYPE,
  rate_limited: HttpStatus.TOO_MANY_REQUESTS,
  unavailable: HttpStatus.SERVICE_UNAVAILABLE,
  internal: HttpStatus.INTERNAL_SERVER_ERROR,
} as const satisfies Record<string, HttpStatus>;

export type ErrorCode = keyof typeof ERROR_STATUS;

/** The error every feature throws; the global filter turns it into `{ error: { code, message, fields? } }`. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldProblem[],
  ) {
    super(message);
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }

  static validation(fields: FieldProblem[]): AppError {
    const summary = fields.map((f) => `${f.field}: ${f.reason}`).join('; ');
    return new AppError('validation', `Some fields need attention: ${summary}`, fields);
  }
}
