import type { FieldIssue, ValidationError } from '@beadroll/core';
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
