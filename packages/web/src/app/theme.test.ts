import { describe, expect, it } from 'vitest';
import { beadrollBrand, beadrollTheme } from './theme';

// Relative luminance and contrast ratio as defined by WCAG 2.1 (Success Criterion 1.4.3,
// "contrast ratio" and "relative luminance" in its glossary); 4.5:1 is the AA minimum for text.
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = (v: number) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('theme contrast (WCAG 2.1 AA, 4.5:1 for text)', () => {
  it('computes the WCAG reference extremes: black on white is 21:1', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
  });

  it('white text on the primary brand background', () => {
    expect(
      contrast(beadrollTheme.colorNeutralForegroundOnBrand, beadrollTheme.colorBrandBackground),
    ).toBeGreaterThanOrEqual(4.5);
    expect(contrast('#ffffff', beadrollTheme.colorBrandBackgroundHover)).toBeGreaterThanOrEqual(4.5);
  });

  it('brand links on the page background', () => {
    expect(
      contrast(beadrollTheme.colorBrandForegroundLink, beadrollTheme.colorNeutralBackground1),
    ).toBeGreaterThanOrEqual(4.5);
    expect(
      contrast(beadrollTheme.colorBrandForeground1, beadrollTheme.colorNeutralBackground2),
    ).toBeGreaterThanOrEqual(4.5);
  });

  it('ships the Atkinson Hyperlegible font first in the stack', () => {
    expect(beadrollTheme.fontFamilyBase.startsWith("'Atkinson Hyperlegible'")).toBe(true);
    expect(Object.keys(beadrollBrand)).toHaveLength(16);
  });
});
