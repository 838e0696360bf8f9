import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import {
  checkConsistency,
  cosignatureLine,
  formatVerifierKey,
  NOTE_SIG_COSIGNATURE,
  noteSigner,
  openCheckpoint,
  parseVerifierKey,
  type NoteSigner,
  type VerifiedCheckpoint,
} from '@beadroll/core';

/** What a witness keeps between runs. */
export interface WitnessState {
  /** The log's verifier key as first seen (a changed key is refused). */
  logKey: string;
  /** The last checkpoint note this witness verified and cosigned. */
  checkpoint: string;
}

export interface WitnessOptions {
  /** The service's public address, e.g. https://beads.example */
  url: string;
  stateFile: string;
  keyFile: string;
  /** The witness's key name (no spaces, no "+"). */
  name: string;
  /** Where evidence of an inconsistency is written. */
  evidenceDir: string;
  /** POSIX seconds now (for the cosignature's time). */
  now?: () => number;
  fetch?: typeof fetch;
}

/** Outcome of one witness run. */
export type WitnessOutcome =
  | { status: 'cosigned'; size: number; previousSize: number | null }
  | { status: 'inconsistent'; message: string; evidence: string }
  | { status: 'failed'; message: string };

/** Reads the witness's Ed25519 seed (64 hex digits), making one (owner-only) on first use. */
export function loadWitnessSigner(keyFile: string, name: string): NoteSigner {
  if (!existsSync(keyFile)) {
    mkdirSync(dirname(keyFile), { recursive: true });
    writeFileSync(keyFile, randomBytes(32).toString('hex'), { mode: 0o600, flag: 'wx' });
  }
  const hex = readFileSync(keyFile, 'utf8').trim();
  if (!/^[0-9a-f]{64}$/.test(hex)) throw new Error(`${keyFile} does not hold a 64-hex-digit key`);
  return noteSigner(name, Uint8Array.from(Buffer.from(hex, 'hex')));
}

/** The witness's verifier key, for the registrar to register: name+keyid+base64(0x04 ‖ key). */
export function witnessVerifierKey(signer: NoteSigner): string {
  return formatVerifierKey(signer.name, signer.publicKey, NOTE_SIG_COSIGNATURE);
}

function readState(file: string): WitnessState | null {
  if (!existsSync(file)) return null;
  return JSON.parse(readFileSync(file, 'utf8')) as WitnessState;
}

function writeState(file: string, state: WitnessState): void {
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.tmp`;
  writeFileSync(tmp, JSON.stringify(state, null, 2) + '\n');
  renameSync(tmp, file);
}

async function getText(f: typeof fetch, url: string): Promise<string> {
  const res = await f(url);
  if (!res.ok) throw new Error(`${url} answered ${res.status}`);
  return res.text();
}

function writeEvidence(
  dir: string,
  previous: string,
  latest: string,
  detail: Record<string, unknown>,
): string {
  const folder = join(dir, `evidence-${new Date().toISOString().replace(/[:.]/g, '-')}`);
  mkdirSync(folder, { recursive: true });
  writeFileSync(join(folder, 'previous.checkpoint'), previous);
  writeFileSync(join(folder, 'latest.checkpoint'), latest);
  writeFileSync(join(folder, 'detail.json'), JSON.stringify(detail, null, 2) + '\n');
  return folder;
}

/**
 * One witness pass over the log at `url`: verifies the latest checkpoint's signature, checks a
 * consistency proof from the last checkpoint this witness cosigned (RFC 9162 §2.1.4.2), then
 * cosigns (C2SP tlog-cosignature) and sends the cosignature. On an inconsistency it writes both
 * signed checkpoints (and the proof it was given) as evidence and keeps its old state.
 */
export async function runWitness(o: WitnessOptions): Promise<WitnessOutcome> {
  const f = o.fetch ?? fetch;
  const base = o.url.replace(/\/+$/, '');
  const now = o.now ?? (() => Math.floor(Date.now() / 1000));
  const signer = loadWitnessSigner(o.keyFile, o.name);
  const state = readState(o.stateFile);
  let keyText: string;
  let note: string;
  let cp: VerifiedCheckpoint;
  try {
    keyText = (await getText(f, `${base}/api/log/key`)).trim();
    if (state && state.logKey !== keyText)
      return { status: 'failed', message: `the log's key changed from ${state.logKey} to ${keyText}` };
    note = await getText(f, `${base}/api/log/checkpoint`);
    cp = openCheckpoint(note, parseVerifierKey(keyText));
  } catch (e) {
    return { status: 'failed', message: (e as Error).message };
  }
  let previousSize: number | null = null;
  if (state) {
    const prev = openCheckpoint(state.checkpoint, parseVerifierKey(state.logKey));
    previousSize = prev.size;
    let proof: unknown = [];
    let consistent: boolean;
    if (cp.size < prev.size) consistent = false;
    else if (cp.size === prev.size) consistent = Buffer.from(cp.root).equals(Buffer.from(prev.root));
    else {
      try {
        const body = JSON.parse(
          await getText(f, `${base}/api/log/proof/consistency?from=${prev.size}&to=${cp.size}`),
        ) as { proof: unknown };
        proof = body.proof;
      } catch (e) {
        return { status: 'failed', message: `no consistency proof: ${(e as Error).message}` };
      }
      consistent = checkConsistency(prev.size, prev.root, cp.size, cp.root, proof);
    }
    if (!consistent) {
      const message =
        cp.size < prev.size
          ? `the log shrank from ${prev.size} to ${cp.size} entries`
          : `the checkpoint of ${cp.size} entries is not consistent with the one of ${prev.size} this witness cosigned`;
      const evidence = writeEvidence(o.evidenceDir, state.checkpoint, note, {
        log: base,
        logKey: keyText,
        message,
        from: prev.size,
        to: cp.size,
        consistencyProof: proof,
      });
      return { status: 'inconsistent', message, evidence };
    }
  }
  const line = cosignatureLine(cp.text, signer, now());
  const res = await f(`${base}/api/log/cosignatures`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
    body: JSON.stringify({ checkpoint: note, cosignature: line }),
  });
  writeState(o.stateFile, { logKey: keyText, checkpoint: note });
  if (!res.ok)
    return {
      status: 'failed',
      message: `the log refused the cosignature (${res.status}): ${await res.text()}`,
    };
  return { status: 'cosigned', size: cp.size, previousSize };
}
