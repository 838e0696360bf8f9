import { beadrollBrand } from '../../app/brand';
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { readTagCode } from '@beadroll/core';
import { tickStep, yearAxis } from './ConsensusChart';
import { parsePublicPath } from './route';
import { countWords, lengthWords, periodWords, yearWords } from './words';

// Relative luminance and contrast ratio as WCAG 2.1 defines them (SC 1.4.3 and its glossary);
// 4.5:1 is the AA minimum for normal text.
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = (v: number) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
  return 0.2126 * lin(r!) + 0.7152 * lin(g!) + 0.0722 * lin(b!);
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

describe('public page colours (WCAG 2.1 AA, 4.5:1)', () => {
  const css = readFileSync(join(__dirname, 'public-lot.css'), 'utf8');
  const v = (name: string) => {
    const m = new RegExp(`--${name}:\\s*(#[0-9a-f]{6})`).exec(css);
    if (!m) throw new Error(`--${name} not found`);
    return m[1]!;
  };
  it('reproduces the WCAG extremes: black on white is 21:1', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
  });
  it('text colours on their backgrounds', () => {
    const pairs: [string, string][] = [
      [v('ink'), v('paper')],
      [v('ink'), v('paper-2')],
      [v('ink-muted'), v('paper')],
      [v('ink-muted'), v('paper-2')],
      [v('bad'), v('paper')],
      [v('bad'), v('bad-bg')],
      [v('warn'), v('warn-bg')],
      [v('dissent'), v('paper')],
      [beadrollBrand[70], v('paper')], // links
      [beadrollBrand[50], v('paper')], // "unbroken history"
      [beadrollBrand[40], v('paper')], // headings
      ['#ffffff', beadrollBrand[80]], // buttons and marks
      ['#ffffff', beadrollBrand[40]], // the top bar
      [beadrollBrand[150], beadrollBrand[40]],
      [beadrollBrand[40], beadrollBrand[150]], // the tag badge
      [v('ink-muted'), beadrollBrand[160]],
    ];
    for (const [fg, bg] of pairs) expect(contrast(fg, bg), `${fg} on ${bg}`).toBeGreaterThanOrEqual(4.5);
  });
});

describe('public addresses', () => {
  it('reads both the typed-code and the tag form, any case', () => {
    // Ledger format §4 example code 7K2Q-M9XA-T; input is read case-insensitively.
    expect(parsePublicPath('/l/7k2q-m9xa-t')).toEqual({ code: '7K2QM9XAT', tagRef: null });
    expect(parsePublicPath('/L/7K2QM9XAT/AVV5EN5TQ3')).toEqual({ code: '7K2QM9XAT', tagRef: 'AVV5EN5TQ3' });
  });
  it('treats a code with a wrong check symbol like any other unknown address', () => {
    expect(parsePublicPath('/l/7K2QM9XAS')).toBeNull();
    expect(parsePublicPath('/lots/7K2QM9XAT')).toBeNull();
    expect(parsePublicPath('/l/7K2QM9XAT/a/b')).toBeNull();
  });
  it('reads a typed tag as printed, with or without its entry number', () => {
    expect(readTagCode('AVV5E-N5TQ3')).toEqual({ ok: true, ref: 'AVV5EN5TQ3', checked: false });
    expect(readTagCode(' entry 12 · avv5e-n5tq3-d ')).toEqual({
      ok: true,
      ref: 'AVV5EN5TQ3',
      checked: true,
      seq: 12,
    });
    expect(readTagCode('12 AVV5EN5TQ3')).toMatchObject({ ok: true, ref: 'AVV5EN5TQ3', seq: 12 });
    expect(readTagCode('AVV5E')).toMatchObject({ ok: false, problem: 'length' });
  });
});

describe('words and the year axis', () => {
  it('writes periods, years and counts plainly', () => {
    expect(periodWords({ from: 1850, to: 1900, approximate: true })).toBe('about 1850–1900');
    expect(periodWords({ from: 1860, to: 1860, approximate: false })).toBe('1860');
    // There is no year 0 in the BCE/CE reckoning: astronomical year 0 is 1 BCE, −99 is 100 BCE
    // (common practice, no source).
    expect(yearWords(0)).toBe('1 BCE');
    expect(yearWords(-99)).toBe('100 BCE');
    expect(countWords({ value: 25, estimated: true })).toBe('about 25 beads');
    expect(countWords({ value: 1, estimated: false })).toBe('1 bead');
  });
  it('converts lengths at 25.4 mm to the inch (international inch, 1959; NIST SP 811 B.8)', () => {
    expect(lengthWords(254)).toBe('254 mm (10 in)');
    expect(lengthWords(457.2)).toBe('457.2 mm (18 in)');
  });
  it('keeps the axis to a few round ticks around every period', () => {
    expect(tickStep(100)).toBe(20);
    expect(tickStep(10)).toBe(2);
    const axis = yearAxis([
      { body: { period: { from: 1850, to: 1900 } } },
      { body: { period: { from: 1950, to: 1980 } } },
    ] as never);
    expect(axis).toEqual({ from: 1850, to: 2000, ticks: [1850, 1875, 1900, 1925, 1950, 1975, 2000] });
  });
});
