import { Injectable } from '@nestjs/common';
import { createBundle, type Bundle, type EntryHeader, type RollState } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { LogService } from '../log/log.service';
import { RollReaderService, type StoredRollEntry } from './roll-reader.service';

interface RollPart {
  lot: string;
  scope: 'full' | 'link';
  entries: StoredRollEntry[];
}

/**
 * Builds export bundles: the lot's full roll first, then its ancestors — in full when
 * `fullAncestor` says so (a listed lot, by default), otherwise only the `split`/`combined`
 * entries that a child in the bundle names ('link' scope), so a child's bundle never publishes
 * an unlisted lot's history. Bundles hold no sealed salt or value: they are built only from
 * headers and bodies.
 */
@Injectable()
export class BundleService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly reader: RollReaderService,
    private readonly log: LogService,
  ) {}

  async bundleFor(
    code: string,
    fullAncestor: (lot: string, state: RollState) => boolean = (_lot, state) => state.listed,
  ): Promise<Bundle | null> {
    const lot = await this.reader.findLot(code);
    if (!lot) return null;
    const parts: RollPart[] = [{ lot: code, scope: 'full', entries: await this.reader.entries(lot.id) }];
    const linkSeqs = new Map<string, Set<number>>();
    const queue = [parts[0]!];
    while (queue.length > 0) {
      const part = queue.shift()!;
      const first = part.entries[0];
      if (part.scope !== 'full' || !first || first.seq !== 0) continue;
      const header = JSON.parse(first.header) as EntryHeader;
      for (const p of header.parents ?? []) {
        const known = parts.find((x) => x.lot === p.lot);
        if (known?.scope === 'full') continue;
        const rows: Array<{ id: string; state: RollState }> = await this.dataSource.query(
          'SELECT "id", "state" FROM "lots" WHERE "code" = $1',
          [p.lot],
        );
        const row = rows[0];
        if (!row) continue; // the verifier will report the missing parent
        if (fullAncestor(p.lot, row.state)) {
          const full: RollPart = { lot: p.lot, scope: 'full', entries: await this.reader.entries(row.id) };
          if (known) parts.splice(parts.indexOf(known), 1, full);
          else parts.push(full);
          queue.push(full);
          continue;
        }
        const seqs = linkSeqs.get(p.lot) ?? new Set<number>();
        seqs.add(p.seq);
        linkSeqs.set(p.lot, seqs);
        const entries = (await this.reader.entries(row.id, { kinds: ['split', 'combined'] })).filter((e) =>
          seqs.has(e.seq),
        );
        if (known) known.entries = entries;
        else parts.push({ lot: p.lot, scope: 'link', entries });
      }
    }
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
