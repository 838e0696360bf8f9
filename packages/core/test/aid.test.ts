import { describe, expect, it } from 'vitest';
import {
  AID_DISCLAIMER,
  attributionAid,
  CAUTION_RULES,
  INDICATION_RULES,
  PERIOD_RULES,
  type AidInput,
} from '../src/index.js';
import cases from './fixtures/aid-cases.json' with { type: 'json' };

interface AidCase {
  desc: string;
  source: string;
  input: AidInput;
  expect: {
    indicationRules?: string[];
    topOrigins?: string[];
    warnings?: string[];
    wholePeriod?: boolean;
    cautions?: string[];
  };
}

// Each case cites its trade source in the fixture file.
describe('attribution aid against trade facts', () => {
  for (const c of cases.cases as AidCase[]) {
    it(c.desc, () => {
      const r = attributionAid(c.input);
      if (c.expect.indicationRules) {
        const rules = [...new Set(r.indications.flatMap((i) => i.reasons.map((x) => x.rule)))].sort();
        expect(rules).toEqual([...c.expect.indicationRules].sort());
      }
      if (c.expect.topOrigins) {
        const top = r.indications.filter((i) => i.origin).map((i) => i.origin);
        expect(top.slice(0, c.expect.topOrigins.length).sort()).toEqual([...c.expect.topOrigins].sort());
      }
      if (c.expect.warnings) expect(r.warnings.map((w) => w.rule)).toEqual(c.expect.warnings);
      if (c.expect.wholePeriod !== undefined) expect(r.warnings[0].wholePeriod).toBe(c.expect.wholePeriod);
      if (c.expect.cautions)
        expect(r.cautions.map((x) => x.rule).sort()).toEqual([...c.expect.cautions].sort());
      expect(r.disclaimer).toBe(AID_DISCLAIMER);
    });
  }

  it('every rule carries a source, with museum and standards sources listed first', () => {
    for (const rule of [...INDICATION_RULES, ...PERIOD_RULES, ...CAUTION_RULES]) {
      expect(rule.sources.length).toBeGreaterThan(0);
    }
    const r = attributionAid({
      observations: { uvA: 'green-glow' },
      draft: { period: { from: 1700, to: 1750 } },
    });
    const standings = r.warnings[0].sources.map((s) => s.standing);
    expect(standings[0]).not.toBe('trade-page');
  });

  it('says it is an aid, not an authentication', () => {
    expect(AID_DISCLAIMER).toMatch(/aid, not an authentication/);
    expect(AID_DISCLAIMER).toMatch(/consumer-protection/);
  });
});
