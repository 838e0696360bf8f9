import { describe, expect, it } from 'vitest';
import {
  CURRENCIES,
  GENESIS_PREV,
  bodyDigest,
  bodyIssues,
  canonicalise,
  entryHash,
  currencyOf,
  parseAmount,
  verifyRoll,
  yearProblem,
  type StoredEntry,
} from '../src/index.js';
import { HOLDER, LOT, OTHER, RollBuilder, description } from './helpers.js';

function soldRoll(): RollBuilder {
  const r = new RollBuilder().register();
  r.add('sold', HOLDER, { date: '2025-01-01' }, { time: '2025-01-01T10:00:00.000Z' });
  return r;
}

describe('sale-voided', () => {
  it('the seller voids a sale within 24 hours and the lot is held again; it verifies', () => {
    const r = soldRoll();
    r.add(
      'sale-voided',
      HOLDER,
      { saleSeq: 1, reason: 'Recorded on the wrong lot' },
      {
        time: '2025-01-02T09:59:59.999Z',
      },
    );
    expect(r.state).toMatchObject({ status: 'held', soldSeq: null, soldTime: null });
    expect(verifyRoll(r.stored)).toMatchObject({ ok: true, entries: 3 });
    // The lot can be sold again afterwards.
    r.add('sold', HOLDER, { date: '2025-01-02' }, { time: '2025-01-02T11:00:00.000Z' });
    expect(r.state?.status).toBe('sold');
  });

  it('exactly 24 hours after the sale is still within the window', () => {
    const r = soldRoll();
    const t = r.tryAdd('sale-voided', HOLDER, { saleSeq: 1 }, { time: '2025-01-02T10:00:00.000Z' });
    expect('refused' in t).toBe(false);
  });

  it('is refused after 24 hours, and a verifier catches a late void', () => {
    const r = soldRoll();
    const late = { time: '2025-01-02T10:00:00.001Z' };
    expect(r.tryAdd('sale-voided', HOLDER, { saleSeq: 1 }, late)).toEqual({ refused: 'bad-transition' });
    r.add('sale-voided', HOLDER, { saleSeq: 1 }, { ...late, unchecked: true });
    expect(verifyRoll(r.stored)).toMatchObject({ ok: false, seq: 2, reason: 'bad-transition' });
  });

  it('only the seller may void, only the current sale, only while sold', () => {
    const r = soldRoll();
    const t = { time: '2025-01-01T11:00:00.000Z' };
    expect(r.tryAdd('sale-voided', OTHER, { saleSeq: 1 }, t)).toEqual({ refused: 'bad-actor' });
    expect(r.tryAdd('sale-voided', HOLDER, { saleSeq: 0 }, t)).toEqual({ refused: 'bad-transition' });
    const held = new RollBuilder().register();
    expect(held.tryAdd('sale-voided', HOLDER, { saleSeq: 0 })).toEqual({ refused: 'bad-transition' });
  });

  it('has a closed body shape', () => {
    expect(bodyIssues('sale-voided', { nonce: '0'.repeat(32), saleSeq: 1, price: 3 })).toEqual([
      { path: 'price', message: 'is not a known field' },
    ]);
  });
});

describe('corrections', () => {
  it('a description corrects the registered entry or an earlier description, and verifies', () => {
    const r = new RollBuilder().register();
    r.add('described', HOLDER, {
      description: description({ title: 'Test strand, blue' }),
      corrects: { seq: 0, reason: 'The colour was wrong' },
    });
    r.add('described', HOLDER, {
      description: description({ title: 'Test strand, dark blue' }),
      corrects: { seq: 1, reason: 'Darker than written' },
    });
    expect(verifyRoll(r.stored)).toMatchObject({ ok: true, entries: 3 });
  });

  it('an observation corrects only an earlier observation', () => {
    const r = new RollBuilder().register();
    expect(
      r.tryAdd('observed', HOLDER, { observations: { hole: 'clean' }, corrects: { seq: 0, reason: 'x' } }),
    ).toEqual({ refused: 'bad-transition' });
    r.add('observed', HOLDER, { observations: { hole: 'clean' } });
    r.add('observed', HOLDER, {
      observations: { hole: 'powder' },
      corrects: { seq: 1, reason: 'Looked again' },
    });
    expect(
      r.tryAdd('described', HOLDER, { description: description(), corrects: { seq: 1, reason: 'x' } }),
    ).toEqual({ refused: 'bad-transition' });
    expect(verifyRoll(r.stored)).toMatchObject({ ok: true });
  });

  it('a verifier refuses a correction that names a later entry or another kind', () => {
    const r = new RollBuilder().register();
    r.add('observed', HOLDER, { observations: {}, corrects: { seq: 5, reason: 'x' } }, { unchecked: true });
    const v = verifyRoll(r.stored as StoredEntry[]);
    expect(v).toMatchObject({ ok: false, seq: 1, reason: 'bad-transition' });
  });

  it('needs a reason', () => {
    const issues = bodyIssues('observed', {
      nonce: '0'.repeat(32),
      observations: {},
      corrects: { seq: 0 },
    });
    expect(issues).toContainEqual({ path: 'corrects.reason', message: 'is required' });
  });
});

describe('plausibility bounds', () => {
  it('new entries refuse a 99999 mm bead, a zero count and a year after the entry’s year', () => {
    const r = new RollBuilder();
    expect(() => r.register(HOLDER, { diameterMm: { min: 4, max: 99999 } })).toThrow(
      /Enter a bead size between 0.5 and 100 mm/,
    );
    expect(() => r.register(HOLDER, { count: { value: 0, estimated: false } })).toThrow(
      /Enter a whole number of beads between 1 and 1,000,000/,
    );
    r.register();
    expect(() =>
      r.add('opinion', HOLDER, {
        origin: 'venice-murano',
        period: { from: 1850, to: 2026, approximate: true },
        technique: 'wound-lampwork',
        qualifier: 'attributed-to',
        confidence: 'medium',
        rationale: '',
        exhibits: [],
      }),
    ).toThrow(/Enter a year between 3000 BC and 2025/);
  });

  it('refuses an unknown currency and a non-positive amount in sealed money', () => {
    const register = (cost: { amount: number; currency: string }) => () =>
      new RollBuilder().add(
        'registered',
        HOLDER,
        { description: description() },
        { sealed: { 'acquisition-cost': cost } },
      );
    expect(register({ amount: 100, currency: 'ZZZ' })).toThrow(/ISO 4217/);
    expect(register({ amount: 0, currency: 'EUR' })).toThrow(/above 0/);
  });

  it('version 1 entries written with looser values keep verifying', () => {
    // Written by hand, as a version 1 writer did before the bounds: a 99999 mm strand.
    const body = canonicalise({ nonce: 'a'.repeat(32), description: description({ strandLengthMm: 99999 }) });
    const header = canonicalise({
      v: 1,
      lot: LOT,
      seq: 0,
      kind: 'registered',
      time: '2025-01-01T00:00:00.000Z',
      actor: HOLDER,
      prev: GENESIS_PREV,
      body: bodyDigest(body),
    });
    expect(verifyRoll([{ hash: entryHash(header), header, body }])).toMatchObject({ ok: true });
  });

  // Minor units per ISO 4217 List One (as published by the ISO 4217 maintenance agency):
  // EUR 2, JPY 0, KWD 3.
  it('knows minor units per currency and reads typed amounts with them', () => {
    expect(currencyOf('EUR')?.digits).toBe(2);
    expect(currencyOf('JPY')?.digits).toBe(0);
    expect(currencyOf('KWD')?.digits).toBe(3);
    expect(currencyOf('XAU')).toBeUndefined();
    expect(currencyOf('ZZZ')).toBeUndefined();
    expect(CURRENCIES.length).toBeGreaterThan(140);
    expect(parseAmount('12.50', 'EUR')).toEqual({ amount: 1250 });
    expect(parseAmount('12,5', 'EUR')).toEqual({ amount: 1250 });
    expect(parseAmount('1500', 'JPY')).toEqual({ amount: 1500 });
    expect(parseAmount('1.5', 'JPY')).toEqual({ problem: expect.stringMatching(/whole number/) });
    expect(parseAmount('1.250', 'KWD')).toEqual({ amount: 1250 });
    expect(parseAmount('-5', 'EUR')).toEqual({ problem: expect.stringMatching(/^Enter the amount/) });
    expect(parseAmount('0', 'EUR')).toEqual({ problem: expect.stringMatching(/above 0/) });
  });

  it('says years in words', () => {
    expect(yearProblem(1850, 2026)).toBeNull();
    expect(yearProblem(2027, 2026)).toBe('Enter a year between 3000 BC and 2026');
    expect(yearProblem(1850.5, 2026)).toBe('Enter a year between 3000 BC and 2026');
  });
});
