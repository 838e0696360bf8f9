import { Inject, Injectable } from '@nestjs/common';
import { formatLotCode, type Money } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { AccountsService } from '../accounts/accounts.service';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerClock } from '../ledger/ledger.clock';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { requireMayAppend } from '../ledger/roll-rule.error';
import { LotsService, type Viewer } from '../lots/lots.service';
import { MailService } from '../mail/mail.service';
import type { ListSalesQueryDto, RecordSaleDto, VoidSaleDto } from './dto/transfer-requests.dto';
import type { SaleListResponse, SaleResponse } from './dto/transfer-responses.dto';
import { transferLetters } from './transfer-letters';
import { LotViewsService } from '../lots/lot-views.service';

const FIELD_NAMES = {
  'body.date': 'date',
  'sealed.sale-price': 'price',
  'sealed.buyer-note': 'buyerNote',
};

interface SaleRow {
  id: string;
  lot_id: string;
  code: string;
  title: string;
  seq: number;
  sold_on: string;
  recorded_at: Date;
  receipt_sent_at: Date | null;
  listed: boolean;
  price: Money | undefined;
  buyer_note: string | undefined;
}

/** Sales to private buyers: the `sold` entry with its sealed price, and the seller's list. */
@Injectable()
export class SalesService {
  constructor(
    private readonly reader: RollReaderService,
    private readonly views: LotViewsService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
    private readonly clock: LedgerClock,
    private readonly mail: MailService,
    private readonly accounts: AccountsService,
  ) {}

  /** Writes `sold` (date; sealed price and buyer note) and, if asked, e-mails the buyer a receipt. */
  async record(me: Principal, dto: RecordSaleDto): Promise<SaleResponse> {
    const code = RollReaderService.canonicalCode(dto.lot);
    if (!code)
      throw AppError.validation([{ field: 'lot', reason: 'lot must be a lot code such as 7K2Q-M9XA-T' }]);
    // A day ahead of UTC is still today somewhere; later than that is a typing slip.
    const latest = new Date(this.clock.now().getTime() + 86_400_000).toISOString().slice(0, 10);
    if (dto.date > latest)
      throw AppError.validation([{ field: 'date', reason: 'date cannot be in the future' }]);
    await this.lots.readableCode(me, code);
    const sealed: { 'sale-price': Money; 'buyer-note'?: string } = {
      'sale-price': { amount: dto.price.amount, currency: dto.price.currency },
    };
    if (dto.buyerNote !== undefined) sealed['buyer-note'] = dto.buyerNote;
    const listed = await this.ledger.withLots([code], async (tx) => {
      const state = tx.state(code);
      requireMayAppend(state, 'sold', me.id);
      if (dto.buyerEmail !== undefined && !state.listed) {
        throw AppError.validation([
          {
            field: 'buyerEmail',
            reason:
              'this lot is not listed, so it has no public page to send; list it first or leave the address empty',
          },
        ]);
      }
      await tx.append(
        code,
        { kind: 'sold', actor: me.id, body: { date: dto.date }, sealed },
        { fields: FIELD_NAMES },
      );
      return state.listed;
    });
    if (dto.buyerEmail !== undefined && listed) {
      const seller = (await this.accounts.find(me.id))!;
      const [{ title }] = (await this.dataSource.query('SELECT "title" FROM "sales" WHERE "code" = $1', [
        code,
      ])) as Array<{ title: string }>;
      const sent = await this.mail.send(
        dto.buyerEmail,
        transferLetters.receipt(
          seller.displayName,
          seller.business,
          { code, title },
          dto.date,
          `${this.config.publicBaseUrl}/l/${code}`,
        ),
      );
      if (sent)
        await this.dataSource.query('UPDATE "sales" SET "receipt_sent_at" = now() WHERE "code" = $1', [code]);
    }
    const rows = await this.rows(' AND s."code" = $2', [me.id, code]);
    return toSale(rows[0]!);
  }

  /**
   * Voids the lot's sale (`sale-voided`): only its seller, only within 24 hours of recording it
   * (core's rule, checked against the entry's time); the lot is held again.
   */
  async voidSale(me: Principal, lot: string, dto: VoidSaleDto): Promise<void> {
    const code = RollReaderService.canonicalCode(lot);
    if (!code) throw new AppError('not_found', 'Not found.');
    await this.lots.readableCode(me, code);
    await this.ledger.withLots([code], async (tx) => {
      const state = tx.state(code);
      requireMayAppend(state, 'sale-voided', me.id);
      const body = { saleSeq: state.soldSeq!, ...(dto.reason !== undefined ? { reason: dto.reason } : {}) };
      await tx.append(
        code,
        { kind: 'sale-voided', actor: me.id, body },
        { fields: { 'body.reason': 'reason' } },
      );
    });
  }

  async list(me: Viewer, q: ListSalesQueryDto): Promise<SaleListResponse> {
    const page = q.page ?? 1;
    const pageSize = q.pageSize ?? 20;
    const cond: string[] = [];
    const params: unknown[] = [me.id];
    const p = (v: unknown) => {
      params.push(v);
      return `$${params.length}`;
    };
    if (q.from) cond.push(`s."sold_on" >= ${p(q.from)}::date`);
    if (q.to) cond.push(`s."sold_on" <= ${p(q.to)}::date`);
    if (q.receipt === 'sent') cond.push(`s."receipt_sent_at" IS NOT NULL`);
    if (q.receipt === 'none') cond.push(`s."receipt_sent_at" IS NULL`);
    const where = cond.map((c) => ` AND ${c}`).join('');
    const [{ total }] = (await this.dataSource.query(
      `SELECT count(*)::int AS "total" FROM "sales" s WHERE s."seller" = $1${where}`,
      params,
    )) as Array<{ total: number }>;
    const tail = `${where} ORDER BY s."sold_on" DESC, s."recorded_at" DESC LIMIT ${p(pageSize)} OFFSET ${p((page - 1) * pageSize)}`;
    const rows = await this.rows(tail, params);
    return { items: rows.map(toSale), total, page, pageSize };
  }

  /** Sales of the seller `params[0]`, with their sealed price and note; `tail` follows the WHERE clause. */
  private async rows(tail: string, params: unknown[]): Promise<SaleRow[]> {
    const sales: Array<Omit<SaleRow, 'listed' | 'price' | 'buyer_note'>> = await this.dataSource.query(
      `SELECT s."id", s."lot_id", s."code", s."title", s."seq", to_char(s."sold_on", 'YYYY-MM-DD') AS "sold_on",
         s."recorded_at", s."receipt_sent_at"
       FROM "sales" s WHERE s."seller" = $1${tail}`,
      params,
    );
    const seller = params[0] as string;
    const views = await this.views.findMany({ lotIds: sales.map((r) => r.lot_id) });
    const sealed = await this.reader.sealedAt(
      sales.map((r) => ({ lotId: r.lot_id, seq: r.seq })),
      seller,
      ['sale-price', 'buyer-note'],
    );
    const value = (r: { lot_id: string; seq: number }, name: string) =>
      sealed.find((f) => f.lotId === r.lot_id && f.seq === r.seq && f.name === name)?.value;
    return sales.map((r) => ({
      ...r,
      listed: views.find((v) => v.lotId === r.lot_id)?.listed ?? false,
      price: value(r, 'sale-price') as Money | undefined,
      buyer_note: value(r, 'buyer-note') as string | undefined,
    }));
  }
}

function toSale(r: SaleRow): SaleResponse {
  return {
    id: r.id,
    lot: { code: r.code, displayCode: formatLotCode(r.code), title: r.title },
    seq: r.seq,
    date: r.sold_on,
    ...(r.price ? { price: r.price } : {}),
    ...(r.buyer_note ? { buyerNote: r.buyer_note } : {}),
    recordedAt: new Date(r.recorded_at).toISOString(),
    receiptSent: r.receipt_sent_at !== null,
    listed: r.listed,
  };
}
