import { describe, expect, it } from 'vitest';
import { allowedActions, checkTransition, mayAppend, TRANSITION_RULES } from '../src/index.js';
import type { EntryKind, Permission } from '../src/index.js';
import { HOLDER, OTHER, RollBuilder, THIRD, opinion } from './helpers.js';

/** A refusal: what stands in the way, and the words a dealer reads. */
function refused(why: 'actor' | 'status' | 'rule', reason: string): Permission {
  return { allowed: false, why, reason };
}

describe('what an account may do on a lot now', () => {
  it('answers for every kind of the rule table', () => {
    const r = new RollBuilder().register();
    expect(Object.keys(allowedActions(r.state, HOLDER)).sort()).toEqual(Object.keys(TRANSITION_RULES).sort());
  });

  it('lets the holder of a held lot offer, sell, split and retire it, and nobody else', () => {
    const r = new RollBuilder().register();
    const mine = allowedActions(r.state, HOLDER);
    for (const k of [
      'described',
      'observed',
      'transfer-offered',
      'sold',
      'split',
      'combined',
      'retired',
    ] as const)
      expect(mine[k]).toEqual({ allowed: true });
    const theirs = allowedActions(r.state, OTHER);
    expect(theirs['transfer-offered']).toEqual(
      refused('actor', 'Only the dealer who holds this lot can do this.'),
    );
    expect(theirs.registered).toMatchObject({ allowed: false, why: 'status' });
  });

  it('lets anyone give an opinion or evidence on a listed lot, only the holder on an unlisted one', () => {
    const listed = new RollBuilder().register();
    expect(mayAppend(listed.state, 'opinion', OTHER)).toEqual({ allowed: true });
    expect(mayAppend(listed.state, 'exhibit-added', OTHER)).toEqual({ allowed: true });
    const unlisted = new RollBuilder().register(HOLDER, { listed: false });
    expect(mayAppend(unlisted.state, 'opinion', HOLDER)).toEqual({ allowed: true });
    expect(mayAppend(unlisted.state, 'opinion', OTHER)).toEqual(
      refused('actor', 'This lot is unlisted: only the dealer who holds it can do this.'),
    );
  });

  it('names the open offer: the recipient answers it, the offerer withdraws it, the lot waits', () => {
    const r = new RollBuilder().register();
    r.add('transfer-offered', HOLDER, { recipient: OTHER });
    expect(mayAppend(r.state, 'transfer-accepted', OTHER)).toEqual({ allowed: true });
    expect(mayAppend(r.state, 'transfer-declined', OTHER)).toEqual({ allowed: true });
    expect(mayAppend(r.state, 'transfer-accepted', THIRD)).toMatchObject({ allowed: false, why: 'actor' });
    expect(mayAppend(r.state, 'transfer-withdrawn', HOLDER)).toEqual({ allowed: true });
    expect(mayAppend(r.state, 'transfer-withdrawn', OTHER)).toMatchObject({ allowed: false, why: 'actor' });
    const split = mayAppend(r.state, 'split', HOLDER);
    expect(split).toMatchObject({ allowed: false, why: 'status' });
    expect(split.allowed || split.reason).toMatch(/open offer/);
  });

  it('lets the seller void a sale within 24 hours of it, and says why not after', () => {
    const r = new RollBuilder().register();
    const sale = r.add('sold', HOLDER, { date: '2025-01-01' });
    const t = Date.parse(sale.header.time);
    // the 24-hour window of the roll rules (docs/ledger-format.md, sale-voided)
    const soon = new Date(t + 23 * 3600_000).toISOString();
    const late = new Date(t + 25 * 3600_000).toISOString();
    expect(mayAppend(r.state, 'sale-voided', HOLDER, { now: soon })).toEqual({ allowed: true });
    expect(mayAppend(r.state, 'sale-voided', HOLDER, { now: late })).toEqual(
      refused('rule', 'A sale can be voided only within 24 hours of it.'),
    );
    expect(mayAppend(r.state, 'sale-voided', OTHER, { now: soon })).toMatchObject({ why: 'actor' });
    expect(mayAppend(r.state, 'sold', HOLDER)).toEqual(refused('status', 'This lot was sold on 2025-01-01.'));
  });

  it('lets an author withdraw only an opinion of their own', () => {
    const r = new RollBuilder().register();
    expect(mayAppend(r.state, 'opinion-withdrawn', OTHER)).toMatchObject({ allowed: false, why: 'rule' });
    r.add('opinion', OTHER, opinion('venice-murano', 1850, 1900));
    expect(mayAppend(r.state, 'opinion-withdrawn', OTHER)).toEqual({ allowed: true });
    expect(mayAppend(r.state, 'opinion-withdrawn', THIRD)).toMatchObject({ allowed: false });
  });

  it('agrees with the rules on every kind an entry of which the rules can check without a body', () => {
    // mutations of one good roll: each status the lot can be in, each account
    const held = new RollBuilder().register();
    const offered = new RollBuilder().register();
    offered.add('transfer-offered', HOLDER, { recipient: OTHER });
    const retired = new RollBuilder().register();
    retired.add('retired', HOLDER, {});
    for (const r of [held, offered, retired])
      for (const actor of [HOLDER, OTHER, THIRD, 'beadroll:system'])
        for (const kind of Object.keys(TRANSITION_RULES) as EntryKind[]) {
          const bare = checkTransition(r.state, { kind, actor, body: null });
          const may = mayAppend(r.state, kind, actor);
          if (!bare.ok) expect(may.allowed, `${kind} by ${actor} on ${r.state!.status}`).toBe(false);
        }
  });
});
