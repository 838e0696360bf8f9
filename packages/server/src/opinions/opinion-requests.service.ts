import { Inject, Injectable, type OnModuleInit } from '@nestjs/common';
import { formatLotCode, type OpinionBody } from '@beadroll/core';
import { AccountsService } from '../accounts/accounts.service';
import type { PartyName } from '../accounts/dto/dealer-card.dto';
import { DataSource, type EntityManager } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { APP_CONFIG } from '../config/config.module';
import type { AppConfig } from '../config/app-config';
import { LedgerService } from '../ledger/ledger.service';
import type { AppendedEntry, RollProjector } from '../ledger/ledger.types';
import { MailService } from '../mail/mail.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { LotsService, type Viewer } from '../lots/lots.service';
import { opinionLetters } from './opinion-letters';
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
  request_seq: number | null;
}

/**
 * Requests for an opinion on a lot. Asking writes `opinion-requested` on the roll in the same
 * transaction as the request row, cancelling writes `opinion-request-closed`; the roll decides
 * when a request is open (core's rules), and every append brings the rows in step with it. An
 * open request lets its assessor (or, when none is named, every verified assessor) read the lot
 * and record evidence and an opinion on it, listed or not, while the requester still holds it;
 * the opinion names the request and answers it. Requests made before they went on the roll
 * (no `request_seq`) keep their old rule: answered by the assessor's next opinion.
 */
@Injectable()
export class OpinionRequestsService implements OnModuleInit, RollProjector {
  constructor(
    private readonly views: LotViewsService,
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
    private readonly accounts: AccountsService,
    private readonly reader: RollReaderService,
    private readonly mail: MailService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  onModuleInit(): void {
    this.lots.addFullReadGrant({ mayRead: (viewer, lotId) => this.isAsked(viewer, lotId) });
    // An assessor who answered still reads the lot as it stood at their answer, and no further.
    this.lots.addReadGrant({ upTo: (viewer, lotId) => this.answeredAt(viewer, lotId) });
    this.ledger.addProjector(this);
  }

  /** The seq of this assessor's newest opinion that answered a request on the lot, or null. */
  async answeredAt(viewer: Viewer, lotId: string): Promise<number | null> {
    if (viewer.role !== 'assessor') return null;
    const [row] = (await this.dataSource.query(
      `SELECT max("opinion_seq") AS "seq" FROM "opinion_requests"
        WHERE "lot_id" = $1 AND "answered_by" = $2 AND "status" = 'answered'`,
      [lotId, viewer.id],
    )) as Array<{ seq: number | null }>;
    return row?.seq ?? null;
  }

  /**
   * Keeps the rows in step with the roll, inside every append: an opinion naming a request
   * answers it; a request the roll no longer holds open (withdrawn, the lot changed hands, sold,
   * split, combined or retired) is closed as cancelled.
   */
  async project(m: EntityManager, lotId: string, entry: AppendedEntry): Promise<void> {
    if (entry.kind === 'opinion') {
      const { request } = JSON.parse(entry.body) as OpinionBody;
      if (request !== undefined)
        await m.query(
          `UPDATE "opinion_requests" SET "status" = 'answered', "closed_at" = now(), "answered_by" = $3,
                  "opinion_seq" = $4
            WHERE "lot_id" = $1 AND "request_seq" = $2 AND "status" = 'open'`,
          [lotId, request, entry.actor, entry.seq],
        );
    }
    const open = (entry.state.openRequests ?? []).map((q) => q.seq);
    await m.query(
      `UPDATE "opinion_requests" SET "status" = 'cancelled', "closed_at" = now()
        WHERE "lot_id" = $1 AND "status" = 'open' AND "request_seq" IS NOT NULL
          AND NOT ("request_seq" = ANY($2::int[]))`,
      [lotId, open],
    );
  }

  /** True when an open request of the lot's current holder asks this verified assessor. */
  async isAsked(viewer: Viewer, lotId: string, m: EntityManager = this.dataSource.manager): Promise<boolean> {
    if (viewer.role !== 'assessor' || !(await this.accounts.isVerifiedAssessor(viewer.id, m))) return false;
    const rows: unknown[] = await m.query(
      `SELECT 1 FROM "opinion_requests" r
        WHERE r."lot_id" = $1 AND r."status" = 'open' AND (r."assessor" IS NULL OR r."assessor" = $2)
          AND ${HELD_BY_REQUESTER}
        LIMIT 1`,
      [lotId, viewer.id],
    );
    return rows.length > 0;
  }

  /**
   * Closes the open requests made before requests went on the roll that this opinion answers
   * (inside the opinion's own transaction); requests on the roll close through {@link project}.
   */
  async answer(m: EntityManager, lotId: string, assessor: string, seq: number): Promise<void> {
    await m.query(
      `UPDATE "opinion_requests" SET "status" = 'answered', "closed_at" = now(), "answered_by" = $2,
              "opinion_seq" = $3
        WHERE "lot_id" = $1 AND "status" = 'open' AND "request_seq" IS NULL
          AND ("assessor" IS NULL OR "assessor" = $2)`,
      [lotId, assessor, seq],
    );
  }

  async create(me: Principal, dto: CreateOpinionRequestDto): Promise<OpinionRequestResponse> {
    const code = RollReaderService.canonicalCode(dto.lot);
    if (!code)
      throw AppError.validation([{ field: 'lot', reason: 'lot must be a lot code such as 7K2Q-M9XA-T' }]);
    await this.lots.readableCode(me, code);
    if (dto.assessor) {
      if (!(await this.accounts.isVerifiedAssessor(dto.assessor)))
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
      const lotId = (await this.reader.findLot(code, tx.manager))!.id;
      const open: unknown[] = await tx.manager.query(
        `SELECT 1 FROM "opinion_requests" WHERE "lot_id" = $1 AND "status" = 'open'
            AND coalesce("assessor", '') = $2`,
        [lotId, dto.assessor ?? ''],
      );
      // The request goes on the roll with the row, in this one transaction.
      const entry = open.length
        ? null
        : await tx.append(
            code,
            { kind: 'opinion-requested', actor: me.id, body: { assessor: dto.assessor ?? null } },
            { fields: { 'body.assessor': 'assessor' } },
          );
      const rows = (await tx.manager.query(
        `INSERT INTO "opinion_requests" ("lot_id", "code", "requester", "assessor", "note", "status", "request_seq")
         VALUES ($1, $2, $3, $4, $5, 'open', $6) ON CONFLICT DO NOTHING RETURNING "id"`,
        [lotId, code, me.id, dto.assessor ?? null, dto.note ?? null, entry?.seq ?? null],
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
    const made = (await this.rows('r."id" = $1', [id]))[0]!;
    if (made.assessor) await this.tellAssessor(made);
    return made;
  }

  /**
   * Tells the named assessor by e-mail, with a link to their queue. A request open to any
   * assessor mails nobody: there is no opt-in for such mail, and it waits in every queue.
   */
  private async tellAssessor(r: OpinionRequestResponse): Promise<void> {
    const to = await this.accounts.find(r.assessor!.id);
    if (!to) return;
    await this.mail.send(
      to.email,
      opinionLetters.opinionAsked(
        to.displayName,
        { code: r.lot.code, title: r.lot.title },
        r.requester.displayName + (r.requester.business ? ` (${r.requester.business})` : ''),
        r.note,
        `${this.config.publicBaseUrl}/`,
      ),
    );
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
    const mine = await this.rows('r."id"::text = $1 AND r."requester" = $2', [id, me.id]);
    if (!mine.length) throw new AppError('not_found', 'Not found.');
    const code = mine[0]!.lot.code;
    const closed = await this.ledger.withLots([code], async (tx) => {
      const [row] = (await tx.manager.query(
        `SELECT "request_seq" FROM "opinion_requests" WHERE "id"::text = $1 AND "status" = 'open' FOR UPDATE`,
        [id],
      )) as Array<{ request_seq: number | null }>;
      if (!row) return false;
      const seq = row.request_seq;
      // Withdrawn on the roll too, while the roll holds it open; the projector closes the row.
      if (seq !== null && (tx.state(code).openRequests ?? []).some((q) => q.seq === seq))
        await tx.append(code, { kind: 'opinion-request-closed', actor: me.id, body: { request: seq } });
      await tx.manager.query(
        `UPDATE "opinion_requests" SET "status" = 'cancelled', "closed_at" = now()
          WHERE "id"::text = $1 AND "status" = 'open'`,
        [id],
      );
      return true;
    });
    if (!closed)
      throw new AppError(
        'conflict',
        `This request was already ${(await this.rows('r."id"::text = $1', [id]))[0]!.status}.`,
      );
    return (await this.rows('r."id"::text = $1', [id]))[0]!;
  }

  /** Verified assessors, by name, handle or business (all of them, up to 50, when q is empty). */
  async assessors(q: string | undefined): Promise<AssessorListResponse> {
    const text = q?.trim() ?? '';
    const rows = await this.accounts.searchAssessors(text);
    return {
      items: rows.map((r) => ({
        id: r.id,
        handle: r.handle,
        displayName: r.displayName,
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
    const ids = [
      ...new Set(
        rows.flatMap((r) => [r.requester, r.assessor, r.answered_by]).filter((x): x is string => !!x),
      ),
    ];
    const parties = new Map<string, PartyName>();
    if (ids.length) {
      for (const p of await this.accounts.findMany(ids))
        parties.set(p.id, { id: p.id, handle: p.handle, displayName: p.displayName, business: p.business });
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
