import { describe, expect, it } from 'vitest';
import { bytesToHex, hexToBytes, utf8ToBytes } from '@noble/hashes/utils.js';
import {
  base64Decode,
  base64Encode,
  checkInclusion,
  cosignatureLine,
  ed25519PublicKey,
  ed25519Sign,
  ed25519Verify,
  formatCheckpoint,
  formatVerifierKey,
  MerkleTree,
  merkleLeafHash,
  NOTE_SIG_COSIGNATURE,
  noteSigner,
  openCheckpoint,
  parseCheckpoint,
  parseNote,
  parseVerifierKey,
  signNote,
  verifyCosignature,
  verifyNoteSignature,
  NoteError,
  logOrigin,
  entryLeafHash,
  addSignatures,
} from '../src/index.js';
import v from './fixtures/notes.json' with { type: 'json' };
import m from './fixtures/merkle.json' with { type: 'json' };

// Source of each case: the `source` member of its fixture (RFC 8032 §7.1; C2SP signed-note,
// tlog-checkpoint and tlog-cosignature; golang/mod sumdb/note tests).
describe('Ed25519 (RFC 8032 §7.1)', () => {
  for (const c of v.ed25519) {
    it(c.desc, () => {
      const seed = hexToBytes(c.secretKeyHex);
      expect(bytesToHex(ed25519PublicKey(seed))).toBe(c.publicKeyHex);
      const sig = ed25519Sign(hexToBytes(c.messageHex), seed);
      expect(bytesToHex(sig)).toBe(c.signatureHex);
      const pub = hexToBytes(c.publicKeyHex);
      expect(ed25519Verify(sig, hexToBytes(c.messageHex), pub)).toBe(true);
      const flipped = sig.slice();
      flipped[0]! ^= 1;
      expect(ed25519Verify(flipped, hexToBytes(c.messageHex), pub)).toBe(false);
      expect(ed25519Verify(sig, utf8ToBytes('x' + c.messageHex), pub)).toBe(false);
    });
  }
});

describe('base64 (RFC 4648 §4)', () => {
  // RFC 4648 §10 test vectors.
  const cases: Array<[string, string]> = [
    ['', ''],
    ['f', 'Zg=='],
    ['fo', 'Zm8='],
    ['foo', 'Zm9v'],
    ['foob', 'Zm9vYg=='],
    ['fooba', 'Zm9vYmE='],
    ['foobar', 'Zm9vYmFy'],
  ];
  it.each(cases)('%s ↔ %s', (plain, b64) => {
    expect(base64Encode(utf8ToBytes(plain))).toBe(b64);
    expect(new TextDecoder().decode(base64Decode(b64)!)).toBe(plain);
  });
  it('refuses non-canonical spellings, base64url and missing padding', () => {
    for (const bad of ['Zg', 'Zh==', 'Zm9v\n', 'Zm-v', 'Z===', '=Zm9']) expect(base64Decode(bad)).toBeNull();
  });
});

describe('signed notes (C2SP signed-note)', () => {
  for (const c of v.notes) {
    it(c.desc, () => {
      const key = parseVerifierKey(c.vkey);
      const parsed = parseNote(c.note);
      expect(parsed.text).toBe(c.text);
      expect(verifyNoteSignature(parsed, key)).toBe(true);
      // A one-character change of the text fails.
      const changed = { ...parsed, text: parsed.text.replace('example', 'exemple') };
      expect(() => verifyNoteSignature(changed, key)).toThrow(NoteError);
    });
  }

  it(v.signerKey.desc, () => {
    // PRIVATE+KEY+name+keyid+base64(0x01 || seed); the base64 may hold '+' itself.
    const [, , name, , ...rest] = v.signerKey.skey.split('+');
    const raw = base64Decode(rest.join('+'))!;
    expect(raw[0]).toBe(1);
    const signer = noteSigner(name!, raw.slice(1));
    expect(formatVerifierKey(signer.name, signer.publicKey)).toBe(v.signerKey.vkey);
    const text = parseNote(v.signerKey.note).text;
    expect(signNote(text, signer)).toBe(v.signerKey.note);
  });

  it(v.secondSigner.desc, () => {
    const text = parseNote(v.signerKey.note).text;
    const both = addSignatures(v.signerKey.note, [v.secondSigner.line.trimEnd()]);
    const parsed = parseNote(both);
    expect(parsed.signatures).toHaveLength(2);
    expect(parsed.text).toBe(text);
    expect(verifyNoteSignature(parsed, parseVerifierKey(v.secondSigner.vkey))).toBe(true);
    expect(verifyNoteSignature(parsed, parseVerifierKey(v.signerKey.vkey))).toBe(true);
  });

  it('ignores signatures of unknown keys and reports no signature of a known one', () => {
    const parsed = parseNote(v.notes[0]!.note);
    expect(verifyNoteSignature(parsed, parseVerifierKey(v.signerKey.vkey))).toBe(false);
  });

  // Mutations after golang/mod sumdb/note TestNewVerifier: proper prefixes and changed bytes fail.
  it('refuses every proper prefix of a verifier key and a key id that does not match', () => {
    const k = v.notes[0]!.vkey;
    for (let i = 1; i < k.length; i++) expect(() => parseVerifierKey(k.slice(0, i))).toThrow(NoteError);
    expect(() => parseVerifierKey(k.replace('+530d903a+', '+530d903b+'))).toThrow(NoteError);
    expect(() => parseVerifierKey(k.replace('example.com/foo', 'example.com/fop'))).toThrow(NoteError);
  });

  it('refuses malformed notes', () => {
    const good = v.notes[0]!.note;
    for (const bad of [
      good.slice(0, -1), // no final newline
      good.replace('\n\n', '\n'), // no empty line
      good.replace('— ', '- '), // not an em dash
      good.replace('example.com/foo ', 'example.com/foo  '), // name with a space after it
      good.replace('This', '\u0001This'), // control character
      'text\n\n', // no signature
    ])
      expect(() => parseNote(bad)).toThrow(NoteError);
  });
});

describe('checkpoints (C2SP tlog-checkpoint)', () => {
  it(v.cosignedCheckpoint.desc, () => {
    const c = v.cosignedCheckpoint;
    const parsed = parseNote(c.note);
    const cp = parseCheckpoint(parsed.text);
    expect(cp.origin).toBe(c.origin);
    expect(cp.size).toBe(c.size);
    expect(cp.root).toHaveLength(c.rootBytes);
    expect(parsed.signatures[0]!.keyId).toBe(c.logKeyId);
    expect(parsed.signatures[0]!.signature).toHaveLength(64);
    expect(parsed.signatures[1]!.keyId).toBe(c.witnessKeyId);
    expect(parsed.signatures[1]!.signature).toHaveLength(72);
    const time = new DataView(
      parsed.signatures[1]!.signature.buffer,
      parsed.signatures[1]!.signature.byteOffset,
      8,
    );
    expect(Number(time.getBigUint64(0))).toBe(c.witnessTime);
  });

  it(v.constructedCheckpoint.desc, () => {
    const c = v.constructedCheckpoint;
    const leaves = m.leafInputs.hex.map((h) => merkleLeafHash(hexToBytes(h)));
    const tree = new MerkleTree(leaves);
    const signer = noteSigner('example.com/test-ledger', hexToBytes(c.secretKeyHex));
    expect(formatVerifierKey(signer.name, signer.publicKey)).toBe(c.vkey);
    const text = formatCheckpoint({ origin: signer.name, size: 8, root: tree.root() });
    expect(signNote(text, signer)).toBe(c.note);
    const opened = openCheckpoint(c.note, parseVerifierKey(c.vkey));
    expect(opened.size).toBe(8);
    // The size changed to 7 no longer verifies.
    expect(() => openCheckpoint(c.note.replace('\n8\n', '\n7\n'), parseVerifierKey(c.vkey))).toThrow(
      NoteError,
    );
  });

  // Parser cases after transparency-dev/formats log/checkpoint_test.go TestParseCheckpoint.
  it('refuses texts that are not checkpoints', () => {
    const root = base64Encode(new Uint8Array(32));
    for (const bad of [
      `o\n1\n`,
      `\n1\n${root}\n`,
      `o\n1\n${root}`,
      `o\n-1\n${root}\n`,
      `o\n01\n${root}\n`,
      `o\nten\n${root}\n`,
      `o\n99999999999999999999\n${root}\n`,
      `o\n1\nbananas\n`,
      `o\n1\n${base64Encode(new Uint8Array(31))}\n`,
    ])
      expect(() => parseCheckpoint(bad), JSON.stringify(bad)).toThrow(NoteError);
    expect(parseCheckpoint(`o\n0\n${root}\nextension\n`).size).toBe(0);
  });

  it('the origin is the public host with its port, then /log', () => {
    expect(logOrigin('https://beads.example')).toBe('beads.example/log');
    expect(logOrigin('http://127.0.0.1:3109')).toBe('127.0.0.1:3109/log');
    expect(logOrigin('https://Beads.Example:8443/')).toBe('beads.example:8443/log');
  });
});

describe('witness cosignatures (C2SP tlog-cosignature)', () => {
  const log = noteSigner('beads.example/log', new Uint8Array(32).fill(7));
  const witness = noteSigner('witness.example/w1', new Uint8Array(32).fill(9));
  const wkey = parseVerifierKey(formatVerifierKey(witness.name, witness.publicKey, NOTE_SIG_COSIGNATURE));
  const text = formatCheckpoint({ origin: log.name, size: 3, root: new Uint8Array(32).fill(1) });

  it('a cosignature line is 4 + 8 + 64 bytes, verifies over cosignature/v1 and time, and is counted', () => {
    const line = cosignatureLine(text, witness, 1679315147);
    const note = addSignatures(signNote(text, log), [line]);
    const parsed = parseNote(note);
    expect(parsed.signatures[1]!.signature).toHaveLength(72);
    expect(verifyCosignature(text, parsed.signatures[1]!, wkey)).toBe(1679315147);
    const logKey = parseVerifierKey(formatVerifierKey(log.name, log.publicKey));
    expect(openCheckpoint(note, logKey, [wkey]).cosigned).toEqual([{ name: witness.name, time: 1679315147 }]);
    // Another text, or the same line read as a plain note key, does not verify.
    expect(verifyCosignature(text.replace('\n3\n', '\n4\n'), parsed.signatures[1]!, wkey)).toBeNull();
    const plainKey = parseVerifierKey(formatVerifierKey(witness.name, witness.publicKey));
    expect(verifyNoteSignature(parsed, plainKey)).toBe(false);
  });

  it('an inclusion proof against a signed checkpoint verifies, and fails once anything changes', () => {
    const hashes = Array.from({ length: 13 }, (_, i) => bytesToHex(new Uint8Array(32).fill(i)));
    const tree = new MerkleTree(hashes.map(entryLeafHash));
    const cpText = formatCheckpoint({ origin: log.name, size: 13, root: tree.root() });
    const note = signNote(cpText, log);
    const logKey = parseVerifierKey(formatVerifierKey(log.name, log.publicKey));
    const proof = tree.inclusionProof(5, 13).map(base64Encode);
    expect(checkInclusion(note, hashes[5]!, { logIndex: 5, proof }, logKey).ok).toBe(true);
    expect(checkInclusion(note, hashes[6]!, { logIndex: 5, proof }, logKey)).toMatchObject({
      ok: false,
      reason: 'bad-proof',
    });
    expect(checkInclusion(note, hashes[5]!, { logIndex: 13, proof }, logKey)).toMatchObject({
      ok: false,
      reason: 'not-covered',
    });
    expect(
      checkInclusion(note.replace('\n13\n', '\n12\n'), hashes[5]!, { logIndex: 5, proof }, logKey),
    ).toMatchObject({
      ok: false,
      reason: 'bad-signature',
    });
  });
});

describe('checkpoints in a bundle (format §14.5)', () => {
  it('verifies each inclusion against its entry, and refuses a wrong log index or proof', async () => {
    const { createBundle, verifyBundleCheckpoint, buildEntry, seededRandom } =
      await import('../src/index.js');
    const log = noteSigner('beads.example/log', new Uint8Array(32).fill(3));
    const logKey = parseVerifierKey(formatVerifierKey(log.name, log.publicKey));
    const built = buildEntry(
      null,
      {
        lot: '7K2QM9XAT',
        kind: 'registered',
        actor: 'acct-1',
        time: '2026-01-01T00:00:00.000Z',
        body: {
          description: {
            title: 'Blue beads',
            form: 'loose',
            count: { value: 3, estimated: false },
            colours: [],
            baseGlass: [],
            decoration: [],
            listed: true,
          },
        },
      },
      { random: seededRandom('bundle-checkpoint') },
    );
    const others = Array.from({ length: 6 }, (_, i) => bytesToHex(new Uint8Array(32).fill(40 + i)));
    const hashes = [...others.slice(0, 4), built.stored.hash, ...others.slice(4)];
    const tree = new MerkleTree(hashes.map(entryLeafHash));
    const note = signNote(formatCheckpoint({ origin: log.name, size: tree.size, root: tree.root() }), log);
    const inclusion = {
      lot: '7K2QM9XAT',
      seq: 0,
      logIndex: 4,
      proof: tree.inclusionProof(4).map(base64Encode),
    };
    const bundle = createBundle(
      [{ lot: '7K2QM9XAT', entries: [{ ...built.stored, logIndex: 4 }] }],
      [{ note, inclusions: [inclusion] }],
    );
    expect(verifyBundleCheckpoint(bundle.checkpoints[0], bundle.rolls, logKey).ok).toBe(true);
    const wrongIndex = { note, inclusions: [{ ...inclusion, logIndex: 3 }] };
    expect(verifyBundleCheckpoint(wrongIndex, bundle.rolls, logKey).ok).toBe(false);
    const wrongProof = { note, inclusions: [{ ...inclusion, proof: inclusion.proof.slice(1) }] };
    expect(verifyBundleCheckpoint(wrongProof, bundle.rolls, logKey).ok).toBe(false);
    const otherKey = parseVerifierKey(
      formatVerifierKey(log.name, noteSigner(log.name, new Uint8Array(32)).publicKey),
    );
    expect(verifyBundleCheckpoint(bundle.checkpoints[0], bundle.rolls, otherKey).ok).toBe(false);
  });
});
