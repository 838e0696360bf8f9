import { jsonDifferences } from '../ledger/roll-replay';
import { sameJson } from './same-json';

/** A value as JSON writes it, the way the audit used to compare a derived value with a stored one. */
const asJson = (v: unknown): unknown => (v === undefined ? undefined : JSON.parse(JSON.stringify(v)));

describe('sameJson', () => {
  const cases: Array<[string, unknown, unknown]> = [
    ['equal scalars', 'held', 'held'],
    ['different scalars', 3, 4],
    ['null and a value', null, 'x'],
    ['key order does not count', { a: 1, b: [1, { c: 'x' }] }, { b: [1, { c: 'x' }], a: 1 }],
    ['a property holding undefined is absent', { a: 1 }, { a: 1, b: undefined }],
    ['a missing property', { a: 1, b: 2 }, { a: 1 }],
    ['an extra property', { a: 1 }, { a: 1, b: 2 }],
    ['a property that is null, not absent', { a: 1, b: null }, { a: 1 }],
    ['arrays of different lengths', [1, 2], [1, 2, 3]],
    ['an array and an object', [], {}],
    ['nested difference', { s: { openOffer: { recipient: 'a' } } }, { s: { openOffer: { recipient: 'b' } } }],
    ['undefined in an array is null in JSON', [null], [undefined]],
    ['a date and its text', '2024-01-01T00:00:00.000Z', new Date('2024-01-01T00:00:00.000Z')],
    ['an object and a set', {}, new Set([1])],
  ];

  it.each(cases)(
    'never calls equal what a full comparison of the JSON copies finds different: %s',
    (_, a, b) => {
      const differs = jsonDifferences(a, asJson(b)).length > 0;
      if (differs) expect(sameJson(a, b)).toBe(false);
    },
  );

  it('finds equal values equal without copying them', () => {
    expect(sameJson({ a: 1, b: [1, { c: 'x' }] }, { b: [1, { c: 'x' }], a: 1 })).toBe(true);
    expect(sameJson({ a: 1 }, { a: 1, b: undefined })).toBe(true);
    expect(sameJson(null, null)).toBe(true);
  });
});
