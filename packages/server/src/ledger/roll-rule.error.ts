import {
  formatLotCode,
  mayAppend,
  type EntryKind,
  type FieldIssue,
  type RollState,
  type ValidationError,
} from '@beadroll/core';
import { AppError, type FieldProblem } from '../common/app-error';

/**
 * Turns core's field issues into request field problems. `rename` maps a core path prefix
 * (`body.description`, `sealed.acquisition-cost`) to the request's field name.
 */
export function issuesToFields(issues: FieldIssue[], rename: Record<string, string> = {}): FieldProblem[] {
  const prefixes = Object.keys(rename).sort((a, b) => b.length - a.length);
  return issues.map((i) => {
    let field = i.path || '(body)';
    for (const p of prefixes) {
      if (field === p || field.startsWith(`${p}.`) || field.startsWith(`${p}[`)) {
        field = rename[p] + field.slice(p.length);
        break;
      }
    }
    return { field: field.replace(/\[(\d+)\]/g, '.$1').replace(/^\./, ''), reason: i.message };
  });
}

/** A request refused by core's rules of a roll or field checks. */
export function ledgerValidationError(e: ValidationError, rename: Record<string, string> = {}): AppError {
  return AppError.validation(issuesToFields(e.issues, rename));
}

/**
 * Refuses a write the roll's rules would not take from `actor` now (core's `mayAppend`), before
 * any other work: 403 when the lot is another account's to act on, 409 when its status or
 * another rule stands in the way, with core's reason (prefixed with `lot`'s name, when given,
 * for writes over several lots).
 */
export function requireMayAppend(
  state: RollState,
  kind: EntryKind,
  actor: string,
  options: { now?: string; lot?: string } = {},
): void {
  const p = mayAppend(state, kind, actor, options.now !== undefined ? { now: options.now } : {});
  if (p.allowed) return;
  const reason = options.lot ? `Lot ${formatLotCode(options.lot)}: ${p.reason}` : p.reason;
  throw new AppError(p.why === 'actor' ? 'forbidden' : 'roll_rule', reason);
}
