import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import QRCode from 'qrcode';
import {
  CROCKFORD_ALPHABET,
  QR_ALPHANUMERIC_CAPACITY,
  QR_ALPHANUMERIC_CHARSET,
  QR_MAX_TABLED_VERSION,
  QR_QUIET_ZONE_MODULES,
  TagError,
  generateLotCode,
  isQrAlphanumeric,
  normaliseTagHost,
  parseTagPayload,
  qrModulesPerSide,
  qrVersionForAlphanumeric,
  seededRandom,
  tagPayload,
  tagQrVersion,
  type QrEcLevel,
} from '../src/index.js';
import capacity from './fixtures/qr-capacity.json' with { type: 'json' };
import payloads from './fixtures/tag-payloads.json' with { type: 'json' };

const LEVELS = capacity.levels as QrEcLevel[];
type VersionKey = keyof typeof capacity.alphanumeric;

// Source of the table and geometry: ISO/IEC 18004, through the secondary sources named in
// fixtures/qr-capacity.json (Panasonic LP-RV manual p. 162, alibabacloud article, Denso Wave).
describe('QR capacity table (ISO/IEC 18004, alphanumeric mode)', () => {
  it('holds the published alphanumeric capacities of versions 1–6 at L, M, Q and H', () => {
    for (const [i, level] of LEVELS.entries()) {
      const published = Object.keys(capacity.alphanumeric)
        .map(Number)
        .sort((a, b) => a - b)
        .map((v) => capacity.alphanumeric[String(v) as VersionKey][i]);
      expect(QR_ALPHANUMERIC_CAPACITY[level]).toEqual(published);
    }
    expect(QR_MAX_TABLED_VERSION).toBe(6);
  });

  it('agrees with the published data-bit counts under the alphanumeric mode-bit rule', () => {
    // Mode-bit rule (ISO/IEC 18004): 4 mode bits, 9 count bits for versions 1–9, 11 bits per
    // pair of characters and 6 for an odd last one.
    const bitsFor = (n: number) => 4 + 9 + 11 * Math.floor(n / 2) + 6 * (n % 2);
    for (const [v, bits] of Object.entries(capacity.dataBits)) {
      for (const [i, level] of LEVELS.entries()) {
        const cap = QR_ALPHANUMERIC_CAPACITY[level][Number(v) - 1]!;
        expect(bitsFor(cap)).toBeLessThanOrEqual(bits[i]!);
        expect(bitsFor(cap + 1)).toBeGreaterThan(bits[i]!);
      }
    }
  });

  it('gives the smallest version that holds a length, and null past version 6', () => {
    // A payload of 47 characters (host of 16) is version 2 at L; 48 needs version 3 (table above).
    expect(qrVersionForAlphanumeric(47, 'L')).toBe(2);
    expect(qrVersionForAlphanumeric(48, 'L')).toBe(3);
    expect(qrVersionForAlphanumeric(0, 'L')).toBe(1);
    expect(qrVersionForAlphanumeric(25, 'L')).toBe(1);
    expect(qrVersionForAlphanumeric(26, 'L')).toBe(2);
    expect(qrVersionForAlphanumeric(195, 'L')).toBe(6);
    expect(qrVersionForAlphanumeric(196, 'L')).toBeNull();
    expect(qrVersionForAlphanumeric(85, 'H')).toBeNull();
    expect(() => qrVersionForAlphanumeric(-1)).toThrow(RangeError);
    expect(() => qrVersionForAlphanumeric(2.5)).toThrow(RangeError);
  });

  it('uses the published geometry: 17 + 4V modules a side, 4-module quiet zone', () => {
    for (const [v, side] of Object.entries(capacity.modulesPerSide))
      expect(qrModulesPerSide(Number(v))).toBe(side);
    expect(QR_QUIET_ZONE_MODULES).toBe(capacity.quietZoneModules);
    expect(() => qrModulesPerSide(41)).toThrow(RangeError);
  });

  it('knows the 45 alphanumeric characters and nothing else', () => {
    expect(QR_ALPHANUMERIC_CHARSET).toBe(capacity.alphanumericCharset);
    expect(isQrAlphanumeric('HTTPS://A.EXAMPLE:1/L/$%*+- ')).toBe(true);
    expect(isQrAlphanumeric('https://a')).toBe(false);
    expect(isQrAlphanumeric('A_B')).toBe(false);
  });
});

describe('tag payload', () => {
  for (const c of payloads.good) {
    it(`builds ${c.desc}`, () => {
      const text = tagPayload(c.host, c.code, c.ref);
      expect(text).toBe(c.expected);
      expect(isQrAlphanumeric(text)).toBe(true);
      for (const level of LEVELS) {
        expect(qrVersionForAlphanumeric(text.length, level)).toBe(c.version[level]);
        expect(tagQrVersion(c.host, level)).toBe(c.version[level]);
      }
    });
  }

  it('says HTTP for a site served over plain HTTP, and reads back the same code and reference', () => {
    const text = tagPayload('127.0.0.1:8080', '7K2QM9XAT', 'ABCDEFGHJK', 'http');
    expect(text).toBe('HTTP://127.0.0.1:8080/L/7K2QM9XAT/ABCDEFGHJK');
    // Every character is in the alphanumeric set of ISO/IEC 18004 (digits, A–Z, space, $%*+-./:).
    expect(isQrAlphanumeric(text)).toBe(true);
    expect(parseTagPayload(text)).toEqual({ code: '7K2QM9XAT', ref: 'ABCDEFGHJK' });
  });

  for (const c of payloads.badHosts) {
    it(`refuses a host: ${c.desc}`, () => {
      expect(() => tagPayload(c.host, '7K2QM9XAT', 'ABCDEFGHJK')).toThrow(TagError);
      expect(() => normaliseTagHost(c.host)).toThrow(expect.objectContaining({ code: 'bad-host' }));
    });
  }

  it('refuses a malformed code or reference with the lot-code error', () => {
    expect(() => tagPayload('beads.example', '7K2QM9XAV', 'ABCDEFGHJK')).toThrow(
      expect.objectContaining({ code: 'bad-check' }),
    );
    expect(() => tagPayload('beads.example', '7K2QM9XAT', 'ABCDEFGHJ')).toThrow(
      expect.objectContaining({ code: 'bad-length' }),
    );
  });

  for (const c of payloads.parse) {
    it(`reads ${c.desc}`, () => expect(parseTagPayload(c.text)).toEqual(c.expected));
  }

  it('reads back every payload it builds', () => {
    const random = seededRandom('tag payloads');
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 31 }), (n) => {
        const code = generateLotCode(random);
        let ref = '';
        for (let i = 0; i < 10; i++) ref += CROCKFORD_ALPHABET[(n >> (i * 3)) & 31];
        expect(parseTagPayload(tagPayload('beads.example:8443', code, ref))).toEqual({ code, ref });
      }),
    );
  });
});

// The `qrcode` package is a general-purpose reference encoder: given the payload as one
// alphanumeric segment it picks the smallest version itself, independently of our table.
describe('tag payload against the qrcode encoder', () => {
  const label = fc.stringMatching(/^[a-z0-9]([a-z0-9-]{0,10}[a-z0-9])?$/);
  const host = fc
    .tuple(fc.array(label, { minLength: 1, maxLength: 12 }), fc.option(fc.integer({ min: 1, max: 65535 })))
    .map(([labels, port]) => labels.join('.') + (port === null ? '' : `:${port}`));

  it('chooses the same version as the table for every host length and level', () => {
    fc.assert(
      fc.property(host, fc.constantFrom(...LEVELS), (h, level) => {
        const text = tagPayload(h, '7K2QM9XAT', 'ABCDEFGHJK');
        const want = qrVersionForAlphanumeric(text.length, level);
        fc.pre(want !== null);
        const qr = QRCode.create([{ data: text, mode: 'alphanumeric' }], { errorCorrectionLevel: level });
        expect(qr.version).toBe(want);
        expect(qr.modules.size).toBe(qrModulesPerSide(want!));
      }),
      { numRuns: 300 },
    );
  });

  it('puts a 16-character host in a version 2 symbol at L, and never falls back to byte mode', () => {
    const text = tagPayload('tag.bead.example', '7K2QM9XAT', 'ABCDEFGHJK');
    expect(text.length).toBe(47);
    expect(QRCode.create([{ data: text, mode: 'alphanumeric' }], { errorCorrectionLevel: 'L' }).version).toBe(
      2,
    );
    // Left to segment on its own, the encoder finds nothing that needs byte mode.
    const auto = QRCode.create(text, { errorCorrectionLevel: 'L' });
    expect(auto.segments.every((s) => s.mode.id !== 'Byte')).toBe(true);
    expect(auto.version).toBeLessThanOrEqual(2);
  });
});
