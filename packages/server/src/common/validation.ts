import { ValidationPipe, type ValidationError } from '@nestjs/common';
import { AppError, type FieldProblem } from './app-error';

function flatten(errors: ValidationError[], prefix = ''): FieldProblem[] {
  const out: FieldProblem[] = [];
  for (const e of errors) {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    for (const reason of Object.values(e.constraints ?? {})) out.push({ field, reason });
    if (e.children?.length) out.push(...flatten(e.children, field));
  }
  return out;
}

/** The global pipe: unknown fields are refused, values are transformed to their DTO types. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    exceptionFactory: (errors) => AppError.validation(flatten(errors)),
  });
}
