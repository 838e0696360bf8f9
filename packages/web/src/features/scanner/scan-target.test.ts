import { describe, expect, it } from 'vitest';
import { publicPath, readScan } from './scan-target';

describe('reading a scan', () => {
  it('reads a printed tag payload, any case', () => {
    expect(readScan('HTTPS://BEADS.EXAMPLE/L/7K2QM9XAT/ABCDEFGHJK')).toEqual({
      code: '7K2QM9XAT',
      ref: 'ABCDEFGHJK',
    });
    expect(readScan('http://beads.example/l/7k2q-m9xa-t/abcde-fghjk')).toEqual({
      code: '7K2QM9XAT',
      ref: 'ABCDEFGHJK',
    });
  });
  it('reads a public link and a typed code', () => {
    expect(readScan('https://beads.example/l/7K2Q-M9XA-T')).toEqual({ code: '7K2QM9XAT' });
    expect(readScan(' 7k2q-m9xa-t ')).toEqual({ code: '7K2QM9XAT' });
  });
  it('refuses other text and a wrong check symbol', () => {
    expect(readScan('https://elsewhere.example/shop')).toBeNull();
    expect(readScan('7K2Q-M9XA-V')).toBeNull();
    expect(readScan('')).toBeNull();
  });
  it('opens the tag-checking public page when the tag reference is known', () => {
    expect(publicPath({ code: '7K2QM9XAT', ref: 'ABCDEFGHJK' })).toBe('/L/7K2QM9XAT/ABCDEFGHJK');
    expect(publicPath({ code: '7K2QM9XAT' })).toBe('/l/7K2QM9XAT');
  });
});
