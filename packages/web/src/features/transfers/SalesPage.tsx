import {
  Button,
  MessageBar,
  MessageBarBody,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
  Text,
  Title2,
} from '@fluentui/react-components';
import { FilterButtons } from '../../shared/ui/FilterButtons';
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { Pager, useListParams, useListStyles } from '../../shared/ui/ListParts';
import { RecordSaleDialog } from './RecordSaleDialog';
import { formatMoney, type Sale, type SaleReceiptFilter, salesQuery } from './transfers.api';

const PAGE_SIZE = 20;
const RECEIPTS: Array<{ value: 'all' | 'sent' | 'none'; label: string }> = [
  { value: 'all', label: 'All sales' },
  { value: 'sent', label: 'Receipt sent' },
  { value: 'none', label: 'No receipt' },
];

const features = tableFeatures({});
const helper = createColumnHelper<typeof features, Sale>();
const columns = helper.columns([
  helper.accessor('date', { header: 'Sold on' }),
  helper.display({ id: 'lot', header: 'Lot' }),
  helper.display({ id: 'price', header: 'Price' }),
  helper.display({ id: 'buyer', header: 'Buyer note' }),
  helper.display({ id: 'page', header: 'Public page' }),
]);
const EMPTY: Sale[] = [];

/** The dealer's sales to private buyers, with the sealed price and note only they can see. */
export function SalesPage() {
  const styles = useListStyles();
  const { account, isLoading, canWrite } = useSession();
  const { search, page, update } = useListParams();
  const [recording, setRecording] = useState(false);
  const [done, setDone] = useState<Sale | null>(null);
  const receipt = RECEIPTS.find((r) => r.value === search.get('receipt'))?.value ?? 'all';
  const query = useQuery({
    ...salesQuery(receipt === 'all' ? undefined : (receipt as SaleReceiptFilter), undefined, page, PAGE_SIZE),
    enabled: account?.role === 'dealer',
  });
  const table = useTable({ features, columns, data: query.data?.items ?? EMPTY });

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/transfers/sales" replace />;
  if (account.role !== 'dealer') return <Text>Only dealers record sales.</Text>;

  return (
    <section className={styles.page} aria-labelledby="sales-title">
      <div className={styles.head}>
        <Title2 as="h1" id="sales-title" className={styles.grow}>
          Sales
        </Title2>
        {canWrite ? (
          <Button appearance="primary" onClick={() => setRecording(true)}>
            Record a sale
          </Button>
        ) : null}
      </div>
      {done ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Sale of “{done.lot.title}” recorded{done.receiptSent ? '; the receipt is on its way' : ''}.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      <div className={styles.tabs}>
        <FilterButtons
          label="Sales by receipt"
          value={receipt}
          options={RECEIPTS}
          onChange={(v) => update({ receipt: v === 'all' ? undefined : String(v) })}
        />
      </div>
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Sales">
          <TableHeader>
            {table.getHeaderGroups().map((group) => (
              <TableRow key={group.id}>
                {group.headers.map((header) => (
                  <TableHeaderCell key={header.id}>
                    <table.FlexRender header={header} />
                  </TableHeaderCell>
                ))}
              </TableRow>
            ))}
          </TableHeader>
          <TableBody>
            {table.getRowModel().rows.map((row) => {
              const s = row.original;
              return (
                <TableRow key={row.id}>
                  <TableCell>
                    {new Date(`${s.date}T12:00:00Z`).toLocaleDateString(undefined, { dateStyle: 'medium' })}
                  </TableCell>
                  <TableCell>
                    {s.lot.title}
                    <div className={styles.sub}>{s.lot.displayCode}</div>
                  </TableCell>
                  <TableCell>{formatMoney(s.price)}</TableCell>
                  <TableCell>{s.buyerNote ?? '—'}</TableCell>
                  <TableCell>
                    {s.listed ? (
                      <a href={`/l/${s.lot.code}`}>Open</a>
                    ) : (
                      <span className={styles.sub}>unlisted</span>
                    )}
                    {s.receiptSent ? <div className={styles.sub}>receipt sent</div> : null}
                  </TableCell>
                </TableRow>
              );
            })}
          </TableBody>
        </Table>
      </div>
      {query.data && query.data.total === 0 ? <Text>No sales here yet.</Text> : null}
      <Pager
        page={page}
        total={query.data?.total ?? 0}
        pageSize={PAGE_SIZE}
        noun="sales"
        onPage={(p) => update({ page: String(p) })}
      />
      {recording ? <RecordSaleDialog onClose={() => setRecording(false)} onDone={setDone} /> : null}
    </section>
  );
}
