import { findInputProblem } from './input-safety';

const NUL = String.fromCharCode(0);

describe('findInputProblem', () => {
  it('accepts ordinary text, including characters outside the Basic Multilingual Plane', () => {
    // U+1F4FF (prayer beads) is the surrogate pair D83D DCFF in UTF-16 (Unicode 15, §3.9 D91).
    expect(findInputProblem({ title: 'Rosary \u{1F4FF} beads', tags: ['é', '中'] }, 32)).toBeNull();
  });

  it('names the field holding a NUL or a lone surrogate, at any depth', () => {
    expect(findInputProblem({ a: { b: [`x${NUL}`] } }, 32)).toEqual({
      field: 'a.b.0',
      reason: expect.stringContaining('NUL'),
    });
    expect(findInputProblem({ email: 'a\uD83Dz' }, 32)?.field).toBe('email');
    expect(findInputProblem({ email: '\uDCFFz' }, 32)?.field).toBe('email');
    expect(findInputProblem({ [`k${NUL}`]: 1 }, 32)?.reason).toMatch(/field name/);
    expect(findInputProblem(`x${NUL}`, 32, 'code', 'param')).toMatchObject({ field: 'code' });
  });

  it('refuses nesting beyond the limit without recursing', () => {
    let deep: unknown = 1;
    for (let i = 0; i < 100_000; i++) deep = [deep];
    expect(findInputProblem({ x: deep }, 32)?.reason).toMatch(/nested too deeply \(more than 32 levels\)/);
    expect(findInputProblem({ a: { b: { c: 1 } } }, 3)).toBeNull();
    expect(findInputProblem({ a: { b: { c: {} } } }, 3)?.field).toBe('a.b.c');
  });
});
