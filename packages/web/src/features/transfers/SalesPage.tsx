import { Button, MessageBar, MessageBarBody, Text } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate } from 'react-router-dom';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { filterValue, type FilterOption, useListParams } from '../../common/ui/list/list-params';
import { ListFilter, ListView, useListStyles } from '../../common/ui/list/ListView';
import { useSession } from '../accounts/accounts.api';
import { RecordSaleDialog } from './RecordSaleDialog';
import { formatMoney, type Sale, type SaleReceiptFilter, salesQuery } from './transfers.api';
import { Page } from '../../common/ui/Page';

const RECEIPTS: Array<FilterOption<'all' | 'sent' | 'none'>> = [
  { value: 'all', label: 'All sales' },
  { value: 'sent', label: 'Receipt sent' },
  { value: 'none', label: 'No receipt' },
];

function useColumns(): Array<ListColumn<Sale>> {
  const styles = useListStyles();
  return [
    {
      id: 'date',
      header: 'Sold on',
      cell: (s) => new Date(`${s.date}T12:00:00Z`).toLocaleDateString(undefined, { dateStyle: 'medium' }),
    },
    {
      id: 'lot',
      header: 'Lot',
      cell: (s) => (
        <>
          {s.lot.title}
          <div className={styles.sub}>{s.lot.displayCode}</div>
        </>
      ),
    },
    { id: 'price', header: 'Price', cell: (s) => formatMoney(s.price) },
    { id: 'buyer', header: 'Buyer note', cell: (s) => s.buyerNote ?? '—' },
    {
      id: 'page',
      header: 'Public page',
      cell: (s) => (
        <>
          {s.listed ? <a href={`/l/${s.lot.code}`}>Open</a> : <span className={styles.sub}>unlisted</span>}
          {s.receiptSent ? <div className={styles.sub}>receipt sent</div> : null}
        </>
      ),
    },
  ];
}

/** The dealer's sales to private buyers, with the sealed price and note only they can see. */
export function SalesPage() {
  const { account, isLoading, canWrite } = useSession();
  const list = useListParams();
  const columns = useColumns();
  const [recording, setRecording] = useState(false);
  const [done, setDone] = useState<Sale | null>(null);
  const receipt = filterValue(list, 'receipt', RECEIPTS);
  const query = useQuery({
    ...salesQuery(
      receipt === 'all' ? undefined : (receipt as SaleReceiptFilter),
      undefined,
      list.page,
      list.pageSize,
    ),
    enabled: account?.role === 'dealer',
  });

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/transfers/sales" replace />;
  if (account.role !== 'dealer') return <Text>Only dealers record sales.</Text>;

  return (
    <Page
      title="Sales"
      actions={
        canWrite ? (
          <Button appearance="primary" onClick={() => setRecording(true)}>
            Record a sale
          </Button>
        ) : null
      }
    >
      {done ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Sale of “{done.lot.title}” recorded{done.receiptSent ? '; the receipt is on its way' : ''}.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      <ListFilter list={list} name="receipt" label="Sales by receipt" options={RECEIPTS} />
      <ListView
        label="Sales"
        columns={columns}
        query={query}
        list={list}
        noun={['sale', 'sales']}
        empty="No sales here yet."
      />
      {recording ? <RecordSaleDialog onClose={() => setRecording(false)} onDone={setDone} /> : null}
    </Page>
  );
}
