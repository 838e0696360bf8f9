// The report reads core's result generically: reasons, caveats and fields that newer versions
// of the format add are shown, never dropped.
import type { BundleVerification } from '@beadroll/core';
import { describe, expect, it } from 'vitest';
import {
  readLogKey,
  reportBundleBytes,
  reportBundleText,
  reportLines,
  reportVerification,
} from '../src/report.js';
import { EXAMPLE, EXAMPLE_V1, exampleWithCheckpoint, tamperedExample } from './fixtures.js';

describe('the verifier report', () => {
  it('shows every roll of the example as intact, with exit 0', () => {
    const r = reportBundleText(EXAMPLE);
    expect(r.exitCode).toBe(0);
    expect(r.rolls.every((x) => x.ok && x.notes.length === 0)).toBe(true);
    expect(reportLines(r).at(-1)).toBe('verified: every roll is unbroken and every link checks both ways');
  });

  it('names the lot, the entry and the reason of a broken roll, with exit 1', () => {
    const t = tamperedExample();
    const r = reportBundleText(t.text);
    expect(r.exitCode).toBe(1);
    expect(r.rolls.find((x) => x.lot === t.lot)?.problem).toMatchObject({
      seq: t.seq,
      reason: 'bad-body-digest',
    });
  });

  it('shows a reason it does not know, and notes beside an intact roll, instead of dropping them', () => {
    const good = reportBundleText(EXAMPLE);
    const lot = good.rolls[0]!.lot;
    const result = {
      ok: false,
      entries: 3,
      links: 0,
      rolls: [
        {
          lot,
          scope: 'full',
          entries: 2,
          ok: true,
          failure: null,
          state: null,
          caveats: [{ reason: 'not-fully-checkable', message: 'a removed body held a fact a rule needs' }],
        },
        {
          lot: 'ZZZZZZZZZ',
          scope: 'full',
          entries: 1,
          ok: false,
          failure: { ok: false, lot: 'ZZZZZZZZZ', seq: 0, reason: 'bad-facts', message: 'facts differ' },
          state: null,
        },
      ],
      failures: [
        { ok: false, lot: 'ZZZZZZZZZ', seq: 0, reason: 'bad-facts', message: 'facts differ' },
        { ok: false, lot: null, seq: 0, reason: 'orphan-link', message: 'a link entry no child names' },
      ],
      removalCaveat: true,
    } as unknown as BundleVerification;
    const r = reportVerification(result);
    expect(r.exitCode).toBe(1);
    expect(r.rolls[0]!.notes).toEqual([
      'caveats: not-fully-checkable: a removed body held a fact a rule needs',
    ]);
    expect(r.rolls[1]!.problem).toEqual({ seq: 0, reason: 'bad-facts', message: 'facts differ' });
    expect(r.problems).toEqual([{ seq: 0, reason: 'orphan-link', message: 'a link entry no child names' }]);
    expect(r.notes).toEqual(['removal caveat']);
    const text = reportLines(r).join('\n');
    expect(text).toContain('broken: lot ZZZZZZZZZ seq 0 (bad-facts)');
    expect(text).toContain('broken: lot (no valid lot code) seq 0 (orphan-link)');
    for (const s of ['bad-facts', 'orphan-link', 'not-fully-checkable', 'removal caveat'])
      expect(text).toContain(s);
  });

  it('never calls an intact bundle with notes plainly verified', () => {
    const r = reportVerification({
      ok: true,
      entries: 1,
      links: 0,
      failures: [],
      rolls: [
        { lot: '7K2QM9XAT', scope: 'full', entries: 1, ok: true, failure: null, state: null, partial: 'x' },
      ],
    } as unknown as BundleVerification);
    expect(r.exitCode).toBe(0);
    expect(r.headline).toMatch(/^verified: .*; 1 note above$/);
  });

  it('shows a version-1 roll whose removed body hid a rule fact as intact but not fully checkable', () => {
    const r = reportBundleText(EXAMPLE_V1);
    expect(r.exitCode).toBe(0);
    const partial = r.rolls.filter((x) => x.unchecked.length > 0);
    expect(partial).toHaveLength(1);
    expect(partial[0]!.ok).toBe(true);
    expect(r.headline).toContain('1 roll is not fully checkable after a removal');
  });

  it('refuses bytes that are not UTF-8 or over the limit before reading them as text', () => {
    // 0xC3 0x28 is an invalid two-byte sequence (RFC 3629 §3: a lead byte needs a continuation byte).
    expect(reportBundleBytes(new Uint8Array([0xc3, 0x28])).unreadable?.code).toBe('not-utf8');
    expect(reportBundleBytes(new TextEncoder().encode(EXAMPLE), 10).unreadable?.code).toBe('too-large');
  });

  describe('checkpoints of the public log (ledger format §14.5)', () => {
    const { text, logKey, otherKey } = exampleWithCheckpoint();

    it('checks the signature and every inclusion proof with the log’s key', () => {
      const r = reportBundleText(text, undefined, readLogKey(logKey));
      expect(r.exitCode).toBe(0);
      expect(r.checkpoints).toHaveLength(1);
      expect(r.checkpoints[0]).toMatchObject({ ok: true, message: null });
      expect(r.checkpoints[0]!.inclusions.length).toBeGreaterThan(0);
      expect(r.checkpoints[0]!.inclusions.every((i) => i.ok)).toBe(true);
      expect(reportLines(r).join('\n')).toMatch(
        /checkpoint of \d+ entries {2}signature checks with the log's key/,
      );
    });

    it('without the key, leaves the checkpoint unchecked and says how to check it', () => {
      const r = reportBundleText(text);
      expect(r.exitCode).toBe(0);
      expect(r.checkpoints).toEqual([]);
      expect(r.uncheckedCheckpoints).toBe(1);
      expect(reportLines(r).join('\n')).toContain('1 checkpoint of the public log not checked');
    });

    it('a checkpoint signed by another key is broken, exit 1', () => {
      const r = reportBundleText(text, undefined, readLogKey(otherKey));
      expect(r.exitCode).toBe(1);
      expect(r.checkpoints[0]!.ok).toBe(false);
      expect(r.headline).toMatch(/^broken: a checkpoint of the public log: its signature does not check/);
    });

    it('an entry placed at another log index than its proof is broken, naming the lot and entry', () => {
      const b = JSON.parse(text) as {
        checkpoints: Array<{
          inclusions: Array<{ lot: string; seq: number; logIndex: number; proof: string[] }>;
        }>;
        rolls: Array<{ lot: string; entries: Array<{ logIndex: number }> }>;
      };
      const inc = b.checkpoints[0]!.inclusions[0]!;
      // Two leaves trade places: the roll's head claims the index of another entry.
      const other = b.rolls.find((r) => r.lot !== inc.lot)!.entries[0]!;
      const head = b.rolls.find((r) => r.lot === inc.lot)!.entries.find((e) => e.logIndex === inc.logIndex)!;
      [head.logIndex, other.logIndex] = [other.logIndex, head.logIndex];
      inc.logIndex = head.logIndex;
      const r = reportBundleText(JSON.stringify(b), undefined, readLogKey(logKey));
      expect(r.exitCode).toBe(1);
      const bad = r.checkpoints[0]!.inclusions.find((i) => !i.ok)!;
      expect(bad).toMatchObject({ seq: inc.seq, logIndex: inc.logIndex });
      expect(r.headline).toContain(`seq ${inc.seq} is not shown in the log at index ${inc.logIndex}`);
    });

    it('a log key that is not a key is refused in words', () => {
      expect(() => readLogKey('not a key')).toThrow(/the log key is not a verifier key/);
    });
  });
});
