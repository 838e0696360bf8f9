import { requestFor } from '@beadroll/core';
import type { LotActionContext } from '../lots/lot-actions';

/**
 * Whether the viewer may add evidence to the lot on its page: a verified dealer or assessor who
 * holds it, anyone such on a listed lot, or an assessor an open request on the roll asks (the
 * roll's rule for `exhibit-added`; the server names the request).
 */
export function mayAddExhibits(ctx: LotActionContext): boolean {
  const v = ctx.viewer;
  if (!v || v.status !== 'verified' || (v.role !== 'dealer' && v.role !== 'assessor')) return false;
  return (
    ctx.state.holder === v.id ||
    ctx.state.listed ||
    (v.role === 'assessor' && requestFor(ctx.state, v.id) !== undefined)
  );
}
