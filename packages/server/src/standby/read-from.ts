import type { Request } from 'express';
import { ACCESS_COOKIE } from '../auth/cookies';

/** Response header naming where a public read was answered: `standby` or `primary`. */
export const READ_FROM_HEADER = 'Beadroll-Read-From';

/**
 * Whether a request comes from a signed-in browser: such a reader may have just written, so its
 * public reads go to the primary and it always sees its own writes.
 */
export function readsOwnWrites(req: Request): boolean {
  return typeof req.cookies?.[ACCESS_COOKIE] === 'string';
}
