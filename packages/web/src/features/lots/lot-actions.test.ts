import {
  buildEntry,
  headOf,
  reduceEntry,
  seededRandom,
  type BodyFields,
  type BuiltEntry,
  type EntryKind,
  type RollState,
} from '@beadroll/core';
import { describe, expect, it } from 'vitest';
import type { Me } from '../accounts/accounts.api';
import { LOT_ACTIONS, permission, type LotActionContext } from './lot-actions';

const LOT = '7K2QM9XAT';
const HOLDER = 'acct-holder1';
const OTHER = 'acct-other02';

/** A roll built entry by entry with core's writer and reducer, as the lot page derives it. */
function rollOf(steps: Array<{ kind: EntryKind; actor: string; body: object }>): RollState {
  const random = seededRandom('lot actions');
  let state: RollState | null = null;
  let last: BuiltEntry | null = null;
  steps.forEach((s, i) => {
    const time = new Date(Date.now() - (steps.length - i) * 60_000).toISOString();
    last = buildEntry(
      last ? headOf(last) : null,
      { lot: LOT, kind: s.kind, actor: s.actor, time, body: s.body as BodyFields<typeof s.kind> },
      { random },
    );
    state = reduceEntry(state, { header: last.header, hash: last.stored.hash, body: last.body });
  });
  return state!;
}

const registered = (listed: boolean) => ({
  kind: 'registered' as const,
  actor: HOLDER,
  body: {
    description: {
      title: 'Blue eye beads',
      form: 'strand',
      count: { value: 40, estimated: false },
      colours: ['blue'],
      baseGlass: ['opaque'],
      decoration: [],
      listed,
    },
  },
});

function viewer(id: string, role: Me['role'] = 'dealer', status: Me['status'] = 'verified'): Me {
  return { id, role, status } as Me;
}

function visible(state: RollState, me: Me | null): string[] {
  const ctx: LotActionContext = { code: LOT, state, viewer: me };
  return LOT_ACTIONS.filter((a) => a.visible(ctx)).map((a) => a.id);
}

describe('the lot page offers what the roll rules allow', () => {
  it('shows the holder of a held lot the holder’s actions, and another dealer only an opinion on a listed lot', () => {
    const held = rollOf([registered(true)]);
    expect(visible(held, viewer(HOLDER))).toEqual(
      expect.arrayContaining(['describe', 'observe', 'offer', 'sale', 'split', 'combine', 'opinion']),
    );
    expect(visible(held, viewer(HOLDER))).not.toContain('withdraw-offer');
    expect(visible(held, viewer(OTHER))).toEqual(['opinion']);
    expect(visible(held, viewer(OTHER, 'assessor'))).toEqual(['opinion']);
    expect(visible(rollOf([registered(false)]), viewer(OTHER))).toEqual([]);
    expect(visible(held, viewer(HOLDER, 'dealer', 'suspended'))).toEqual([]);
    expect(visible(held, null)).toEqual([]);
  });

  it('while on offer lets the holder withdraw it and not sell or split, with the reason in words', () => {
    const offered = rollOf([
      registered(true),
      { kind: 'transfer-offered', actor: HOLDER, body: { recipient: OTHER } },
    ]);
    const shown = visible(offered, viewer(HOLDER));
    expect(shown).toContain('withdraw-offer');
    expect(shown).not.toContain('sale');
    expect(shown).not.toContain('split');
    const ctx = { code: LOT, state: offered, viewer: viewer(HOLDER) };
    expect(permission(ctx, 'sold')).toEqual({
      allowed: false,
      why: 'status',
      reason: 'This lot has an open offer: wait for the other dealer’s answer or withdraw the offer first.',
    });
  });

  it('lets the seller void a sale made just now', () => {
    const sold = rollOf([registered(true), { kind: 'sold', actor: HOLDER, body: { date: '2025-01-01' } }]);
    expect(visible(sold, viewer(HOLDER))).toContain('void-sale');
    expect(visible(sold, viewer(HOLDER))).not.toContain('offer');
    expect(visible(sold, viewer(OTHER))).not.toContain('void-sale');
  });
});
