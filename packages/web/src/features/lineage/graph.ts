import {
  formatLotCode,
  inheritedRecord,
  verifyBundle,
  type BundleScope,
  type BeadCount,
  type Bundle,
  type CombinedBody,
  type EntryHeader,
  type ExhibitRef,
  type OpinionBody,
  type RollState,
  type SplitBody,
} from '@beadroll/core';
import type { Ancestry } from './lineage.api';

/** A lot in a diagram: where it sits (generation), what it says, and where it links. */
export interface DiagramNode {
  code: string;
  /** Generations from the lot the diagram is about: negative = ancestors, positive = descendants. */
  depth: number;
  /** Second line of the box (a title); null for a lot whose details are not shown. */
  title: string | null;
  /** Where the box links; none for a lot that has no page for this viewer. */
  href?: string;
}

/** Beads that went from one lot into another. */
export interface DiagramEdge {
  from: string;
  to: string;
  kind: 'split' | 'combined';
  count: BeadCount;
}

/** What the ancestry diagram draws. */
export interface DiagramGraph {
  focus: string;
  nodes: DiagramNode[];
  edges: DiagramEdge[];
}

/** The server's ancestry answer as a diagram; `href` says where a readable lot's page is. */
export function graphFromAncestry(a: Ancestry, href: (code: string) => string): DiagramGraph {
  return {
    focus: a.code,
    nodes: a.nodes.map((n) => ({
      code: n.code,
      depth: n.depth,
      title: n.readable ? n.title : null,
      href: n.readable ? href(n.code) : undefined,
    })),
    edges: a.edges.map((e) => ({ from: e.from, to: e.to, kind: e.kind, count: e.count })),
  };
}

interface VerifiedRoll {
  lot: string;
  scope: BundleScope;
  state: RollState | null;
  entries: Array<{ header: EntryHeader; body: unknown }>;
}

/** The rolls of a bundle that verified (with links), or null when anything in it is broken. */
function verifiedRolls(bundle: Bundle): Map<string, VerifiedRoll> | null {
  const v = verifyBundle(bundle);
  if (!v.ok) return null;
  const out = new Map<string, VerifiedRoll>();
  bundle.rolls.forEach((r, i) => {
    out.set(r.lot, {
      lot: r.lot,
      scope: r.scope,
      state: v.rolls[i]!.state,
      entries: r.entries.map((e) => ({
        header: JSON.parse(e.header) as EntryHeader,
        body: e.body === null ? null : (JSON.parse(e.body) as unknown),
      })),
    });
  });
  return out;
}

function linkCount(roll: VerifiedRoll | undefined, seq: number, child: string): DiagramEdge | null {
  const e = roll?.entries.find((x) => x.header.seq === seq);
  if (!e || !e.body) return null;
  if (e.header.kind === 'split') {
    const c = (e.body as SplitBody).children.find((x) => x.lot === child);
    return c ? { from: roll!.lot, to: child, kind: 'split', count: c.count } : null;
  }
  if (e.header.kind === 'combined')
    return { from: roll!.lot, to: child, kind: 'combined', count: (e.body as CombinedBody).count };
  return null;
}

/**
 * The ancestry of a lot drawn from a bundle that verifies (lot and links), for pages that render
 * only from verified rolls: ancestors as far as the bundle goes, and the lots this one went into
 * (named by its own entries). Null when the bundle does not verify. `href` gives each lot's
 * page; lots shown only through their linking entries get no title.
 */
export function graphFromBundle(
  bundle: Bundle,
  code: string,
  href: (code: string) => string | undefined,
): DiagramGraph | null {
  const rolls = verifiedRolls(bundle);
  const self = rolls?.get(code);
  if (!rolls || !self?.state) return null;
  const nodes = new Map<string, DiagramNode>();
  const edges: DiagramEdge[] = [];
  const titleOf = (lot: string) => rolls.get(lot)?.state?.description?.title ?? null;
  nodes.set(code, { code, depth: 0, title: titleOf(code), href: href(code) });
  const queue: Array<{ lot: string; depth: number }> = [{ lot: code, depth: 0 }];
  while (queue.length > 0) {
    const { lot, depth } = queue.shift()!;
    for (const p of rolls.get(lot)?.state?.parents ?? []) {
      const edge = linkCount(rolls.get(p.lot), p.seq, lot);
      if (edge) edges.push(edge);
      if (nodes.has(p.lot)) continue;
      const full = rolls.get(p.lot)?.scope === 'full';
      nodes.set(p.lot, {
        code: p.lot,
        depth: depth - 1,
        title: titleOf(p.lot),
        href: full ? href(p.lot) : undefined,
      });
      queue.push({ lot: p.lot, depth: depth - 1 });
    }
  }
  for (const c of self.state.children) {
    const edge = linkCount(self, c.seq, c.lot);
    if (edge) edges.push(edge);
    if (!nodes.has(c.lot)) nodes.set(c.lot, { code: c.lot, depth: 1, title: null, href: href(c.lot) });
  }
  return { focus: code, nodes: [...nodes.values()], edges };
}

/** Evidence recorded on an ancestor of this lot (core's inherited record, opinions and exhibits). */
export interface InheritedItem {
  lot: string;
  displayCode: string;
  seq: number;
  time: string;
  actor: string;
  kind: 'opinion' | 'exhibit-added';
  opinion?: OpinionBody;
  exhibit?: ExhibitRef;
  /** Recorded before the beads left that lot. */
  before: boolean;
  /** How the beads left it: split or combined, and when. */
  left: { kind: 'split' | 'combined'; time: string };
}

/**
 * Standing opinions and public exhibits recorded on the ancestors the verified bundle carries
 * (in full, or an unlisted one's opinions and their cited exhibits), oldest first, each marked
 * before or after the beads left that lot. Empty when the bundle does not verify.
 */
export function inheritedEvidence(bundle: Bundle, code: string): InheritedItem[] {
  if (!verifyBundle(bundle).ok) return [];
  const out: InheritedItem[] = [];
  for (const i of inheritedRecord(bundle, code)) {
    if (i.kind === 'observed') continue;
    const base = {
      lot: i.lot,
      displayCode: formatLotCode(i.lot),
      seq: i.seq,
      time: i.time,
      actor: i.actor,
      before: i.before,
      left: { kind: i.left.kind, time: i.left.time },
    };
    if (i.kind === 'opinion') out.push({ ...base, kind: 'opinion', opinion: i.body as OpinionBody });
    else out.push({ ...base, kind: 'exhibit-added', exhibit: (i.body as { exhibit: ExhibitRef }).exhibit });
  }
  return out.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
}
