import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { hexToBytes } from '@noble/hashes/utils.js';
import {
  DOMAIN,
  bodyDigest,
  entryHash,
  merkleLeafHash,
  parseCanonical,
  sealedFieldCommitment,
  sealedRoot,
  tagReference,
  verifyRoll,
  crockfordCheckSymbol,
  canonicalise,
  factsOf,
  REASON_CODES,
} from '../src/index.js';

const doc = readFileSync(new URL('../../../docs/ledger-format.md', import.meta.url), 'utf8');

function block(name: string): string[] {
  const m = doc.match(new RegExp(`<!-- check:${name} -->\\s*\`\`\`text\\n([\\s\\S]*?)\\n\`\`\``));
  if (!m) throw new Error(`no block ${name}`);
  return m[1]!.split('\n');
}

// An independent SHA-256 (node:crypto, OpenSSL) recomputes every hash of the worked example.
function tagged(tag: string, data: Buffer | string): string {
  return createHash('sha256')
    .update(tag)
    .update(Buffer.from([0]))
    .update(data)
    .digest('hex');
}

describe('worked example in docs/ledger-format.md', () => {
  const [body] = block('body');
  const [digest] = block('body-digest');
  const [header] = block('header');
  const [hash] = block('entry-hash');
  it('domain tags in hex', () => {
    expect(block('body-tag-hex')[0]).toBe(Buffer.from(DOMAIN.body + '\0').toString('hex'));
    expect(block('entry-tag-hex')[0]).toBe(Buffer.from(DOMAIN.entry + '\0').toString('hex'));
  });
  it('body digest', () => {
    parseCanonical(body!);
    expect(tagged('beadroll/v1/body', body!)).toBe(digest);
    expect(bodyDigest(body!)).toBe(digest);
  });
  it('sealed commitments and root', () => {
    const commits: Record<string, string> = {};
    for (const n of ['sealed-field-1', 'sealed-field-2']) {
      const [input, c] = block(n);
      const v = parseCanonical(input!) as { name: string; salt: string; value: unknown };
      expect(tagged('beadroll/v1/sealed-field', input!)).toBe(c);
      expect(sealedFieldCommitment(v.name, v.salt, v.value)).toBe(c);
      commits[v.name] = c!;
    }
    const [rootIn, root] = block('sealed-root');
    expect(parseCanonical(rootIn!)).toEqual(commits);
    expect(tagged('beadroll/v1/sealed-root', rootIn!)).toBe(root);
    expect(sealedRoot(commits)).toBe(root);
    expect(header).toContain(`"sealed":"${root}"`);
  });
  it('header and entry hash; the entry verifies as a roll', () => {
    expect(header).toContain(`"body":"${digest}"`);
    expect(tagged('beadroll/v1/entry', header!)).toBe(hash);
    expect(entryHash(header!)).toBe(hash);
    expect(verifyRoll([{ hash: hash!, header: header!, body: body! }]).ok).toBe(true);
  });
  it('rule facts, and the same entry in version 1', () => {
    expect(block('facts')[0]).toBe(canonicalise(factsOf('registered', parseCanonical(body!) as never)));
    expect(header).toContain(`"facts":${block('facts')[0]}`);
    const [v1, v1hash] = block('header-v1');
    expect(tagged('beadroll/v1/entry', v1!)).toBe(v1hash);
    expect(v1).toBe(header!.replace(`"facts":${block('facts')[0]},`, '').replace('"v":2', '"v":1'));
    expect(verifyRoll([{ hash: v1hash!, header: v1!, body: body! }]).ok).toBe(true);
  });
  it('a version-3 opinion request after the version-2 entry', () => {
    const [v3body, v3digest] = block('v3-body');
    const [v3header, v3hash] = block('v3-header');
    expect(tagged('beadroll/v1/body', v3body!)).toBe(v3digest);
    expect(tagged('beadroll/v1/entry', v3header!)).toBe(v3hash);
    expect(v3header).toContain(`"prev":"${hash}"`);
    expect(v3header).toContain(
      `"facts":${canonicalise(factsOf('opinion-requested', parseCanonical(v3body!) as never))}`,
    );
    const r = verifyRoll([
      { hash: hash!, header: header!, body: body! },
      { hash: v3hash!, header: v3header!, body: v3body! },
    ]);
    expect(r.ok && r.state.openRequests).toEqual([
      { seq: 1, assessor: 'acct-a51d09', time: '2025-03-01T10:15:00.000Z' },
    ]);
    const v2 = v3header!.replace('"v":3', '"v":2');
    expect(
      verifyRoll([
        { hash: hash!, header: header!, body: body! },
        { hash: entryHash(v2), header: v2, body: v3body! },
      ]),
    ).toMatchObject({ ok: false, seq: 1, reason: 'bad-header' });
  });
  it('tag reference and Merkle leaf', () => {
    expect(tagReference(hash!)).toBe(block('tag-reference')[0]);
    const leaf = createHash('sha256')
      .update(Buffer.from([0]))
      .update(Buffer.from(hash!, 'hex'))
      .digest('hex');
    expect(block('merkle-leaf')[0]).toBe(leaf);
    expect(Buffer.from(merkleLeafHash(hexToBytes(hash!))).toString('hex')).toBe(leaf);
  });
  it('lot code example 7K2Q-M9XA-T', () => {
    expect(doc).toContain('261011154858');
    expect(261011154858 % 37).toBe(26);
    expect(crockfordCheckSymbol('7K2QM9XA')).toBe('T');
  });
  it('lists every reason code core reports, in its table', () => {
    for (const r of REASON_CODES) expect(doc).toMatch(new RegExp(`^\\| \`${r}\` \\|`, 'm'));
  });
});
