import { describe, expect, it } from 'vitest';
import { periodWords, yearWords } from '../src/index.js';

describe('periods in words', () => {
  it('numbers years before 1 as ISO 8601 does: year 0 is 1 BCE, year −99 is 100 BCE', () => {
    // ISO 8601-1:2019: its year numbering has a year 0000 just before 0001, which is 1 BC in the
    // historical reckoning (that has no year 0); from memory, clause not rechecked.
    expect(yearWords(0)).toBe('1 BCE');
    expect(yearWords(-99)).toBe('100 BCE');
    expect(yearWords(1)).toBe('1');
    expect(yearWords(1615)).toBe('1615');
  });
  it('writes a range, an approximate range and a single year', () => {
    expect(periodWords({ from: 1850, to: 1900, approximate: true })).toBe('about 1850–1900');
    expect(periodWords({ from: 1860, to: 1860, approximate: false })).toBe('1860');
    expect(periodWords({ from: -199, to: -99, approximate: true })).toBe('about 200 BCE–100 BCE');
  });
});
