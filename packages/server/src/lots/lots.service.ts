import { Injectable } from '@nestjs/common';
import {
  checkTransition,
  formatLotCode,
  verifyRoll,
  type Bundle,
  type Correction,
  type EntryKind,
  type LotDescription,
  type Money,
  type ObservedBody,
  type RollState,
  type SealedValues,
} from '@beadroll/core';
import { DataSource } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { BundleService } from '../ledger/bundle.service';
import { LedgerService } from '../ledger/ledger.service';
import type { AppendDraft } from '../ledger/ledger.types';
import { RollReaderService } from '../ledger/roll-reader.service';
import { exportFile, type ExportColumn, type ExportFile } from '../export/sheet-export';
import type {
  CreateLotDto,
  DescribeLotDto,
  ExportLotsQueryDto,
  ListLotsQueryDto,
  ObserveLotDto,
} from './dto/lot-requests.dto';
import type {
  LotDetailResponse,
  LotListResponse,
  LotSummaryResponse,
  OwnSealedDetails,
  RollResponse,
  VerifyResponse,
} from './dto/lot-responses.dto';
import type { ObservationsDto } from './dto/observations.dto';
import type { SealedDetailsDto } from './dto/sealed-details.dto';

/** Who is looking: the signed-in principal (id and role are what matter here). */
export type Viewer = Pick<Principal, 'id' | 'role'>;

/**
 * Read access other features give to a lot the viewer may not otherwise read: the roll up to
 * seq `upTo` (for example a former holder, up to the entry that handed the lot on), or null.
 */
export interface LotReadGrant {
  upTo(viewer: Viewer, lotId: string): Promise<number | null>;
}

/**
 * Full read access other features give to a lot the viewer may not otherwise read (for
 * example an assessor asked for an opinion, while the request is open).
 */
export interface LotFullReadGrant {
  mayRead(viewer: Viewer, lotId: string): Promise<boolean>;
}

/** What a viewer may read of a lot: all of it (`upTo` null) or its roll up to a seq. */
export interface ReadAccess {
  code: string;
  lotId: string;
  upTo: number | null;
}

interface LotViewRow {
  lot_id: string;
  code: string;
  title: string;
  form: string | null;
  status: RollState['status'];
  holder: string;
  listed: boolean;
  origin: string | null;
  origin_source: LotSummaryResponse['originSource'];
  technique: string | null;
  period_from: number | null;
  period_to: number | null;
  count_value: number;
  count_estimated: boolean;
  dissent_count: number;
  offer_recipient: string | null;
  observations: LotDetailResponse['observations'];
  head_seq: number;
  registered_at: Date;
  updated_at: Date;
}

/** Core's field paths → request field names, for 400 answers. */
const FIELD_NAMES = {
  'body.description': 'description',
  'body.observations': 'observations',
  'sealed.storage-location': 'sealed.storageLocation',
  'sealed.acquisition-date': 'sealed.acquisition.date',
  'sealed.acquisition-source': 'sealed.acquisition.source',
  'sealed.acquisition-cost': 'sealed.acquisition.cost',
  'sealed.private-note': 'sealed.privateNote',
  'body.corrects': 'corrects',
};

const SORT_COLUMNS: Record<NonNullable<ListLotsQueryDto['sort']>, string> = {
  registered: 'v."registered_at"',
  updated: 'v."updated_at"',
  title: 'lower(v."title")',
  code: 'v."code"',
  form: 'v."form"',
  count: 'v."count_value"',
  origin: 'v."origin"',
  period: 'v."period_from"',
  technique: 'v."technique"',
  status: 'v."status"',
  listed: 'v."listed"',
};

/**
 * The words of a search as a prefix-matching tsquery text (`word:* & word:*`), or null. Only
 * letters and digits survive, so nothing typed can change the query's syntax.
 */
export function searchQueryText(text: string): string | null {
  const words = text
    .normalize('NFC')
    .split(/[^\p{L}\p{N}]+/u)
    .filter(Boolean)
    .slice(0, 16);
  return words.length ? words.map((w) => `${w}:*`).join(' & ') : null;
}

/**
 * The start of a lot code as typed (hyphens and spaces dropped, case and the look-alike
 * letters I, L, O folded as lot codes fold them), or null when it cannot start a code.
 */
export function codePrefix(text: string): string | null {
  const s = text.replace(/[-\s]/g, '').toUpperCase().replace(/[IL]/g, '1').replace(/O/g, '0');
  return /^[0-9A-HJKMNP-TV-Z]{3,9}$/.test(s) ? s : null;
}

/** Plain data from a validated DTO (class instances → the JSON shapes core expects). */
function plain<T>(dto: unknown): T {
  return JSON.parse(JSON.stringify(dto)) as T;
}

/** Sealed details of a request as core's sealed field values. */
export function sealedValuesOf(dto: SealedDetailsDto | undefined): SealedValues | undefined {
  if (!dto) return undefined;
  const out: SealedValues = {};
  if (dto.storageLocation !== undefined) out['storage-location'] = dto.storageLocation;
  if (dto.privateNote !== undefined) out['private-note'] = dto.privateNote;
  const a = dto.acquisition;
  if (a?.date !== undefined) out['acquisition-date'] = a.date;
  if (a?.source !== undefined) out['acquisition-source'] = a.source;
  if (a?.cost !== undefined) out['acquisition-cost'] = { amount: a.cost.amount, currency: a.cost.currency };
  return Object.keys(out).length > 0 ? out : undefined;
}

/** The most lots one inventory export holds. */
const MAX_EXPORT_LOTS = 20_000;

const INVENTORY_COLUMNS: readonly ExportColumn[] = [
  { key: 'code', header: 'code', width: 14 },
  { key: 'title', header: 'title', width: 40 },
  { key: 'form', header: 'form', width: 10 },
  { key: 'count', header: 'count', width: 8 },
  { key: 'estimated', header: 'estimated', width: 10 },
  { key: 'origin', header: 'origin', width: 16 },
  { key: 'status', header: 'status', width: 10 },
  { key: 'listed', header: 'listed', width: 8 },
  { key: 'updatedAt', header: 'last entry (UTC)', width: 24 },
];

function toSummary(r: LotViewRow): LotSummaryResponse {
  return {
    code: r.code,
    displayCode: formatLotCode(r.code),
    title: r.title,
    form: r.form,
    status: r.status,
    listed: r.listed,
    holder: r.holder,
    origin: r.origin,
    originSource: r.origin_source,
    technique: r.technique,
    period: r.period_from === null || r.period_to === null ? null : { from: r.period_from, to: r.period_to },
    count: { value: r.count_value, estimated: r.count_estimated },
    dissents: r.dissent_count,
    headSeq: r.head_seq,
    registeredAt: new Date(r.registered_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  };
}

/**
 * Lots and their rolls as signed-in accounts see them. Every write goes through the
 * LedgerService append path. A lot is readable by its holder, the recipient of its open offer,
 * the registrar, and — when listed — every signed-in account; to anyone else it does not exist.
 */
@Injectable()
export class LotsService {
  /** Up to this many held lots, a search of one's own inventory filters them row by row. */
  static rowByRowLots = 2000;

  private readonly grants: LotReadGrant[] = [];
  private readonly fullGrants: LotFullReadGrant[] = [];

  constructor(
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly reader: RollReaderService,
    private readonly bundles: BundleService,
  ) {}

  /** Adds a full read grant, consulted for lots the viewer may not otherwise read. */
  addFullReadGrant(grant: LotFullReadGrant): void {
    this.fullGrants.push(grant);
  }

  /** Adds a read grant, consulted for lots the viewer may not read in full. */
  addReadGrant(grant: LotReadGrant): void {
    this.grants.push(grant);
  }

  /** Registers a lot: `registered` with the sealed details, then `observed` if given, in one transaction. */
  async register(actor: Viewer, dto: CreateLotDto): Promise<LotDetailResponse> {
    const code = await this.ledger.withLots([], async (tx) => {
      const reg = await tx.register(
        {
          actor: actor.id,
          description: plain<LotDescription>(dto.description),
          sealed: sealedValuesOf(dto.sealed),
        },
        { fields: FIELD_NAMES },
      );
      if (dto.observations && Object.keys(plain<object>(dto.observations)).length > 0) {
        await tx.append(
          reg.lot,
          { kind: 'observed', actor: actor.id, body: { observations: plain(dto.observations) } },
          { fields: FIELD_NAMES },
        );
      }
      return reg.lot;
    });
    return this.detail(actor, code);
  }

  /**
   * Registers many lots in ONE transaction: all are written or none. `progress` hears how many
   * are written so far. A refusal names the 0-based index of the lot in `index`.
   */
  async registerMany(
    actor: Viewer,
    dtos: CreateLotDto[],
    progress: (done: number) => void,
  ): Promise<string[]> {
    return this.ledger.withLots([], async (tx) => {
      const codes: string[] = [];
      for (const [i, dto] of dtos.entries()) {
        try {
          const reg = await tx.register(
            {
              actor: actor.id,
              description: plain<LotDescription>(dto.description),
              sealed: sealedValuesOf(dto.sealed),
            },
            { fields: FIELD_NAMES },
          );
          codes.push(reg.lot);
        } catch (e) {
          if (e instanceof AppError) (e as AppError & { index?: number }).index = i;
          throw e;
        }
        progress(i + 1);
      }
      return codes;
    });
  }

  /** A full new description (`described`). */
  async describe(actor: Viewer, text: string, dto: DescribeLotDto): Promise<LotDetailResponse> {
    return this.appendAndShow(actor, text, {
      kind: 'described',
      body: {
        description: plain<LotDescription>(dto.description),
        ...(dto.corrects ? { corrects: plain<Correction>(dto.corrects) } : {}),
      },
      sealed: sealedValuesOf(dto.sealed),
    });
  }

  /** New observations (`observed`). */
  async observe(actor: Viewer, text: string, dto: ObserveLotDto): Promise<LotDetailResponse> {
    return this.appendAndShow(actor, text, {
      kind: 'observed',
      body: {
        observations: plain<ObservationsDto>(dto.observations),
        ...(dto.corrects ? { corrects: plain<Correction>(dto.corrects) } : {}),
      },
    });
  }

  /** Writes one entry in the actor's name on a lot they may read; answers with the lot as they now see it. */
  private async appendAndShow<K extends EntryKind>(
    actor: Viewer,
    text: string,
    draft: Omit<AppendDraft<K>, 'actor'>,
  ): Promise<LotDetailResponse> {
    const code = await this.readableCode(actor, text);
    await this.ledger.append(code, { ...draft, actor: actor.id }, { fields: FIELD_NAMES });
    return this.detail(actor, code);
  }

  /** Lists or unlists: a `described` entry repeating the newest description with `listed` changed. */
  async setListing(actor: Viewer, text: string, listed: boolean): Promise<LotDetailResponse> {
    const code = await this.readableCode(actor, text);
    await this.ledger.withLots([code], async (tx) => {
      const d = tx.state(code).description;
      if (!d)
        throw new AppError('roll_rule', 'the newest description was redacted: write a new description first');
      if (d.listed === listed) {
        // Nothing to write, but only someone who could have written it learns that.
        const t = checkTransition(tx.state(code), {
          kind: 'described',
          actor: actor.id,
          body: { description: d },
        });
        if (!t.ok) throw new AppError(t.code === 'bad-actor' ? 'forbidden' : 'roll_rule', t.message);
        return;
      }
      await tx.append(code, { kind: 'described', actor: actor.id, body: { description: { ...d, listed } } });
    });
    return this.detail(actor, code);
  }

  async list(viewer: Viewer, q: ListLotsQueryDto): Promise<LotListResponse> {
    const page = q.page ?? 1;
    const pageSize = q.pageSize ?? 20;
    const where: string[] = [];
    const params: unknown[] = [];
    const p = (v: unknown) => {
      params.push(v);
      return `$${params.length}`;
    };
    if (viewer.role !== 'registrar') {
      const me = p(viewer.id);
      where.push(`(v."listed" OR v."holder" = ${me} OR v."offer_recipient" = ${me})`);
    }
    if (q.mine) where.push(`v."holder" = ${p(viewer.id)}`);
    if (q.status) where.push(`v."status" = ${p(q.status)}`);
    if (q.form) where.push(`v."form" = ${p(q.form)}`);
    if (q.origin) where.push(`v."origin" = ${p(q.origin)}`);
    if (q.technique) where.push(`v."technique" = ${p(q.technique)}`);
    if (q.listed !== undefined) where.push(`v."listed" = ${p(q.listed)}`);
    // A search matches the lots whose words match, whose code starts with what was typed, or
    // whose storage place (the viewer's own words only) matches. Across many lots each of the
    // three is a condition an index answers (the words' GIN index, the code's prefix index, the
    // lot ids of the viewer's matching storage places), and PostgreSQL joins their bitmaps and
    // reads only the rows that match. A few hundred lots of one's own are cheaper filtered row by
    // row; written the same way PostgreSQL would still gather every lot a word's prefix matches
    // (it misjudges how many), so there the storage place is asked per lot, which keeps it on
    // the holder's index.
    const from = '"lot_views" v';
    const text = q.q?.trim() ?? '';
    const tsq = searchQueryText(text);
    const prefix = codePrefix(text);
    if (tsq || prefix) {
      const rowByRow = q.mine === true && (await this.holdsAtMost(viewer.id, LotsService.rowByRowLots));
      const any: string[] = [];
      if (tsq) {
        const t = p(tsq);
        const me = p(viewer.id);
        any.push(`v."search" @@ to_tsquery('beadroll_text', ${t})`);
        any.push(
          rowByRow
            ? `EXISTS (SELECT 1 FROM "lot_private_search" s WHERE s."lot_id" = v."lot_id"
                 AND s."account_id" = ${me} AND s."search" @@ to_tsquery('beadroll_text', ${t}))`
            : `v."lot_id" = ANY(ARRAY(SELECT s."lot_id" FROM "lot_private_search" s
                 WHERE s."account_id" = ${me} AND s."search" @@ to_tsquery('beadroll_text', ${t})))`,
        );
      }
      if (prefix) any.push(`v."code" LIKE ${p(`${prefix}%`)}`);
      where.push(`(${any.join(' OR ')})`);
    } else if (text) {
      where.push('false');
    }
    const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
    const dir = q.order === 'asc' ? 'ASC' : 'DESC';
    const order = `${SORT_COLUMNS[q.sort ?? 'registered']} ${dir} NULLS LAST, v."code" ASC`;
    const [{ total }] = (await this.dataSource.query(
      `SELECT count(*)::int AS "total" FROM ${from} ${clause}`,
      params,
    )) as Array<{ total: number }>;
    const rows: LotViewRow[] = await this.dataSource.query(
      `SELECT v.* FROM ${from} ${clause} ORDER BY ${order} LIMIT ${p(pageSize)} OFFSET ${p((page - 1) * pageSize)}`,
      params,
    );
    const items = rows.map(toSummary);
    return { items, total, page, pageSize };
  }

  /** Whether the account holds at most `n` lots (reads at most n + 1 entries of the holder's index). */
  private async holdsAtMost(accountId: string, n: number): Promise<boolean> {
    const [{ held }] = (await this.dataSource.query(
      `SELECT count(*)::int AS "held" FROM (SELECT 1 FROM "lot_views" WHERE "holder" = $1 LIMIT $2) h`,
      [accountId, n + 1],
    )) as Array<{ held: number }>;
    return held <= n;
  }

  /** The inventory as a CSV or XLSX file: the list's filters, search and sort, every page. */
  async exportList(viewer: Viewer, q: ExportLotsQueryDto): Promise<ExportFile> {
    const { format = 'csv', ...filters } = q;
    const rows: LotSummaryResponse[] = [];
    for (let page = 1; rows.length < MAX_EXPORT_LOTS; page++) {
      const r = await this.list(viewer, { ...filters, page, pageSize: 100 });
      rows.push(...r.items);
      if (rows.length >= r.total || r.items.length === 0) break;
    }
    const day = new Date().toISOString().slice(0, 10);
    return exportFile(format, `beadroll-lots-${day}`, [
      {
        name: 'Lots',
        columns: INVENTORY_COLUMNS,
        rows: rows.map((r) => ({
          code: r.displayCode,
          title: r.title,
          form: r.form,
          count: r.count.value,
          estimated: r.count.estimated ? 'yes' : 'no',
          origin: r.origin,
          status: r.status,
          listed: r.listed ? 'yes' : 'no',
          updatedAt: r.updatedAt,
        })),
      },
    ]);
  }

  async detail(viewer: Viewer, text: string): Promise<LotDetailResponse> {
    const access = await this.readAccess(viewer, text);
    if (access.upTo !== null) return this.detailUpTo(viewer, access);
    const code = access.code;
    const cached = (await this.reader.cachedState(code))!;
    const view = (await this.view(code))!;
    const s = cached.state;
    const sealed = await this.ownSealed(view.lot_id, viewer.id);
    return {
      ...toSummary(view),
      description: s.description,
      observations: view.observations,
      remaining: s.remaining,
      attribution: s.attribution?.body
        ? { seq: s.attribution.seq, author: s.attribution.author, origin: s.attribution.body.origin }
        : null,
      openOffer: s.openOffer
        ? { seq: s.openOffer.seq, offerer: s.openOffer.offerer, recipient: s.openOffer.recipient }
        : null,
      headHash: cached.headHash,
      viewerIsHolder: s.holder === viewer.id,
      sealed,
    };
  }

  /** The whole roll as stored, with the viewer's own sealed values on the entries that carry them. */
  async roll(viewer: Viewer, text: string): Promise<RollResponse> {
    const { code, lotId, upTo } = await this.readAccess(viewer, text);
    const entries = await this.reader.entries(lotId, upTo === null ? {} : { limit: upTo + 1 });
    const mine = (await this.reader.sealedFor(lotId, viewer.id)).filter(
      (f) => upTo === null || f.seq <= upTo,
    );
    const commitments = await this.reader.commitments(lotId, [...new Set(mine.map((f) => f.seq))]);
    return {
      lot: code,
      entries: entries.map((e) => {
        const fields = mine.filter((f) => f.seq === e.seq);
        return {
          seq: e.seq,
          kind: e.kind,
          actor: e.actor,
          time: e.time,
          hash: e.hash,
          header: e.header,
          body: e.body,
          logIndex: e.logIndex,
          ...(fields.length
            ? {
                sealed: fields.map((f) => ({
                  name: f.name,
                  salt: f.salt,
                  value: f.value,
                  commitments: commitments.get(e.seq) ?? {},
                })),
              }
            : {}),
        };
      }),
    };
  }

  /** Verifies the stored roll with core's verifier. */
  async verify(viewer: Viewer, text: string): Promise<VerifyResponse> {
    const { code, lotId, upTo } = await this.readAccess(viewer, text);
    const r = verifyRoll(await this.reader.entries(lotId, upTo === null ? {} : { limit: upTo + 1 }), {
      lot: code,
    });
    if (r.ok) return { lot: code, ok: true, entries: r.entries, headSeq: r.head.seq, headHash: r.head.hash };
    return {
      lot: code,
      ok: false,
      entries: r.verified.length,
      failure: { seq: r.seq, reason: r.reason, message: r.message },
    };
  }

  /** The export bundle: this roll in full, ancestors in full when the viewer may read them. */
  async bundle(viewer: Viewer, text: string): Promise<Bundle> {
    const { code, upTo } = await this.readAccess(viewer, text);
    const readable = new Map<string, boolean>();
    const rows: Array<{ code: string; ok: boolean }> = await this.dataSource.query(
      `SELECT v."code", (v."listed" OR v."holder" = $1 OR $2) AS "ok" FROM "lot_views" v`,
      [viewer.id, viewer.role === 'registrar'],
    );
    for (const r of rows) readable.set(r.code, r.ok);
    const bundle = (await this.bundles.bundleFor(code, (lot) => readable.get(lot) === true))!;
    // A prefix of a roll verifies on its own: a former holder exports what they may read.
    if (upTo !== null) bundle.rolls[0]!.entries = bundle.rolls[0]!.entries.slice(0, upTo + 1);
    return bundle;
  }

  /** The canonical code of a lot the viewer may read; anything else is the same 404. */
  async readableCode(viewer: Viewer, text: string): Promise<string> {
    const code = RollReaderService.canonicalCode(text);
    const view = code ? await this.view(code) : null;
    if (!view || !(await this.mayReadInFull(viewer, view))) throw new AppError('not_found', 'Not found.');
    return view.code;
  }

  /**
   * The viewer's access to a lot: in full (`upTo` null), up to a seq through a grant (a former
   * holder, up to the handover), or the same 404. Every read of a lot's roll, opinions, exhibits
   * and ancestry goes through it.
   */
  async readAccess(viewer: Viewer, text: string): Promise<ReadAccess> {
    const code = RollReaderService.canonicalCode(text);
    const view = code ? await this.view(code) : null;
    if (view && (await this.mayReadInFull(viewer, view)))
      return { code: view.code, lotId: view.lot_id, upTo: null };
    if (view) {
      for (const g of this.grants) {
        const upTo = await g.upTo(viewer, view.lot_id);
        if (upTo !== null) return { code: view.code, lotId: view.lot_id, upTo };
      }
    }
    throw new AppError('not_found', 'Not found.');
  }

  /** A lot as it stood at seq `upTo`, derived from that prefix of its roll alone. */
  private async detailUpTo(viewer: Viewer, access: ReadAccess): Promise<LotDetailResponse> {
    const entries = await this.reader.entries(access.lotId, { limit: access.upTo! + 1 });
    const r = verifyRoll(entries, { lot: access.code });
    if (!r.ok) throw new AppError('internal', `the roll of ${access.code} does not verify at seq ${r.seq}`);
    const s = r.state;
    const recorded = s.attribution?.body ?? null;
    const view = (await this.view(access.code))!;
    const observed = entries.filter((e) => e.kind === 'observed' && e.body !== null).pop();
    const head = entries[entries.length - 1]!;
    const sealed = await this.ownSealed(access.lotId, viewer.id, access.upTo!);
    return {
      code: s.lot,
      displayCode: formatLotCode(s.lot),
      title: s.description?.title ?? '',
      form: s.description?.form ?? null,
      status: s.status,
      listed: s.listed,
      holder: s.holder,
      origin: recorded?.origin ?? null,
      originSource: recorded ? 'holder' : null,
      technique: recorded?.technique ?? null,
      period: recorded ? { from: recorded.period.from, to: recorded.period.to } : null,
      count: s.remaining,
      dissents: s.dissents.length,
      headSeq: s.head.seq,
      registeredAt: new Date(view.registered_at).toISOString(),
      updatedAt: new Date(head.time).toISOString(),
      description: s.description,
      observations: observed ? (JSON.parse(observed.body!) as ObservedBody).observations : null,
      remaining: s.remaining,
      attribution: s.attribution?.body
        ? { seq: s.attribution.seq, author: s.attribution.author, origin: s.attribution.body.origin }
        : null,
      openOffer: null,
      headHash: s.head.hash,
      viewerIsHolder: false,
      sealed,
      historyUpTo: access.upTo!,
    };
  }

  private async mayReadInFull(viewer: Viewer, view: LotViewRow): Promise<boolean> {
    if (this.canRead(viewer, view)) return true;
    for (const g of this.fullGrants) if (await g.mayRead(viewer, view.lot_id)) return true;
    return false;
  }

  private canRead(viewer: Viewer, v: Pick<LotViewRow, 'listed' | 'holder' | 'offer_recipient'>): boolean {
    return (
      v.listed || v.holder === viewer.id || v.offer_recipient === viewer.id || viewer.role === 'registrar'
    );
  }

  private async view(code: string): Promise<LotViewRow | null> {
    const rows: LotViewRow[] = await this.dataSource.query('SELECT * FROM "lot_views" WHERE "code" = $1', [
      code,
    ]);
    return rows[0] ?? null;
  }

  private async ownSealed(lotId: string, viewer: string, upTo = Infinity): Promise<OwnSealedDetails> {
    const out: OwnSealedDetails = {};
    for (const f of await this.reader.sealedFor(lotId, viewer)) {
      if (f.seq > upTo) continue;
      // Ordered by seq, so the newest value of each field wins.
      if (f.name === 'storage-location') out.storageLocation = f.value as string;
      if (f.name === 'acquisition-date') out.acquisitionDate = f.value as string;
      if (f.name === 'acquisition-source') out.acquisitionSource = f.value as string;
      if (f.name === 'acquisition-cost') out.acquisitionCost = f.value as Money;
      if (f.name === 'private-note') out.privateNote = f.value as string;
    }
    return out;
  }
}
