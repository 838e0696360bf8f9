import { Injectable } from '@nestjs/common';
import { formatLotCode, type Money, type SealedFieldName } from '@beadroll/core';
import type { Viewer } from '../lots/lots.service';
import { RollReaderService, type ViewerSealedField } from '../ledger/roll-reader.service';
import { exportFile, type ExportColumn, type ExportFile, type ExportFormat } from '../export/sheet-export';
import type {
  CurrencyFigures,
  SalesPeriod,
  StockGroup,
  StockSummaryResponse,
} from './dto/stock-responses.dto';
import { LotViewsService } from '../lots/lot-views.service';
import { DealsReader } from '../transfers/deals.reader';

/** A lot the dealer holds, with what the inventory shows of its attribution on record. */
interface HeldRow {
  lot_id: string;
  code: string;
  title: string;
  form: string | null;
  status: string;
  listed: boolean;
  origin: string | null;
  technique: string | null;
  period_from: number | null;
  period_to: number | null;
  count_value: number;
  count_estimated: boolean;
}

const SEALED: readonly SealedFieldName[] = [
  'acquisition-cost',
  'acquisition-date',
  'acquisition-source',
  'storage-location',
  'sale-price',
  'transfer-price',
];

const STOCK_COLUMNS: readonly ExportColumn[] = [
  { header: 'code', key: 'code', width: 14 },
  { header: 'title', key: 'title', width: 40 },
  { header: 'form', key: 'form', width: 10 },
  { header: 'count', key: 'count', width: 8 },
  { header: 'count estimated', key: 'estimated', width: 10 },
  { header: 'status', key: 'status', width: 10 },
  { header: 'listed', key: 'listed', width: 8 },
  { header: 'origin on record', key: 'origin', width: 16 },
  { header: 'period on record from', key: 'from', width: 10 },
  { header: 'period on record to', key: 'to', width: 10 },
  { header: 'technique on record', key: 'technique', width: 16 },
  { header: 'storage place', key: 'storage', width: 24 },
  { header: 'acquisition date', key: 'date', width: 12 },
  { header: 'acquisition source', key: 'source', width: 24 },
  { header: 'cost', key: 'cost', width: 12, numFmt: '#,##0.00' },
  { header: 'currency', key: 'currency', width: 9 },
];

/** ISO 4217 minor digits of a currency, as the runtime's locale data knows them (2 when unknown). */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions()
      .maximumFractionDigits!;
  } catch {
    return 2;
  }
}

/** Integer minor units as a decimal text in major units ("3200" EUR → "32.00"). */
export function majorUnits(amount: number, currency: string): string {
  const digits = minorDigits(currency);
  if (digits === 0) return String(amount);
  const sign = amount < 0 ? '-' : '';
  const s = String(Math.abs(amount)).padStart(digits + 1, '0');
  return `${sign}${s.slice(0, -digits)}.${s.slice(-digits)}`;
}

/** The newest value of a field at or before `upTo`, among the viewer's own sealed fields. */
function newest<T>(
  fields: readonly ViewerSealedField[],
  name: SealedFieldName,
  upTo = Infinity,
): T | undefined {
  let out: T | undefined;
  for (const f of fields) if (f.name === name && f.seq <= upTo) out = f.value as T;
  return out;
}

function isMoney(v: unknown): v is Money {
  return (
    typeof v === 'object' &&
    v !== null &&
    Number.isInteger((v as Money).amount) &&
    typeof (v as Money).currency === 'string'
  );
}

/** The century an attribution's period starts in, as its first year ("1800"), or "none". */
function centuryKey(from: number | null): string {
  return from === null ? 'none' : String(Math.floor(from / 100) * 100);
}

/**
 * A dealer's stock and sales figures, computed from their own sealed values only (read
 * through the ledger's reader, which answers nobody else's), per currency: what the stock held
 * cost, grouped by origin and by century, and sales, cost and margin by month and by year.
 */
@Injectable()
export class StockService {
  constructor(
    private readonly views: LotViewsService,
    private readonly deals: DealsReader,
    private readonly reader: RollReaderService,
  ) {}

  async summary(me: Viewer): Promise<StockSummaryResponse> {
    const held = await this.held(me);
    const sales = await this.deals.salesBy(me.id);
    const bought = await this.deals.boughtAt(me.id);
    const ids = [...new Set([...held.map((h) => h.lot_id), ...sales.map((s) => s.lot_id)])];
    const sealed = await this.reader.sealedForLots(ids, me.id, SEALED);
    const by = new Map<string, CurrencyFigures>();
    const fig = (currency: string): CurrencyFigures => {
      let f = by.get(currency);
      if (!f) {
        f = {
          currency,
          minorDigits: minorDigits(currency),
          stock: { lots: 0, cost: 0 },
          stockByOrigin: [],
          stockByCentury: [],
          salesByMonth: [],
          salesByYear: [],
        };
        by.set(currency, f);
      }
      return f;
    };
    const add = (groups: StockGroup[], key: string, cost: number) => {
      let g = groups.find((x) => x.key === key);
      if (!g) groups.push((g = { key, lots: 0, cost: 0 }));
      g.lots += 1;
      g.cost += cost;
    };
    let lotsWithoutCost = 0;
    for (const h of held) {
      const cost = this.costOf(sealed.get(h.lot_id) ?? [], bought.get(h.lot_id) ?? []);
      if (!cost) {
        lotsWithoutCost += 1;
        continue;
      }
      const f = fig(cost.currency);
      f.stock.lots += 1;
      f.stock.cost += cost.amount;
      add(f.stockByOrigin, h.origin ?? 'none', cost.amount);
      add(f.stockByCentury, centuryKey(h.period_from), cost.amount);
    }
    let salesWithoutPrice = 0;
    const bump = (
      periods: SalesPeriod[],
      period: string,
      price: number,
      cost: Money | undefined,
      currency: string,
    ) => {
      let p = periods.find((x) => x.period === period);
      if (!p) periods.push((p = { period, sales: 0, revenue: 0, cost: 0, margin: 0, withoutCost: 0 }));
      p.sales += 1;
      p.revenue += price;
      if (cost && cost.currency === currency) {
        p.cost += cost.amount;
        p.margin += price - cost.amount;
      } else {
        p.withoutCost += 1;
      }
    };
    for (const s of sales) {
      const fields = sealed.get(s.lot_id) ?? [];
      const price = newest<unknown>(fields, s.to === 'buyer' ? 'sale-price' : 'transfer-price', s.seq);
      if (!isMoney(price)) {
        salesWithoutPrice += 1;
        continue;
      }
      const cost = this.costOf(fields, bought.get(s.lot_id) ?? [], s.seq - 1);
      const f = fig(price.currency);
      bump(f.salesByMonth, s.day.slice(0, 7), price.amount, cost, price.currency);
      bump(f.salesByYear, s.day.slice(0, 4), price.amount, cost, price.currency);
    }
    const currencies = [...by.values()].sort((a, b) => a.currency.localeCompare(b.currency));
    for (const f of currencies) {
      f.stockByOrigin.sort((a, b) => b.cost - a.cost || a.key.localeCompare(b.key));
      f.stockByCentury.sort((a, b) => a.key.localeCompare(b.key));
      f.salesByMonth.sort((a, b) => a.period.localeCompare(b.period));
      f.salesByYear.sort((a, b) => a.period.localeCompare(b.period));
    }
    return { currencies, lotsHeld: held.length, lotsWithoutCost, salesWithoutPrice };
  }

  /** The stock held as a CSV or XLSX file: one row per lot, with the dealer's own sealed details. */
  async export(me: Viewer, format: ExportFormat): Promise<ExportFile> {
    const held = await this.held(me);
    const bought = await this.deals.boughtAt(me.id);
    const sealed = await this.reader.sealedForLots(
      held.map((h) => h.lot_id),
      me.id,
      SEALED,
    );
    const rows = held.map((h) => {
      const fields = sealed.get(h.lot_id) ?? [];
      const cost = this.costOf(fields, bought.get(h.lot_id) ?? []);
      const text = (v: unknown) => (typeof v === 'string' ? v : '');
      const costText = cost ? majorUnits(cost.amount, cost.currency) : '';
      return {
        code: formatLotCode(h.code),
        title: h.title,
        form: h.form ?? '',
        count: h.count_value,
        estimated: h.count_estimated ? 'yes' : 'no',
        status: h.status,
        listed: h.listed ? 'yes' : 'no',
        origin: h.origin ?? '',
        from: h.period_from ?? '',
        to: h.period_to ?? '',
        technique: h.technique ?? '',
        storage: text(newest(fields, 'storage-location')),
        date: text(newest(fields, 'acquisition-date')),
        source: text(newest(fields, 'acquisition-source')),
        // A number in the spreadsheet, a decimal text in the CSV (never a float's rounding).
        cost: format === 'xlsx' && cost ? Number(costText) : costText,
        currency: cost?.currency ?? '',
      };
    });
    const day = new Date().toISOString().slice(0, 10);
    return exportFile(format, `beadroll-stock-${day}`, [{ name: 'Stock', columns: STOCK_COLUMNS, rows }]);
  }

  /**
   * What the lot cost the dealer as of seq `upTo`: the newest of their own recorded acquisition
   * cost and the price of a transfer they accepted (`boughtAt` holds those offers' seqs).
   */
  private costOf(
    fields: readonly ViewerSealedField[],
    boughtAt: readonly number[],
    upTo = Infinity,
  ): Money | undefined {
    let out: Money | undefined;
    for (const f of fields) {
      if (f.seq > upTo || !isMoney(f.value)) continue;
      if (f.name === 'acquisition-cost' || (f.name === 'transfer-price' && boughtAt.includes(f.seq)))
        out = f.value;
    }
    return out;
  }

  private async held(me: Viewer): Promise<HeldRow[]> {
    return (await this.views.heldBy(me.id, ['held', 'offered'])).map((v) => ({
      lot_id: v.lotId,
      code: v.code,
      title: v.title,
      form: v.form,
      status: v.status,
      listed: v.listed,
      origin: v.origin,
      technique: v.technique,
      period_from: v.periodFrom,
      period_to: v.periodTo,
      count_value: v.countValue,
      count_estimated: v.countEstimated,
    }));
  }
}
