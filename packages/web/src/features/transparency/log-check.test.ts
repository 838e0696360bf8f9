import * as core from '@beadroll/core';
import { describe, expect, it } from 'vitest';
import { exampleRolls } from '../public-lot/lot-fixtures';
import { checkLog, type LogCheckDeps, type RememberedCheckpoint } from './log-check';

const log = core.noteSigner('beads.example/log', new Uint8Array(32).fill(5));
const KEY = core.formatVerifierKey(log.name, log.publicKey);
const witness = core.noteSigner('witness.example/w1', new Uint8Array(32).fill(6));
const WKEY = core.formatVerifierKey(witness.name, witness.publicKey, core.NOTE_SIG_COSIGNATURE);

/** A log server as the page sees it: every entry of the rolls given, plus `extra` other leaves. */
function logOf(rolls: core.BundleRoll[], extra: string[], cosign = false, after: string[] = []) {
  const hashes = [...extra];
  const withIndex = rolls.map((r) => ({
    ...r,
    entries: r.entries.map((e) => {
      hashes.push(e.hash);
      return { ...e, logIndex: hashes.length - 1 };
    }),
  }));
  hashes.push(...after);
  const tree = new core.MerkleTree(hashes.map(core.entryLeafHash));
  const text = core.formatCheckpoint({ origin: log.name, size: tree.size, root: tree.root() });
  let note = core.signNote(text, log);
  if (cosign) note = core.addSignatures(note, [core.cosignatureLine(text, witness, 1_800_000_000)]);
  const roll = withIndex[0]!;
  const head = roll.entries.at(-1)!;
  const seq = (JSON.parse(head.header) as core.EntryHeader).seq;
  const bundle = core.createBundle(withIndex, [
    {
      note,
      inclusions: [
        {
          lot: roll.lot,
          seq,
          logIndex: head.logIndex,
          proof: tree.inclusionProof(head.logIndex).map(core.base64Encode),
        },
      ],
    },
  ]);
  return { tree, bundle };
}

function deps(
  tree: core.MerkleTree,
  memory: Map<string, RememberedCheckpoint>,
  builtInKey = KEY,
): LogCheckDeps {
  return {
    builtInKey,
    fetchKey: async () => `${KEY}\n`,
    fetchWitnessKeys: async () => `${WKEY}\n`,
    fetchConsistency: async (from, to) => tree.consistencyProof(from, to).map(core.base64Encode),
    load: (o) => memory.get(o) ?? null,
    save: (o, c) => memory.set(o, c),
  };
}

const other = (n: number) => Array.from({ length: n }, (_, i) => i.toString(16).padStart(2, '0').repeat(32));

describe('the page’s log check (format §14.6)', () => {
  const rolls = exampleRolls().slice(0, 1);
  const lot = rolls[0]!.lot;

  it('verifies signature and inclusion, counts the witnesses, and remembers the checkpoint', async () => {
    const { tree, bundle } = logOf(rolls, other(5), true);
    const memory = new Map<string, RememberedCheckpoint>();
    const r = await checkLog(lot, bundle, deps(tree, memory));
    expect(r).toMatchObject({ state: 'in-log', size: tree.size, witnesses: 1, rememberedSize: null });
    expect(memory.get('beads.example/log')?.size).toBe(tree.size);
  });

  it('an honestly grown log agrees with the remembered checkpoint by a consistency proof', async () => {
    const memory = new Map<string, RememberedCheckpoint>();
    const first = logOf(rolls, other(5));
    await checkLog(lot, first.bundle, deps(first.tree, memory));
    const grown = logOf(rolls, other(5), false, other(4));
    const r = await checkLog(lot, grown.bundle, deps(grown.tree, memory));
    expect(r).toMatchObject({ state: 'in-log', size: first.tree.size + 4, rememberedSize: first.tree.size });
    expect(memory.get('beads.example/log')?.size).toBe(first.tree.size + 4);
    // Shown the older checkpoint again afterwards: still consistent, and the larger one is kept.
    expect((await checkLog(lot, first.bundle, deps(grown.tree, memory))).state).toBe('in-log');
    expect(memory.get('beads.example/log')?.size).toBe(first.tree.size + 4);
  });

  it('a rewritten log is caught against the remembered checkpoint', async () => {
    const memory = new Map<string, RememberedCheckpoint>();
    const first = logOf(rolls, other(5));
    await checkLog(lot, first.bundle, deps(first.tree, memory));
    const later = logOf(rolls, other(9));
    // A different prefix: the earlier leaves moved. Not a grown log but a rewritten one.
    const r = await checkLog(lot, later.bundle, deps(later.tree, memory));
    expect(r).toMatchObject({ state: 'failed', what: expect.stringContaining('changed its past') });
  });

  it('a fork shown to two browsers: the one that remembered the honest log sees it, a fresh one cannot', async () => {
    const honest = logOf(rolls, other(6));
    const a = new Map<string, RememberedCheckpoint>();
    expect((await checkLog(lot, honest.bundle, deps(honest.tree, a))).state).toBe('in-log');
    // The operator rewrites leaf 2 (another lot's entry) and keeps growing that version.
    const forkedLeaves = other(6);
    forkedLeaves[2] = 'ab'.repeat(32);
    const fork = logOf(rolls, [...forkedLeaves, ...other(3).map((h) => h.replace(/^0/, 'f'))]);
    const b = new Map<string, RememberedCheckpoint>();
    expect((await checkLog(lot, fork.bundle, deps(fork.tree, b))).state).toBe('in-log');
    const again = await checkLog(lot, fork.bundle, deps(fork.tree, a));
    expect(again).toMatchObject({ state: 'failed', what: expect.stringContaining('not consistent') });
    // The remembered checkpoint is kept, not replaced by the fork's.
    expect(a.get('beads.example/log')?.size).toBe(honest.tree.size);
  });

  it('names exactly what failed: another key, a wrong proof, a forged signature', async () => {
    const { tree, bundle } = logOf(rolls, other(3));
    const otherKey = core.formatVerifierKey(
      log.name,
      core.noteSigner(log.name, new Uint8Array(32)).publicKey,
    );
    expect(await checkLog(lot, bundle, deps(tree, new Map(), otherKey))).toMatchObject({
      state: 'failed',
      what: expect.stringContaining('not the one built into this page'),
    });
    const cp = bundle.checkpoints[0] as core.BundleCheckpoint;
    const badProof = {
      ...bundle,
      checkpoints: [{ ...cp, inclusions: [{ ...cp.inclusions[0]!, proof: [] }] }],
    };
    expect(await checkLog(lot, badProof, deps(tree, new Map()))).toMatchObject({
      state: 'failed',
      what: expect.stringContaining('is not in the registry’s log'),
    });
    const forged = {
      ...bundle,
      checkpoints: [{ ...cp, note: cp.note.replace(`\n${tree.size}\n`, `\n${tree.size + 1}\n`) }],
    };
    expect(await checkLog(lot, forged, deps(tree, new Map()))).toMatchObject({
      state: 'failed',
      what: expect.stringContaining('does not verify'),
    });
  });

  it('a bundle without a checkpoint is not yet in the log, and asks the server nothing', async () => {
    const bundle = core.createBundle(rolls);
    const d = deps(new core.MerkleTree(), new Map());
    d.fetchKey = () => Promise.reject(new Error('must not be asked'));
    expect(await checkLog(lot, bundle, d)).toEqual({ state: 'not-yet' });
  });
});
