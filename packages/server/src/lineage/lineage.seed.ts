import { generateLotCode, seededRandom, type BodyFields, type LotDescription } from '@beadroll/core';
import type { INestApplicationContext } from '@nestjs/common';
import type { CombineLotsDto, SplitLotDto } from './dto/lineage-requests.dto';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { LineageService } from './lineage.service';

/** An opinion recorded on a demo lot before it is split or combined (author by handle). */
export interface DemoLineageOpinion {
  author: string;
  opinion: BodyFields<'opinion'>;
}

/** The demo's split strand and combined piece (seed-demo/lineage.json). */
export interface DemoLineage {
  split: {
    dealer: string;
    parent: LotDescription;
    opinions?: DemoLineageOpinion[];
    children: Array<{ title: string; count: number; strandLengthMm?: number }>;
  };
  combine: {
    dealer: string;
    parts: Array<{ description: LotDescription; take?: number; opinions?: DemoLineageOpinion[] }>;
    piece: Omit<LotDescription, 'count'>;
  };
}

/** Seed of the codes of the demo's split and combined lots: the same on every machine. */
export const DEMO_LINEAGE_SEED = 'beadroll demo scenario: splits and combinations';

/**
 * Loads a strand split into three listed strands and a necklace combined from two lots, through
 * the lineage service. Codes come from a fixed seed, so a second run finds them and writes
 * nothing. Returns the codes of the split children and of the necklace.
 */
export async function loadDemoLineage(
  app: INestApplicationContext,
  data: DemoLineage,
  accounts: Record<string, string>,
): Promise<{ splitChildren: string[]; piece: string }> {
  const random = seededRandom(DEMO_LINEAGE_SEED);
  const ledger = app.get(LedgerService);
  const lineage = app.get(LineageService);
  const reader = app.get(RollReaderService);
  const exists = async (code: string) => (await reader.findLot(code)) !== null;
  const idOf = (handle: string) => {
    const id = accounts[handle];
    if (!id) throw new Error(`the demo lineage names ${handle}, who is not a demo account`);
    return id;
  };

  const s = data.split;
  const parent = generateLotCode(random);
  const splitChildren = s.children.map(() => generateLotCode(random));
  const splitter = { id: idOf(s.dealer), role: 'dealer' as const };
  if (!(await exists(parent))) {
    await ledger.register({ code: parent, actor: splitter.id, description: s.parent });
    for (const o of s.opinions ?? [])
      await ledger.append(parent, { kind: 'opinion', actor: idOf(o.author), body: o.opinion });
    const dto = {
      children: s.children.map((c) => ({
        description: {
          ...s.parent,
          title: c.title,
          count: { value: c.count, estimated: false },
          ...(c.strandLengthMm ? { strandLengthMm: c.strandLengthMm } : {}),
        },
      })),
    } as unknown as SplitLotDto;
    await lineage.split(splitter, parent, dto, { codes: splitChildren });
  }

  const c = data.combine;
  const parts = c.parts.map(() => generateLotCode(random));
  const piece = generateLotCode(random);
  const maker = { id: idOf(c.dealer), role: 'dealer' as const };
  if (!(await exists(piece))) {
    for (const [i, p] of c.parts.entries())
      if (!(await exists(parts[i]!))) {
        await ledger.register({ code: parts[i], actor: maker.id, description: p.description });
        for (const o of p.opinions ?? [])
          await ledger.append(parts[i]!, { kind: 'opinion', actor: idOf(o.author), body: o.opinion });
      }
    const total = c.parts.reduce((sum, p) => sum + (p.take ?? p.description.count.value), 0);
    const dto = {
      parts: c.parts.map((p, i) =>
        p.take ? { lot: parts[i]!, count: { value: p.take, estimated: false } } : { lot: parts[i]! },
      ),
      description: { ...c.piece, count: { value: total, estimated: false } },
    } as unknown as CombineLotsDto;
    await lineage.combine(maker, dto, { codes: [piece] });
  }
  return { splitChildren, piece };
}
