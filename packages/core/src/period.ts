import type { Period } from './types.js';

/**
 * A year in words. Years follow ISO 8601's astronomical numbering, where year 0 is 1 BCE and
 * year −99 is 100 BCE; years before 1 are written with "BCE".
 */
export function yearWords(y: number): string {
  return y < 1 ? `${1 - y} BCE` : String(y);
}

/** A period in words: "about 1850–1900", or "1860" when it starts and ends in the same year. */
export function periodWords(p: Period): string {
  const range = p.from === p.to ? yearWords(p.from) : `${yearWords(p.from)}–${yearWords(p.to)}`;
  return p.approximate ? `about ${range}` : range;
}
