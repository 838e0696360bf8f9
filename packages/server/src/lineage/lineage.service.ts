import { Injectable } from '@nestjs/common';
import {
  formatLotCode,
  type BeadCount,
  type LotDescription,
  type LotStatus,
  type ParentRef,
  type RollState,
} from '@beadroll/core';
import { AppError, type FieldProblem } from '../common/app-error';
import { LedgerService, type RollTransaction } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { requireMayAppend } from '../ledger/roll-rule.error';
import { LotsService, type Viewer } from '../lots/lots.service';
import type { CombineLotsDto, SplitLotDto } from './dto/lineage-requests.dto';
import type {
  AncestryEdgeResponse,
  AncestryNodeResponse,
  AncestryResponse,
  CombineResponse,
  SplitResponse,
} from './dto/lineage-responses.dto';
import { LotViewsService } from '../lots/lot-views.service';

/** The most lots an ancestry graph shows. */
export const ANCESTRY_NODE_LIMIT = 200;

/** Codes the demo loader fixes in advance, so loading twice finds the same lots. */
export interface PresetCodes {
  codes?: string[];
}

interface GraphRow {
  code: string;
  state: RollState;
  title: string;
  status: LotStatus;
  listed: boolean;
  holder: string;
  offer_recipient: string | null;
}

function plain<T>(dto: unknown): T {
  return JSON.parse(JSON.stringify(dto)) as T;
}

function sumOf(counts: BeadCount[]): BeadCount {
  return {
    value: counts.reduce((s, c) => s + c.value, 0),
    estimated: counts.some((c) => c.estimated),
  };
}

/** Beads that were there went into other lots meanwhile: the lot's present state refuses it (409). */
function beadsGone(fields: FieldProblem[]): AppError {
  return new AppError(
    'roll_rule',
    `Some beads have already gone into other lots: ${fields.map((f) => f.reason).join('; ')}`,
    fields,
  );
}

/**
 * Splits and combinations: a lot's beads go into new lots, and the rolls link both ways. Each
 * is one ledger transaction over every lot involved (locked in the ledger's fixed order): the
 * parents' `split`/`combined` entries first, then each new lot's `registered` entry naming
 * them. Checks against what the dealer saw answer 400; a lot that changed in the meantime
 * (another split, combination or offer won the race) answers 409.
 */
@Injectable()
export class LineageService {
  constructor(
    private readonly views: LotViewsService,
    private readonly reader: RollReaderService,
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
  ) {}

  /** Divides a lot into new lots; what the children do not take stays with the lot. */
  async split(
    actor: Viewer,
    text: string,
    dto: SplitLotDto,
    preset: PresetCodes = {},
  ): Promise<SplitResponse> {
    const code = await this.lots.readableCode(actor, text);
    const descriptions = dto.children.map((c) => plain<LotDescription>(c.description));
    const problems: FieldProblem[] = [];
    descriptions.forEach((d, i) => {
      if (d.count.value < 1)
        problems.push({
          field: `children.${i}.description.count.value`,
          reason: 'a new lot holds at least one bead',
        });
    });
    if (problems.length) throw AppError.validation(problems);
    const seen = (await this.reader.cachedStates([code])).get(code)!;
    requireMayAppend(seen, 'split', actor.id, { lot: code });
    const total = sumOf(descriptions.map((d) => d.count));
    const had = seen.description?.count ?? seen.remaining;
    if (!had.estimated && total.value > had.value)
      throw AppError.validation([
        { field: 'children', reason: `the new lots hold ${total.value} beads but the lot has ${had.value}` },
      ]);
    if (!seen.remaining.estimated && total.value > seen.remaining.value)
      throw beadsGone([
        {
          field: 'children',
          reason: `the new lots hold ${total.value} beads but only ${seen.remaining.value} of the lot are left`,
        },
      ]);
    return this.ledger.withLots([code], async (tx) => {
      requireMayAppend(tx.state(code), 'split', actor.id, { lot: code });
      const codes = await this.newCodes(tx, descriptions.length, preset.codes);
      const split = await tx.append(code, {
        kind: 'split',
        actor: actor.id,
        body: { children: codes.map((lot, i) => ({ lot, count: descriptions[i]!.count })) },
      });
      const parents: ParentRef[] = [{ lot: code, seq: split.seq, hash: split.hash }];
      for (let i = 0; i < codes.length; i++) {
        await tx.register(
          { code: codes[i], actor: actor.id, description: descriptions[i]!, parents },
          { fields: { 'body.description': `children.${i}.description` } },
        );
      }
      const after = tx.state(code);
      return {
        parent: code,
        seq: split.seq,
        remaining: after.remaining,
        status: after.status,
        children: codes.map((c, i) => ({
          code: c,
          displayCode: formatLotCode(c),
          count: descriptions[i]!.count,
        })),
      };
    });
  }

  /** Makes a new lot from beads of several lots the actor holds, each whole or in part. */
  async combine(actor: Viewer, dto: CombineLotsDto, preset: PresetCodes = {}): Promise<CombineResponse> {
    const description = plain<LotDescription>(dto.description);
    const problems: FieldProblem[] = [];
    const codes: string[] = [];
    dto.parts.forEach((p, i) => {
      const code = RollReaderService.canonicalCode(p.lot);
      if (!code) problems.push({ field: `parts.${i}.lot`, reason: 'is not a lot code' });
      else if (codes.includes(code))
        problems.push({ field: `parts.${i}.lot`, reason: 'names a lot already in this combination' });
      if (p.count && p.count.value < 1)
        problems.push({
          field: `parts.${i}.count.value`,
          reason: 'take at least one bead, or leave the count out to take the whole lot',
        });
      codes.push(code ?? '');
    });
    if (problems.length) throw AppError.validation(problems);
    for (const [i, code] of codes.entries()) {
      try {
        await this.lots.readableCode(actor, code);
      } catch {
        problems.push({ field: `parts.${i}.lot`, reason: 'no lot you hold has this code' });
      }
    }
    if (problems.length) throw AppError.validation(problems);
    const seen = await this.reader.cachedStates(codes);
    codes.forEach((code, i) => {
      if (seen.get(code)!.holder !== actor.id)
        problems.push({ field: `parts.${i}.lot`, reason: 'you do not hold this lot' });
    });
    if (problems.length) throw AppError.validation(problems);
    for (const code of codes) requireMayAppend(seen.get(code)!, 'combined', actor.id, { lot: code });
    for (const [i, code] of codes.entries()) {
      const ancestors = await this.ancestorsOf(code);
      const other = codes.find((c) => c !== code && ancestors.has(c));
      if (other)
        problems.push({
          field: `parts.${i}.lot`,
          reason: `was made from lot ${formatLotCode(other)}, also in this combination: the same beads would be counted twice`,
        });
    }
    const asked = dto.parts.map((p) => (p.count ? plain<BeadCount>(p.count) : null));
    const taken = (states: Map<string, RollState>) =>
      asked.map((c, i) => c ?? states.get(codes[i]!)!.remaining);
    const seenTaken = taken(seen);
    const gone: FieldProblem[] = [];
    asked.forEach((c, i) => {
      if (!c) return;
      const st = seen.get(codes[i]!)!;
      const had = st.description?.count ?? st.remaining;
      if (!had.estimated && c.value > had.value)
        problems.push({ field: `parts.${i}.count.value`, reason: `the lot has ${had.value} beads` });
      else if (!st.remaining.estimated && c.value > st.remaining.value)
        gone.push({
          field: `parts.${i}.count.value`,
          reason: `only ${st.remaining.value} beads of the lot are left`,
        });
    });
    const total = sumOf(seenTaken);
    const whole = asked.some((c) => c === null);
    if (description.count.value !== total.value) {
      const p = {
        field: 'description.count.value',
        reason: `the new lot holds the beads taken from its parts: ${total.value}`,
      };
      if (whole) gone.push(p);
      else problems.push(p);
    } else if (total.estimated && !description.count.estimated)
      problems.push({
        field: 'description.count.estimated',
        reason: 'a count taken from a part is estimated, so this one is too',
      });
    if (problems.length) throw AppError.validation(problems);
    if (gone.length) throw beadsGone(gone);

    return this.ledger.withLots(codes, async (tx) => {
      const states = new Map(codes.map((c) => [c, tx.state(c)] as const));
      for (const code of codes) requireMayAppend(states.get(code)!, 'combined', actor.id, { lot: code });
      const now = taken(states);
      const nowTotal = sumOf(now);
      if (nowTotal.value !== description.count.value || nowTotal.estimated !== total.estimated)
        throw new AppError(
          'roll_rule',
          'a lot in this combination changed meanwhile: look at the counts again',
        );
      const [child] = await this.newCodes(tx, 1, preset.codes);
      const parents: ParentRef[] = [];
      const out: CombineResponse['parents'] = [];
      const order = codes.map((c, i) => ({ c, i })).sort((a, b) => (a.c < b.c ? -1 : 1));
      for (const { c, i } of order) {
        const e = await tx.append(c, {
          kind: 'combined',
          actor: actor.id,
          body: { child: child!, count: now[i]! },
        });
        parents.push({ lot: c, seq: e.seq, hash: e.hash });
        out.push({
          code: c,
          seq: e.seq,
          count: now[i]!,
          remaining: e.state.remaining,
          status: e.state.status,
        });
      }
      await tx.register(
        { code: child, actor: actor.id, description, parents },
        { fields: { 'body.description': 'description' } },
      );
      return {
        lot: { code: child!, displayCode: formatLotCode(child!), count: description.count },
        parents: out,
      };
    });
  }

  /**
   * The lots a lot was made from and the lots made from it, followed only through lots the
   * viewer may read: a lot the viewer may not read shows its code (which the readable roll
   * beside it names anyway) and nothing more.
   */
  async ancestry(viewer: Viewer, text: string): Promise<AncestryResponse> {
    const { code, upTo } = await this.lots.readAccess(viewer, text);
    // A former holder reads the lot as it stood at the handover: its own row from that prefix,
    // and only the lots split or combined from it before then.
    const asOf = upTo === null ? null : await this.lots.detail(viewer, code);
    const nodes = new Map<string, AncestryNodeResponse>();
    const edges = new Map<string, AncestryEdgeResponse>();
    const rows = new Map<string, GraphRow>();
    let truncated = false;
    let frontier: Array<{ code: string; depth: number }> = [{ code, depth: 0 }];
    while (frontier.length > 0) {
      const want = frontier.filter((f) => !nodes.has(f.code));
      for (const r of await this.graphRows(want.map((f) => f.code))) rows.set(r.code, r);
      const next: typeof frontier = [];
      for (const f of want) {
        if (nodes.has(f.code)) continue;
        if (nodes.size >= ANCESTRY_NODE_LIMIT) {
          truncated = true;
          break;
        }
        const row = rows.get(f.code);
        const root = asOf !== null && f.code === code;
        const readable = !!row && (root || this.canRead(viewer, row));
        nodes.set(f.code, {
          code: f.code,
          displayCode: formatLotCode(f.code),
          depth: f.depth,
          readable,
          title: !readable ? null : root ? asOf.title : row.title,
          status: !readable ? null : root ? asOf.status : row.status,
          listed: !readable ? null : root ? asOf.listed : row.listed,
          count: !readable ? null : root ? asOf.remaining : row.state.remaining,
        });
        if (!readable) continue;
        if (f.depth <= 0)
          for (const p of row.state.parents) {
            edges.set(`${p.lot}/${p.seq}/${f.code}`, {
              from: p.lot,
              to: f.code,
              kind: 'split',
              seq: p.seq,
              count: { value: 0, estimated: false },
            });
            next.push({ code: p.lot, depth: f.depth - 1 });
          }
        if (f.depth >= 0)
          for (const c of row.state.children) {
            if (root && c.seq > upTo!) continue;
            edges.set(`${f.code}/${c.seq}/${c.lot}`, {
              from: f.code,
              to: c.lot,
              kind: 'split',
              seq: c.seq,
              count: c.count,
            });
            next.push({ code: c.lot, depth: f.depth + 1 });
          }
      }
      if (truncated) break;
      frontier = next;
    }
    for (const r of await this.graphRows([...edges.values()].map((e) => e.from).filter((c) => !rows.has(c))))
      rows.set(r.code, r);
    const kinds = await this.linkKinds([...edges.values()]);
    const out: AncestryEdgeResponse[] = [];
    for (const e of edges.values()) {
      if (!nodes.has(e.from) || !nodes.has(e.to)) continue;
      const link = rows.get(e.from)?.state.children.find((c) => c.lot === e.to && c.seq === e.seq);
      out.push({ ...e, kind: kinds.get(`${e.from}/${e.seq}`) ?? 'split', count: link?.count ?? e.count });
    }
    return { code, nodes: [...nodes.values()], edges: out, truncated };
  }

  /** Every lot a lot was made from, through any number of splits and combinations. */
  ancestorsOf(code: string): Promise<Set<string>> {
    return this.reader.ancestorsOf(code);
  }

  private canRead(viewer: Viewer, r: GraphRow): boolean {
    return (
      r.listed || r.holder === viewer.id || r.offer_recipient === viewer.id || viewer.role === 'registrar'
    );
  }

  private async graphRows(codes: string[]): Promise<GraphRow[]> {
    if (codes.length === 0) return [];
    const [states, views] = await Promise.all([
      this.reader.cachedStates(codes),
      this.views.findMany({ codes }),
    ]);
    return views
      .filter((v) => states.has(v.code))
      .map((v) => ({
        code: v.code,
        state: states.get(v.code)!,
        title: v.title,
        status: v.status as LotStatus,
        listed: v.listed,
        holder: v.holder,
        offer_recipient: v.offerRecipient,
      }));
  }

  private async linkKinds(edges: AncestryEdgeResponse[]): Promise<Map<string, 'split' | 'combined'>> {
    return (await this.reader.kindsAt(edges.map((e) => ({ code: e.from, seq: e.seq })))) as Map<
      string,
      'split' | 'combined'
    >;
  }

  private async newCodes(tx: RollTransaction, n: number, preset: string[] = []): Promise<string[]> {
    const out: string[] = [];
    for (let i = 0; i < n; i++) {
      let code = preset[i] ?? (await tx.newCode());
      while (out.includes(code)) code = await tx.newCode();
      out.push(code);
    }
    return out;
  }
}
