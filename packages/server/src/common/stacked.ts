import { applyDecorators } from '@nestjs/common';

/**
 * Applies property decorators as if written one above the other in this order, so that the
 * validators report their reasons in the order a reader sees them (`applyDecorators` alone
 * runs them top first, the reverse of a written stack).
 */
export function stacked(...decorators: PropertyDecorator[]): PropertyDecorator {
  return applyDecorators(...[...decorators].reverse());
}
