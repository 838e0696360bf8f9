import type { PartyName } from '../accounts/dto/dealer-card.dto';
import { Injectable, type OnModuleInit } from '@nestjs/common';
import { formatLotCode } from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { LotsService, type Viewer } from '../lots/lots.service';
import type {
  AssessorListResponse,
  CreateOpinionRequestDto,
  ListOpinionRequestsQueryDto,
  OpinionRequestListResponse,
  OpinionRequestResponse,
} from './dto/opinion-request.dto';
import { LotViewsService } from '../lots/lot-views.service';

/** SQL: the lot of request `r` is still held by its requester. */
const HELD_BY_REQUESTER = LotViewsService.heldBySql('r."lot_id"', 'r."requester"');

interface RequestRow {
  id: string;
  code: string;
  title: string;
  listed: boolean;
  requester: string;
  assessor: string | null;
  answered_by: string | null;
  note: string | null;
  status: 'open' | 'answered' | 'cancelled';
  created_at: Date;
  closed_at: Date | null;
  opinion_seq: number | null;
}

/**
 * Requests for an opinion on a lot. An open request lets its assessor (or, when none is named,
 * every verified assessor) read the lot and record an opinion on it, while the requester still
 * holds it; the first opinion recorded by such an assessor answers it, in the same transaction.
 */
@Injectable()
export class OpinionRequestsService implements OnModuleInit {
  constructor(
    private readonly views: LotViewsService,
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
  ) {}

  onModuleInit(): void {
    this.lots.addFullReadGrant({ mayRead: (viewer, lotId) => this.isAsked(viewer, lotId) });
  }

  /** True when an open request of the lot's current holder asks this verified assessor. */
  async isAsked(viewer: Viewer, lotId: string, m: EntityManager = this.dataSource.manager): Promise<boolean> {
    if (viewer.role !== 'assessor') return false;
    const rows: unknown[] = await m.query(
      `SELECT 1 FROM "opinion_requests" r
         JOIN "accounts" a ON a."id"::text = $2 AND a."role" = 'assessor' AND a."status" = 'verified'
        WHERE r."lot_id" = $1 AND r."status" = 'open' AND (r."assessor" IS NULL OR r."assessor" = $2)
          AND ${HELD_BY_REQUESTER}
        LIMIT 1`,
      [lotId, viewer.id],
    );
    return rows.length > 0;
  }

  /** Closes the open requests this opinion answers (inside the opinion's own transaction). */
  async answer(m: EntityManager, lotId: string, assessor: string, seq: number): Promise<void> {
    await m.query(
      `UPDATE "opinion_requests" SET "status" = 'answered', "closed_at" = now(), "answered_by" = $2,
              "opinion_seq" = $3
        WHERE "lot_id" = $1 AND "status" = 'open' AND ("assessor" IS NULL OR "assessor" = $2)`,
      [lotId, assessor, seq],
    );
  }

  async create(me: Principal, dto: CreateOpinionRequestDto): Promise<OpinionRequestResponse> {
    const code = RollReaderService.canonicalCode(dto.lot);
    if (!code)
      throw AppError.validation([{ field: 'lot', reason: 'lot must be a lot code such as 7K2Q-M9XA-T' }]);
    await this.lots.readableCode(me, code);
    if (dto.assessor) {
      const found: unknown[] = await this.dataSource.query(
        `SELECT 1 FROM "accounts" WHERE "id"::text = $1 AND "role" = 'assessor' AND "status" = 'verified'`,
        [dto.assessor],
      );
      if (!found.length)
        throw AppError.validation([
          { field: 'assessor', reason: 'assessor must be a verified assessor chosen from the list' },
        ]);
    }
    const id = await this.ledger.withLots([code], async (tx) => {
      const state = tx.state(code);
      if (state.holder !== me.id)
        throw new AppError('forbidden', 'Only the dealer who holds this lot can ask for an opinion on it.');
      if (state.status !== 'held' && state.status !== 'offered')
        throw new AppError('roll_rule', `This lot is ${state.status}: it can no longer be asked about.`);
      const lot = (await tx.manager.query('SELECT "id" FROM "lots" WHERE "code" = $1', [code])) as Array<{
        id: string;
      }>;
      const rows = (await tx.manager.query(
        `INSERT INTO "opinion_requests" ("lot_id", "code", "requester", "assessor", "note", "status")
         VALUES ($1, $2, $3, $4, $5, 'open') ON CONFLICT DO NOTHING RETURNING "id"`,
        [lot[0]!.id, code, me.id, dto.assessor ?? null, dto.note ?? null],
      )) as Array<{ id: string }>;
      if (!rows.length)
        throw new AppError(
          'conflict',
          dto.assessor
            ? 'You already asked this assessor about this lot; the request is still open.'
            : 'You already asked any verified assessor about this lot; the request is still open.',
        );
      return rows[0]!.id;
    });
    return (await this.rows('r."id" = $1', [id]))[0]!;
  }

  async list(me: Viewer, q: ListOpinionRequestsQueryDto): Promise<OpinionRequestListResponse> {
    const page = q.page ?? 1;
    const pageSize = q.pageSize ?? 20;
    let where: string;
    if (q.box === 'sent') {
      where = 'r."requester" = $1';
    } else {
      if (me.role !== 'assessor') throw new AppError('forbidden', 'Only assessors receive opinion requests.');
      // Open requests to this assessor or to any, while the requester still holds the lot; and
      // the ones this assessor answered.
      where = `((r."status" = 'open' AND (r."assessor" IS NULL OR r."assessor" = $1)
                 AND ${HELD_BY_REQUESTER})
               OR r."answered_by" = $1 OR (r."assessor" = $1 AND r."status" = 'cancelled'))`;
    }
    const [{ total }] = (await this.dataSource.query(
      `SELECT count(*)::int AS "total" FROM "opinion_requests" r WHERE ${where}`,
      [me.id],
    )) as Array<{ total: number }>;
    const items = await this.rows(
      `${where} ORDER BY (r."status" = 'open') DESC, r."created_at" DESC LIMIT $2 OFFSET $3`,
      [me.id, pageSize, (page - 1) * pageSize],
    );
    return { items, total, page, pageSize };
  }

  async cancel(me: Principal, id: string): Promise<OpinionRequestResponse> {
    const rows = (await this.dataSource.query(
      `UPDATE "opinion_requests" SET "status" = 'cancelled', "closed_at" = now()
        WHERE "id"::text = $1 AND "requester" = $2 AND "status" = 'open' RETURNING "id"`,
      [id, me.id],
    )) as [Array<{ id: string }>, number];
    if (!rows[0].length) {
      const mine = await this.rows('r."id"::text = $1 AND r."requester" = $2', [id, me.id]);
      if (!mine.length) throw new AppError('not_found', 'Not found.');
      throw new AppError('conflict', `This request was already ${mine[0]!.status}.`);
    }
    return (await this.rows('r."id"::text = $1', [id]))[0]!;
  }

  /** Verified assessors, by name, handle or business (all of them, up to 50, when q is empty). */
  async assessors(q: string | undefined): Promise<AssessorListResponse> {
    const text = q?.trim() ?? '';
    const rows: Array<{ id: string; handle: string; display_name: string; business: string }> =
      await this.dataSource.query(
        `SELECT "id", "handle", "display_name", "business" FROM "accounts"
          WHERE "role" = 'assessor' AND "status" = 'verified'
            AND ($1 = '' OR "display_name" ILIKE $2 OR "handle" ILIKE $2 OR "business" ILIKE $2)
          ORDER BY "display_name" LIMIT 50`,
        [text, `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`],
      );
    return {
      items: rows.map((r) => ({
        id: r.id,
        handle: r.handle,
        displayName: r.display_name,
        business: r.business,
      })),
    };
  }

  private async rows(where: string, params: unknown[]): Promise<OpinionRequestResponse[]> {
    const found: Array<Omit<RequestRow, 'title' | 'listed'> & { lot_id: string }> =
      await this.dataSource.query(
        `SELECT r."id", r."lot_id", r."code", r."requester", r."assessor", r."answered_by", r."note",
              r."status", r."created_at", r."closed_at", r."opinion_seq"
         FROM "opinion_requests" r
        WHERE ${where}`,
        params,
      );
    const views = await this.views.findMany({ lotIds: [...new Set(found.map((r) => r.lot_id))] });
    const rows: RequestRow[] = found.flatMap((r) => {
      const v = views.find((x) => x.lotId === r.lot_id);
      return v ? [{ ...r, title: v.title, listed: v.listed }] : [];
    });
    const ids = [...new Set(rows.flatMap((r) => [r.requester, r.assessor, r.answered_by]).filter(Boolean))];
    const parties = new Map<string, PartyName>();
    if (ids.length) {
      const people: Array<{ id: string; handle: string; display_name: string; business: string }> =
        await this.dataSource.query(
          `SELECT "id", "handle", "display_name", "business" FROM "accounts" WHERE "id"::text = ANY($1)`,
          [ids],
        );
      for (const p of people)
        parties.set(p.id, { id: p.id, handle: p.handle, displayName: p.display_name, business: p.business });
    }
    const party = (id: string | null) => (id ? (parties.get(id) ?? null) : null);
    return rows.map((r) => ({
      id: r.id,
      lot: { code: r.code, displayCode: formatLotCode(r.code), title: r.title, listed: r.listed },
      requester: party(r.requester)!,
      assessor: party(r.assessor),
      note: r.note,
      status: r.status,
      createdAt: new Date(r.created_at).toISOString(),
      closedAt: r.closed_at ? new Date(r.closed_at).toISOString() : null,
      opinionSeq: r.opinion_seq,
      answeredBy: party(r.answered_by),
    }));
  }
}
