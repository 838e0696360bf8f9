import { queryOptions } from '@tanstack/react-query';
import { api } from '../../lib/api';

export interface CostTotal {
  lots: number;
  /** Integer minor units. */
  cost: number;
}

export interface StockGroup extends CostTotal {
  /** An origin code, a century's first year ("1800"), or "none". */
  key: string;
}

export interface SalesPeriod {
  /** "2026-03" or "2026". */
  period: string;
  sales: number;
  revenue: number;
  cost: number;
  margin: number;
  withoutCost: number;
}

export interface CurrencyFigures {
  currency: string;
  minorDigits: number;
  stock: CostTotal;
  stockByOrigin: StockGroup[];
  stockByCentury: StockGroup[];
  salesByMonth: SalesPeriod[];
  salesByYear: SalesPeriod[];
}

export interface StockSummary {
  currencies: CurrencyFigures[];
  lotsHeld: number;
  lotsWithoutCost: number;
  salesWithoutPrice: number;
}

export const stockQueries = {
  summary: () =>
    queryOptions({
      queryKey: ['stock', 'summary'],
      queryFn: ({ signal }) => api<StockSummary>('/api/stock/summary', { signal }),
    }),
};

/** Where the browser downloads the stock file from (the session cookie goes with it). */
export function stockExportUrl(format: 'csv' | 'xlsx'): string {
  return `/api/stock/export?format=${format}`;
}
