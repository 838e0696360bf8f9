import { queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';

export type CostTotal = Schemas['CostTotal'];
export type StockGroup = Schemas['StockGroup'];
export type SalesPeriod = Schemas['SalesPeriod'];
export type CurrencyFigures = Schemas['CurrencyFigures'];
export type StockSummary = Schemas['StockSummaryResponse'];

export const stockQueries = {
  summary: () =>
    queryOptions({
      queryKey: ['stock', 'summary'],
      queryFn: ({ signal }) => answer(client.GET('/api/stock/summary', { signal })),
    }),
};

/** Where the browser downloads the stock file from (the session cookie goes with it). */
export function stockExportUrl(format: 'csv' | 'xlsx'): string {
  return `/api/stock/export?format=${format}`;
}
