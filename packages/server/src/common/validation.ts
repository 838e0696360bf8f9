import { applyDecorators, ValidationPipe, type ValidationError } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  IsDefined,
  IsIn,
  IsObject,
  IsOptional,
  IsString,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import { AppError, type FieldProblem } from './app-error';

/**
 * A field holding one nested object of class `type`: required (unless `optional`), an object and
 * not a list or a scalar, and validated as `type`. `missing` replaces the message for a missing
 * value.
 */
export function NestedObject(
  type: () => new () => object,
  opts: { optional?: boolean; missing?: string } = {},
): PropertyDecorator {
  return applyDecorators(
    opts.optional ? IsOptional() : IsDefined(opts.missing ? { message: opts.missing } : undefined),
    IsObject(),
    ValidateNested(),
    Type(type),
  );
}

/**
 * {@link NestedObject} and its entry in the OpenAPI document: a field holding one object of class
 * `type` (declared before the field), with `description` when given.
 */
export function NestedField(
  type: new () => object,
  opts: { optional?: boolean; missing?: string; description?: string } = {},
): PropertyDecorator {
  const { description, ...rules } = opts;
  const doc = { type, ...(description === undefined ? {} : { description }) };
  return applyDecorators(
    opts.optional ? ApiPropertyOptional(doc) : ApiProperty(doc),
    NestedObject(() => type, rules),
  );
}

/**
 * An optional field that, when given, holds one of `values`. `description` and `default` go to
 * the OpenAPI document; `message` replaces the validator's own reason, and `listed` makes it the
 * plain list of choices.
 */
export function OptionalChoice(
  values: readonly string[],
  opts: { description?: string; default?: string; message?: string; listed?: boolean } = {},
): PropertyDecorator {
  const { listed, ...rest } = opts;
  const { message = listed ? `must be one of ${values.join(', ')}` : undefined, ...doc } = rest;
  return applyDecorators(
    ApiPropertyOptional({ enum: [...values], ...doc }),
    IsOptional(),
    IsIn(values, message === undefined ? undefined : { message }),
  );
}

/** An optional text field: when given, a string of 1 to `max` characters. */
export function OptionalText(max: number): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional({ maxLength: max }),
    IsOptional(),
    IsString(),
    MinLength(1),
    MaxLength(max),
  );
}

/**
 * The reasons worth showing for one field: a missing value is only "missing" (not also "not an
 * object"), and a value that is not an object is not also "not a nested object" (nor are its
 * elements examined, below).
 */
function reasonsOf(constraints: Record<string, string>): string[] {
  if (constraints.isDefined) return [constraints.isDefined];
  const skip = constraints.isObject ? 'nestedValidation' : undefined;
  return Object.entries(constraints)
    .filter(([name]) => name !== skip)
    .map(([, reason]) => reason);
}

/** class-validator's errors as field problems, one reason per field path. */
export function flatten(errors: ValidationError[], prefix = ''): FieldProblem[] {
  const out: FieldProblem[] = [];
  for (const e of errors) {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    for (const reason of reasonsOf(e.constraints ?? {})) out.push({ field, reason });
    // Inside a value that is not an object there is nothing more to say.
    if (e.children?.length && !e.constraints?.isObject) out.push(...flatten(e.children, field));
  }
  return out;
}

/** The global pipe: unknown fields are refused, values are transformed to their DTO types. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    // One reason per field, the first that fails: a dealer reads one thing to fix.
    stopAtFirstError: true,
    transform: true,
    exceptionFactory: (errors) => AppError.validation(flatten(errors)),
  });
}
