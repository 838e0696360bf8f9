import { registerDecorator } from 'class-validator';

/**
 * A field checked by one of core's plausibility functions (`beadSizeProblem`, `countProblem`,
 * …): valid when it returns null, and its message, written for a dealer, is the reason.
 * `problem` also sees the object holding the field (for a currency beside an amount).
 */
export function Plausible(problem: (value: unknown, object: Record<string, unknown>) => string | null) {
  return (target: object, propertyName: string) =>
    registerDecorator({
      name: 'plausible',
      target: target.constructor,
      propertyName,
      validator: {
        validate: (value, args) => problem(value, args!.object as Record<string, unknown>) === null,
        defaultMessage: (args) =>
          problem(args!.value, args!.object as Record<string, unknown>) ?? 'is not plausible',
      },
    });
}

/** The current time for plausibility checks of dates and years in requests. */
export function nowIso(): string {
  return new Date().toISOString();
}
