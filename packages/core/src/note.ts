import { ed25519 } from '@noble/curves/ed25519.js';
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';
import { NoteError } from './errors.js';

/** Signature type byte of a plain Ed25519 note signature (C2SP signed-note). */
export const NOTE_SIG_ED25519 = 0x01;
/** Signature type byte of a timestamped Ed25519 witness cosignature (C2SP tlog-cosignature). */
export const NOTE_SIG_COSIGNATURE = 0x04;

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/** Standard base64 with padding (RFC 4648 §4). */
export function base64Encode(bytes: Uint8Array): string {
  let out = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i]!;
    const b = i + 1 < bytes.length ? bytes[i + 1]! : 0;
    const c = i + 2 < bytes.length ? bytes[i + 2]! : 0;
    const n = (a << 16) | (b << 8) | c;
    out += B64[(n >> 18) & 63]! + B64[(n >> 12) & 63]!;
    out += i + 1 < bytes.length ? B64[(n >> 6) & 63]! : '=';
    out += i + 2 < bytes.length ? B64[n & 63]! : '=';
  }
  return out;
}

/**
 * Decodes standard padded base64 (RFC 4648 §4), strictly: only its canonical spelling is
 * accepted (so one byte string has one text). Returns null for anything else.
 */
export function base64Decode(text: string): Uint8Array | null {
  if (typeof text !== 'string' || text.length % 4 !== 0) return null;
  if (!/^[A-Za-z0-9+/]*={0,2}$/.test(text)) return null;
  const pad = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((text.length / 4) * 3 - pad);
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    const v = [0, 1, 2, 3].map((j) => (text[i + j] === '=' ? 0 : B64.indexOf(text[i + j]!)));
    const n = (v[0]! << 18) | (v[1]! << 12) | (v[2]! << 6) | v[3]!;
    if (o < out.length) out[o++] = (n >> 16) & 255;
    if (o < out.length) out[o++] = (n >> 8) & 255;
    if (o < out.length) out[o++] = n & 255;
  }
  return base64Encode(out) === text ? out : null;
}

function concat(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** True when `name` is a valid key name: non-empty, no Unicode white space, no `+`. */
export function isKeyName(name: string): boolean {
  return typeof name === 'string' && name.length > 0 && !/[\s+\u2014]/u.test(name) && !/\p{Cc}/u.test(name);
}

/**
 * The 4-byte key id of C2SP signed-note: the first four bytes of
 * SHA-256(name ‖ 0x0A ‖ type ‖ public key). Precondition: `name` is a valid key name.
 */
export function noteKeyId(name: string, sigType: number, publicKey: Uint8Array): Uint8Array {
  return sha256(concat(utf8ToBytes(name), new Uint8Array([0x0a, sigType]), publicKey)).slice(0, 4);
}

/** A parsed verifier key (`name+keyid+base64(type ‖ public key)`). */
export interface VerifierKey {
  name: string;
  /** Key id, 8 lower-case hex digits. */
  keyId: string;
  sigType: number;
  publicKey: Uint8Array;
}

/** The verifier key text `name+hexkeyid+base64(type ‖ key)` of an Ed25519 public key. */
export function formatVerifierKey(name: string, publicKey: Uint8Array, sigType = NOTE_SIG_ED25519): string {
  if (!isKeyName(name)) throw new NoteError('bad-key', 'a key name is non-empty, without spaces or "+"');
  if (publicKey.length !== 32) throw new NoteError('bad-key', 'an Ed25519 public key is 32 bytes');
  const id = bytesToHex(noteKeyId(name, sigType, publicKey));
  return `${name}+${id}+${base64Encode(concat(new Uint8Array([sigType]), publicKey))}`;
}

/**
 * Parses a verifier key text. Accepts Ed25519 note keys (type 0x01) and cosignature keys
 * (type 0x04); the key id must match the name and key. Throws {@link NoteError} `bad-key`.
 */
export function parseVerifierKey(text: string): VerifierKey {
  const bad = (why: string): never => {
    throw new NoteError('bad-key', `not a verifier key: ${why}`);
  };
  if (typeof text !== 'string') bad('not text');
  // The base64 key may itself hold '+': only the first two separate.
  const a = text.indexOf('+');
  const b = a < 0 ? -1 : text.indexOf('+', a + 1);
  if (b < 0) bad('it has name+keyid+key');
  const [name, id, key] = [text.slice(0, a), text.slice(a + 1, b), text.slice(b + 1)];
  if (!isKeyName(name)) bad('bad name');
  if (!/^[0-9a-f]{8}$/.test(id)) bad('the key id is 8 lower-case hex digits');
  const raw = base64Decode(key);
  if (!raw || raw.length !== 33) bad('the key is base64 of a type byte and 32 key bytes');
  const sigType = raw![0]!;
  if (sigType !== NOTE_SIG_ED25519 && sigType !== NOTE_SIG_COSIGNATURE) bad('unknown key type');
  const publicKey = raw!.slice(1);
  if (bytesToHex(noteKeyId(name, sigType, publicKey)) !== id) bad('the key id does not match');
  return { name, keyId: id, sigType, publicKey };
}

/** An Ed25519 key pair for notes: the 32-byte seed (RFC 8032 secret key) and its public key. */
export interface NoteSigner {
  name: string;
  seed: Uint8Array;
  publicKey: Uint8Array;
}

/** A signer from a 32-byte seed. */
export function noteSigner(name: string, seed: Uint8Array): NoteSigner {
  if (!isKeyName(name)) throw new NoteError('bad-key', 'a key name is non-empty, without spaces or "+"');
  if (!(seed instanceof Uint8Array) || seed.length !== 32)
    throw new NoteError('bad-key', 'a seed is 32 bytes');
  return { name, seed, publicKey: ed25519.getPublicKey(seed) };
}

/** Ed25519 (RFC 8032) public key of a 32-byte seed. */
export function ed25519PublicKey(seed: Uint8Array): Uint8Array {
  return ed25519.getPublicKey(seed);
}

/** Ed25519 (RFC 8032) signature of `message` with a 32-byte seed. */
export function ed25519Sign(message: Uint8Array, seed: Uint8Array): Uint8Array {
  return ed25519.sign(message, seed);
}

/** Ed25519 (RFC 8032) verification; false for anything malformed, never throws. */
export function ed25519Verify(signature: Uint8Array, message: Uint8Array, publicKey: Uint8Array): boolean {
  try {
    return ed25519.verify(signature, message, publicKey);
  } catch {
    return false;
  }
}

/** One signature line of a note. */
export interface NoteSignature {
  name: string;
  /** Key id, 8 lower-case hex digits. */
  keyId: string;
  /** The bytes after the key id: a 64-byte signature, or for a cosignature 8-byte time ‖ 64 bytes. */
  signature: Uint8Array;
  /** The line as written, without its final newline. */
  line: string;
}

/** A note split into its signed text (ending in a newline) and signature lines. */
export interface ParsedNote {
  text: string;
  signatures: NoteSignature[];
}

const DASH = '\u2014 ';
const MAX_SIGNATURES = 100;

/**
 * Splits a signed note (C2SP signed-note): the text, one empty line, then at least one line
 * `— name base64(keyid ‖ signature)`. Throws {@link NoteError} `bad-note` for anything else.
 */
export function parseNote(note: string): ParsedNote {
  const bad = (why: string): never => {
    throw new NoteError('bad-note', `not a signed note: ${why}`);
  };
  if (typeof note !== 'string') bad('not text');
  for (let i = 0; i < note.length; i++) {
    const c = note.charCodeAt(i);
    if ((c < 0x20 && c !== 0x0a) || c === 0x7f) bad('it holds control characters');
  }
  if (!note.endsWith('\n')) bad('it does not end with a newline');
  const split = note.lastIndexOf('\n\n');
  if (split < 0) bad('there is no empty line before the signatures');
  const text = note.slice(0, split + 1);
  const lines = note.slice(split + 2, -1).split('\n');
  if (lines.length > MAX_SIGNATURES) bad('too many signatures');
  const signatures = lines.map((line) => {
    if (!line.startsWith(DASH)) bad('a signature line starts with an em dash and a space');
    const rest = line.slice(DASH.length);
    const sp = rest.indexOf(' ');
    if (sp < 0 || rest.indexOf(' ', sp + 1) >= 0) bad('a signature line is "— name signature"');
    const name = rest.slice(0, sp);
    if (!isKeyName(name)) bad('a signer name is non-empty, without spaces or "+"');
    const raw = base64Decode(rest.slice(sp + 1));
    if (!raw || raw.length < 5) bad('a signature is base64 of a key id and the signature');
    return { name, keyId: bytesToHex(raw!.slice(0, 4)), signature: raw!.slice(4), line };
  });
  return { text, signatures };
}

/** The signature line (without newline) of `text` signed by `signer` as a plain Ed25519 note signature. */
export function signatureLine(text: string, signer: NoteSigner): string {
  const sig = ed25519.sign(utf8ToBytes(text), signer.seed);
  const id = noteKeyId(signer.name, NOTE_SIG_ED25519, signer.publicKey);
  return `${DASH}${signer.name} ${base64Encode(concat(id, sig))}`;
}

/** A signed note: `text` (which must end with a newline) and one Ed25519 signature. */
export function signNote(text: string, signer: NoteSigner): string {
  if (!text.endsWith('\n')) throw new NoteError('bad-note', 'the text of a note ends with a newline');
  return `${text}\n${signatureLine(text, signer)}\n`;
}

/** A note with more signature lines appended (lines as written, without newlines). */
export function addSignatures(note: string, lines: readonly string[]): string {
  return note + lines.map((l) => `${l}\n`).join('');
}

/**
 * Checks a parsed note against one Ed25519 verifier key: true when a signature line with the
 * key's name and id verifies, false when there is none. A line with the key's name and id that
 * does not verify is a forgery: `bad-signature` is thrown.
 */
export function verifyNoteSignature(parsed: ParsedNote, key: VerifierKey): boolean {
  if (key.sigType !== NOTE_SIG_ED25519) throw new NoteError('bad-key', 'not an Ed25519 note key');
  let found = false;
  for (const s of parsed.signatures) {
    if (s.name !== key.name || s.keyId !== key.keyId) continue;
    if (s.signature.length !== 64 || !ed25519Verify(s.signature, utf8ToBytes(parsed.text), key.publicKey))
      throw new NoteError('bad-signature', `the signature of ${key.name} does not verify`);
    found = true;
  }
  return found;
}

/** A checkpoint (C2SP tlog-checkpoint): origin, tree size and root hash. */
export interface Checkpoint {
  origin: string;
  size: number;
  /** 32-byte RFC 6962 root hash. */
  root: Uint8Array;
}

/** The note text of a checkpoint: `origin\nsize\nbase64(root)\n`. */
export function formatCheckpoint(c: Checkpoint): string {
  if (!isKeyName(c.origin))
    throw new NoteError('bad-checkpoint', 'an origin is non-empty, without spaces or "+"');
  if (!Number.isSafeInteger(c.size) || c.size < 0) throw new NoteError('bad-checkpoint', 'bad tree size');
  if (c.root.length !== 32) throw new NoteError('bad-checkpoint', 'a root hash is 32 bytes');
  return `${c.origin}\n${c.size}\n${base64Encode(c.root)}\n`;
}

/**
 * Reads a checkpoint text (the signed text of the note). Extension lines after the root are
 * allowed and ignored. Throws {@link NoteError} `bad-checkpoint`.
 */
export function parseCheckpoint(text: string): Checkpoint {
  const bad = (why: string): never => {
    throw new NoteError('bad-checkpoint', `not a checkpoint: ${why}`);
  };
  if (typeof text !== 'string' || !text.endsWith('\n')) bad('it does not end with a newline');
  const lines = text.slice(0, -1).split('\n');
  if (lines.length < 3) bad('it has fewer than three lines');
  const [origin, size, root] = lines as [string, string, string];
  if (!origin) bad('the origin is empty');
  if (lines.slice(3).some((l) => l === '')) bad('an extension line is empty');
  if (!/^(0|[1-9][0-9]*)$/.test(size) || !Number.isSafeInteger(Number(size)))
    bad('the tree size is not a number');
  const hash = base64Decode(root);
  if (!hash || hash.length !== 32) bad('the root hash is not base64 of 32 bytes');
  return { origin, size: Number(size), root: hash! };
}

/** The message a witness signs: `cosignature/v1\ntime T\n` followed by the checkpoint text. */
export function cosignatureMessage(checkpointText: string, time: number): Uint8Array {
  return utf8ToBytes(`cosignature/v1\ntime ${time}\n${checkpointText}`);
}

function u64(time: number): Uint8Array {
  const out = new Uint8Array(8);
  new DataView(out.buffer).setBigUint64(0, BigInt(time));
  return out;
}

/**
 * A witness cosignature line (C2SP tlog-cosignature) over a checkpoint text at `time` (POSIX
 * seconds): `— name base64(keyid ‖ time u64 big-endian ‖ Ed25519 signature)`, the key id made
 * with type 0x04.
 */
export function cosignatureLine(checkpointText: string, signer: NoteSigner, time: number): string {
  if (!Number.isSafeInteger(time) || time < 0) throw new NoteError('bad-signature', 'bad cosignature time');
  const sig = ed25519.sign(cosignatureMessage(checkpointText, time), signer.seed);
  const id = noteKeyId(signer.name, NOTE_SIG_COSIGNATURE, signer.publicKey);
  return `${DASH}${signer.name} ${base64Encode(concat(id, u64(time), sig))}`;
}

/**
 * Checks one cosignature of `checkpointText` against a witness key (type 0x04). Returns the
 * cosignature's time, or null when the line is not this witness's or does not verify.
 */
export function verifyCosignature(
  checkpointText: string,
  sig: NoteSignature,
  key: VerifierKey,
): number | null {
  if (key.sigType !== NOTE_SIG_COSIGNATURE) return null;
  if (sig.name !== key.name || sig.keyId !== key.keyId || sig.signature.length !== 72) return null;
  const time = Number(new DataView(sig.signature.buffer, sig.signature.byteOffset, 8).getBigUint64(0));
  if (!Number.isSafeInteger(time)) return null;
  return ed25519Verify(sig.signature.slice(8), cosignatureMessage(checkpointText, time), key.publicKey)
    ? time
    : null;
}

/** A checkpoint whose log signature verified, with the witnesses whose cosignatures verified. */
export interface VerifiedCheckpoint extends Checkpoint {
  text: string;
  /** Witness key names with a valid cosignature, each with its time (POSIX seconds). */
  cosigned: Array<{ name: string; time: number }>;
}

/**
 * Verifies a signed checkpoint note against the log's key and any number of witness keys
 * (cosignatures of other keys are ignored, as the format requires). Throws {@link NoteError}:
 * `bad-note`, `bad-checkpoint`, `bad-signature` (no valid log signature, or a forged one).
 */
export function openCheckpoint(
  note: string,
  logKey: VerifierKey,
  witnessKeys: readonly VerifierKey[] = [],
): VerifiedCheckpoint {
  const parsed = parseNote(note);
  if (!verifyNoteSignature(parsed, logKey))
    throw new NoteError('bad-signature', `the checkpoint is not signed by ${logKey.name}`);
  const c = parseCheckpoint(parsed.text);
  if (c.origin !== logKey.name) throw new NoteError('bad-checkpoint', `the origin is not ${logKey.name}`);
  const cosigned: Array<{ name: string; time: number }> = [];
  for (const k of witnessKeys)
    for (const s of parsed.signatures) {
      const t = verifyCosignature(parsed.text, s, k);
      if (t !== null) {
        cosigned.push({ name: k.name, time: t });
        break;
      }
    }
  return { ...c, text: parsed.text, cosigned };
}
