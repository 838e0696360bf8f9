import { Injectable } from '@nestjs/common';
import {
  createBundle,
  INHERITED_SCOPE,
  type Bundle,
  type BundleScope,
  type EntryHeader,
  type ExhibitAddedBody,
  type RollState,
} from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';
import { LogService } from '../log/log.service';
import { RollReaderService, type StoredRollEntry } from './roll-reader.service';

export interface RollPart {
  lot: string;
  scope: BundleScope;
  entries: StoredRollEntry[];
  /** seqs of the link entries children in the bundle name (inherited scope). */
  links?: Set<number>;
  /** the rest of an inherited roll: its registered entry, standing opinions, cited exhibits */
  travelling?: StoredRollEntry[];
}

/** Kinds of an unlisted ancestor's entries that may travel to its descendants. */
const TRAVELLING_KINDS = ['registered', 'split', 'combined', 'opinion', 'exhibit-added'];

/**
 * The rolls of a lot's bundle, its own first in full, then its ancestors: in full when
 * `fullAncestor` says so, otherwise in 'inherited' scope (see {@link BundleService}). Read
 * through `manager` when given (inside an append transaction it sees that transaction's
 * entries). null when the lot does not exist.
 */
export async function bundleRolls(
  reader: RollReaderService,
  code: string,
  fullAncestor: (lot: string, state: RollState) => boolean = (_lot, state) => state.listed,
  manager?: EntityManager,
): Promise<RollPart[] | null> {
  const lot = await reader.findLot(code, manager);
  if (!lot) return null;
  const parts: RollPart[] = [
    { lot: code, scope: 'full', entries: await reader.entries(lot.id, {}, manager) },
  ];
  const queue = [parts[0]!];
  while (queue.length > 0) {
    const part = queue.shift()!;
    const first = part.scope === 'full' ? part.entries[0] : part.travelling?.[0];
    if (!first || first.seq !== 0) continue;
    const header = JSON.parse(first.header) as EntryHeader;
    for (const p of header.parents ?? []) {
      const known = parts.find((x) => x.lot === p.lot);
      if (known?.scope === 'full') continue;
      if (known) {
        known.links!.add(p.seq);
        continue;
      }
      const row = await reader.cachedState(p.lot, manager);
      if (!row) continue; // the verifier will report the missing parent
      if (fullAncestor(p.lot, row.state)) {
        const full: RollPart = {
          lot: p.lot,
          scope: 'full',
          entries: await reader.entries(row.id, {}, manager),
        };
        parts.push(full);
        queue.push(full);
        continue;
      }
      const standing = new Set(row.state.opinions.filter((o) => o.body).map((o) => o.seq));
      const cited = new Set(row.state.opinions.flatMap((o) => o.body?.exhibits ?? []));
      const travelling = (await reader.entries(row.id, { kinds: TRAVELLING_KINDS }, manager)).filter((e) => {
        if (e.kind === 'opinion') return standing.has(e.seq) && e.body !== null;
        if (e.kind !== 'exhibit-added') return true;
        if (e.body === null) return false;
        const b = JSON.parse(e.body) as ExhibitAddedBody;
        return 'exhibit' in b && cited.has(b.exhibit.original.sha256);
      });
      const part: RollPart = {
        lot: p.lot,
        scope: INHERITED_SCOPE,
        entries: [],
        links: new Set([p.seq]),
        travelling,
      };
      parts.push(part);
      queue.push(part);
    }
  }
  for (const part of parts) {
    if (part.scope !== INHERITED_SCOPE) continue;
    part.entries = part
      .travelling!.filter((e) => (e.kind !== 'split' && e.kind !== 'combined') || part.links!.has(e.seq))
      .map((e) => (e.kind === 'registered' ? { ...e, body: null } : e));
  }
  return parts;
}

/**
 * Builds export bundles: the lot's full roll first, then its ancestors — in full when
 * `fullAncestor` says so (a listed lot, by default), otherwise in 'inherited' scope: only its
 * `registered` header (body withheld), the `split`/`combined` entries a child in the bundle
 * names, its standing opinions and the public exhibits they cite, so a child's bundle carries
 * every opinion about its beads but never publishes an unlisted lot's other history. Bundles
 * hold no sealed salt or value: they are built only from headers and bodies.
 */
@Injectable()
export class BundleService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly reader: RollReaderService,
    private readonly log: LogService,
  ) {}

  /**
   * The bundle of `code`, every row read through `manager` (the primary by default; a public
   * read may pass the hot standby's). Its checkpoint is the log's latest, with proofs of the
   * entries this read saw.
   */
  async bundleFor(
    code: string,
    fullAncestor: (lot: string, state: RollState) => boolean = (_lot, state) => state.listed,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<Bundle | null> {
    const parts = await bundleRolls(this.reader, code, fullAncestor, manager);
    if (!parts) return null;
    const checkpoint = await this.log.bundleCheckpoint(
      parts.filter((r) => r.scope === 'full').map((r) => ({ lot: r.lot, entries: r.entries })),
    );
    return createBundle(
      parts.map((r) => ({
        lot: r.lot,
        scope: r.scope,
        entries: r.entries.map((e) => ({
          hash: e.hash,
          header: e.header,
          body: e.body,
          logIndex: e.logIndex,
        })),
      })),
      checkpoint ? [checkpoint] : [],
    );
  }
}
