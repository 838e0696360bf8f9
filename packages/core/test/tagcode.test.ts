import { describe, expect, it } from 'vitest';
import { checkTagCode, printedTagCode, readTagCode, tagReference } from '../src/index.js';

// The lot-code example of the ledger format (§4): data 7K2QM9XA is 261011154858, mod 37 = 26 = T
// (Crockford's Base32, www.crockford.com/base32.html). The same arithmetic makes a tag code's check.
describe('printed tag codes', () => {
  const hash = '56f65754bab8d88c30f739591b286e119fe98ee05e3655b505556540f963075f';
  const ref = tagReference(hash); // AVV5EN5TQ3, the worked example of §12
  const entries = [{ hash, header: { seq: 0 } }];
  it('carry the Crockford check symbol of the reference', () => {
    expect(ref).toBe('AVV5EN5TQ3');
    const code = printedTagCode(ref);
    // 382464108456675 mod 37 = 13 = D (worked by hand with Crockford's check table; ledger format §4).
    expect(code).toBe('AVV5E-N5TQ3-D');
    expect(readTagCode(code)).toEqual({ ok: true, ref, checked: true });
  });
  it('are read in any case, with spaces, dashes and look-alikes', () => {
    const code = printedTagCode(ref).toLowerCase().replace(/-/g, ' ');
    expect(readTagCode(`entry 0 · ${code}`)).toMatchObject({ ok: true, ref, seq: 0 });
    expect(readTagCode('avv5e-n5tq3')).toEqual({ ok: true, ref, checked: false });
    expect(checkTagCode(entries, readTagCode('AVV5E N5TQ3'))).toEqual({ state: 'matches', seq: 0, since: 0 });
  });
  it('a code one symbol off, or failing its check, is a typing error; a well-formed stranger is absent', () => {
    const check = printedTagCode(ref).at(-1)!;
    expect(checkTagCode(entries, readTagCode(`AVV5E-N5TQ4-${check}`))).toEqual({ state: 'typing-error' });
    expect(checkTagCode(entries, readTagCode('AVV5E-N5TQ4'))).toEqual({ state: 'typing-error' });
    const other = tagReference('00'.repeat(32));
    expect(checkTagCode(entries, readTagCode(printedTagCode(other)))).toEqual({ state: 'absent' });
    expect(checkTagCode(entries, readTagCode('AVV5'))).toEqual({ state: 'unreadable' });
  });
});
