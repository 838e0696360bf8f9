import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import * as core from '../src/index.js';
import {
  BundleError,
  createBundle,
  parseBundle,
  parseBundleText,
  verifyBundle,
  type Bundle,
} from '../src/index.js';
// The invented scenario is shared with the script that writes docs/examples/bundle.json.
import { buildExampleBundle } from '../../../tools/example-bundle.mjs';

const examplePath = new URL('../../../docs/examples/bundle.json', import.meta.url);
const clone = (b: Bundle): Bundle => JSON.parse(JSON.stringify(b));

describe('the committed example bundle', () => {
  const committed = parseBundleText(readFileSync(examplePath, 'utf8'));
  it('is exactly what the generator writes', () => {
    expect(committed).toEqual(buildExampleBundle(core));
  });
  it('verifies: a transfer, a dissent, a redacted body, a split with its children', () => {
    const r = verifyBundle(committed);
    expect(r.failures).toEqual([]);
    expect(r.ok).toBe(true);
    const states = r.rolls.map((x) => x.state!);
    expect(states[0]!.holder).toBe('acct-7b20e4');
    expect(states[1]!.dissents.length).toBe(1);
    expect(committed.rolls[1]!.entries.some((e) => e.body === null)).toBe(true);
    expect(states[2]!.status).toBe('split');
    expect(r.links).toBe(3);
    expect(committed.checkpoints).toEqual([]);
    expect(committed.rolls.every((x) => x.entries.every((e) => e.logIndex === null))).toBe(true);
  });
  it('never carries a sealed value', () => {
    const text = readFileSync(examplePath, 'utf8');
    for (const s of ['Larkmoor', '4500', '9000', 'acquisition', 'salt']) {
      if (s === 'Larkmoor') expect(text.includes('house clearance')).toBe(false);
      else expect(text.includes(s)).toBe(false);
    }
  });
  it('a tampered parent breaks the child', () => {
    const b = clone(committed);
    const parent = b.rolls[2]!;
    const e = parent.entries[1]!;
    e.header = e.header.replace('"time":"2025-03-10T10', '"time":"2025-03-10T09');
    e.hash = core.entryHash(e.header);
    const r = verifyBundle(b);
    expect(r.ok).toBe(false);
    expect(r.failures.map((f) => [f.lot, f.seq, f.reason])).toEqual(
      expect.arrayContaining([[b.rolls[3]!.lot, 0, 'bad-parent']]),
    );
  });
  it('a missing parent roll breaks the child; a link-only parent roll is enough', () => {
    const b = clone(committed);
    const parent = b.rolls.splice(2, 1)[0]!;
    expect(verifyBundle(b).failures[0]).toMatchObject({ lot: b.rolls[2]!.lot, seq: 0, reason: 'bad-parent' });
    b.rolls.push({ lot: parent.lot, scope: 'link', entries: [parent.entries[1]!] });
    expect(verifyBundle(b).ok).toBe(true);
  });
  it('a parent whose split names a child that does not name it back is broken', () => {
    const b = clone(committed);
    const child = b.rolls[3]!;
    const other = core.buildEntry(null, {
      lot: child.lot,
      kind: 'registered',
      time: '2025-03-10T11:00:00.000Z',
      actor: 'acct-3f9c1a',
      body: {
        description: {
          title: 'x',
          form: 'loose',
          count: { value: 20, estimated: false },
          colours: [],
          baseGlass: [],
          decoration: [],
          listed: true,
        },
      },
    });
    child.entries = [{ ...other.stored, logIndex: null }];
    const r = verifyBundle(b);
    expect(r.failures).toEqual([
      expect.objectContaining({ lot: b.rolls[2]!.lot, seq: 1, reason: 'bad-parent' }),
    ]);
  });
});

describe('bundle shape', () => {
  const good = createBundle([]);
  it('accepts an empty bundle', () => expect(verifyBundle(parseBundle(good)).ok).toBe(true));
  it('reads bundle versions 1 and 2', () => {
    expect(good.version).toBe(2);
    expect(verifyBundle(parseBundle({ ...good, version: 1 })).ok).toBe(true);
  });
  const unreadable: Array<[string, unknown, string]> = [
    ['not an object', [], 'not-a-bundle'],
    ['wrong format', { ...good, format: 'other' }, 'not-a-bundle'],
    ['unknown version', { ...good, version: 3 }, 'unknown-version'],
    ['unknown member', { ...good, extra: 1 }, 'not-a-bundle'],
    ['rolls not a list', { ...good, rolls: {} }, 'not-a-bundle'],
    ['checkpoints not a list', { ...good, checkpoints: null }, 'not-a-bundle'],
  ];
  for (const [desc, value, code] of unreadable) {
    it(`refuses ${desc} with a typed error`, () => {
      expect(() => parseBundle(value)).toThrow(BundleError);
      expect(() => parseBundle(value)).toThrow(expect.objectContaining({ code }));
    });
  }
  const entry = (over: Record<string, unknown>) => ({
    hash: 'a',
    header: '{}',
    body: null,
    logIndex: null,
    ...over,
  });
  const brokenRolls: Array<[string, unknown, string]> = [
    ['a roll that is not an object', 'x', 'bad-roll'],
    ['a roll with an unknown member', { lot: '7K2QM9XAT', scope: 'full', entries: [], x: 1 }, 'bad-roll'],
    ['an unknown scope', { lot: '7K2QM9XAT', scope: 'part', entries: [] }, 'bad-roll'],
    ['a bad lot code', { lot: 'nope', scope: 'full', entries: [] }, 'bad-lot-code'],
    [
      'an entry with wrong types',
      { lot: '7K2QM9XAT', scope: 'full', entries: [entry({ hash: 1 })] },
      'bad-entry',
    ],
    [
      'an entry with an unknown member',
      { lot: '7K2QM9XAT', scope: 'full', entries: [entry({ x: 1 })] },
      'bad-entry',
    ],
    [
      'a bad log index',
      { lot: '7K2QM9XAT', scope: 'full', entries: [entry({ logIndex: -1 })] },
      'bad-log-index',
    ],
    [
      'a fractional log index',
      { lot: '7K2QM9XAT', scope: 'full', entries: [entry({ logIndex: 1.5 })] },
      'bad-log-index',
    ],
  ];
  for (const [desc, roll, reason] of brokenRolls) {
    it(`reads a bundle with ${desc} and reports that roll broken (${reason})`, () => {
      const r = verifyBundle(parseBundle({ ...good, rolls: [roll] }));
      expect(r.ok).toBe(false);
      expect(r.failures).toEqual([expect.objectContaining({ reason })]);
    });
  }
  it('reports every copy of a lot that appears twice', () => {
    const b = clone(parseBundleText(readFileSync(examplePath, 'utf8')));
    b.rolls.push(clone(b).rolls[0]!);
    const r = verifyBundle(b);
    expect(r.failures.filter((f) => f.reason === 'duplicate-lot').map((f) => f.lot)).toEqual([
      b.rolls[0]!.lot,
      b.rolls[0]!.lot,
    ]);
  });
  it('refuses malformed JSON and oversize text', () => {
    expect(() => parseBundleText('{"format":')).toThrow(expect.objectContaining({ code: 'not-json' }));
    expect(() => parseBundleText(JSON.stringify(good), 10)).toThrow(
      expect.objectContaining({ code: 'too-large' }),
    );
  });
  it('reports broken entries instead of throwing', () => {
    const b = clone(parseBundleText(readFileSync(examplePath, 'utf8')));
    b.rolls[0]!.entries[2]!.header = '{"v":2,"seq":9007199254740993}';
    const r = verifyBundle(b);
    expect(r.failures[0]).toMatchObject({ lot: b.rolls[0]!.lot, seq: 2, reason: 'non-canonical' });
  });
});
