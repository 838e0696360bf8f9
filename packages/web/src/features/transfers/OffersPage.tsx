import {
  Badge,
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
  Title3,
} from '@fluentui/react-components';
import { FilterButtons } from '../../shared/ui/FilterButtons';
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, Navigate } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { FormError } from '../../shared/ui/FormPage';
import { OfferDialog } from './OfferDialog';
import { Pager, useListParams, useListStyles } from '../../shared/ui/ListParts';
import {
  formatDateTime,
  formatMoney,
  invitationsQuery,
  type Offer,
  type OfferBox,
  OFFER_STATUS_LABEL,
  offersQuery,
  type OfferStatus,
  transfersApi,
} from './transfers.api';

const PAGE_SIZE = 20;
const FILTERS: Array<{ value: OfferStatus | 'all'; label: string }> = [
  { value: 'all', label: 'All' },
  { value: 'open', label: 'Waiting' },
  { value: 'accepted', label: 'Accepted' },
  { value: 'declined', label: 'Declined' },
  { value: 'withdrawn', label: 'Withdrawn' },
  { value: 'lapsed', label: 'Lapsed' },
];

const features = tableFeatures({});
const helper = createColumnHelper<typeof features, Offer>();
const columns = helper.columns([
  helper.display({ id: 'lot', header: 'Lot' }),
  helper.display({ id: 'other', header: 'Dealer' }),
  helper.accessor('offeredAt', { header: 'Offered' }),
  helper.accessor('status', { header: 'Status' }),
  helper.display({ id: 'price', header: 'Agreed price' }),
  helper.display({ id: 'actions', header: '' }),
]);
const EMPTY: Offer[] = [];

function Withdraw({ offer }: { offer: Offer }) {
  const client = useQueryClient();
  const withdraw = useMutation({
    mutationFn: () => transfersApi.answer(offer.id, 'withdraw'),
    onSettled: () => client.invalidateQueries({ queryKey: ['transfers'] }),
  });
  return (
    <>
      <Button size="small" disabled={withdraw.isPending} onClick={() => withdraw.mutate()}>
        Withdraw
      </Button>
      <FormError error={withdraw.error} />
    </>
  );
}

function Invitations() {
  const styles = useListStyles();
  const client = useQueryClient();
  const q = useQuery(invitationsQuery());
  const act = useMutation({
    mutationFn: ({ id, action }: { id: string; action: 'offer' | 'cancel' }) =>
      action === 'offer' ? transfersApi.offerInvitation(id) : transfersApi.cancelInvitation(id),
    onSettled: () => client.invalidateQueries({ queryKey: ['transfers'] }),
  });
  const items = q.data?.items ?? [];
  if (!items.length) return null;
  return (
    <section className={styles.page} aria-labelledby="invitations-title">
      <Title3 as="h2" id="invitations-title">
        Invitations
      </Title3>
      <Text className={styles.sub}>
        Offers to e-mail addresses without a verified dealer account. Each becomes an offer when the registrar
        verifies that dealer; the address never goes on a lot’s history.
      </Text>
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Invitations">
          <TableHeader>
            <TableRow>
              <TableHeaderCell>Lot</TableHeaderCell>
              <TableHeaderCell>Invited</TableHeaderCell>
              <TableHeaderCell>Status</TableHeaderCell>
              <TableHeaderCell />
            </TableRow>
          </TableHeader>
          <TableBody>
            {items.map((i) => (
              <TableRow key={i.id}>
                <TableCell>
                  {i.lot.title} ({i.lot.displayCode})
                </TableCell>
                <TableCell>
                  {i.email}
                  <div className={styles.sub}>{formatDateTime(i.createdAt)}</div>
                </TableCell>
                <TableCell>
                  {
                    {
                      waiting: 'Waiting for them to join',
                      offered: 'Offer made',
                      stalled: 'Could not be offered',
                      cancelled: 'Cancelled',
                    }[i.status]
                  }
                  {i.statusReason ? <div className={styles.sub}>{i.statusReason}</div> : null}
                </TableCell>
                <TableCell>
                  <div className={styles.actions}>
                    {i.status === 'stalled' ? (
                      <Button size="small" onClick={() => act.mutate({ id: i.id, action: 'offer' })}>
                        Try the offer again
                      </Button>
                    ) : null}
                    {i.status === 'waiting' || i.status === 'stalled' ? (
                      <Button size="small" onClick={() => act.mutate({ id: i.id, action: 'cancel' })}>
                        Cancel
                      </Button>
                    ) : null}
                    {i.offerId ? <Link to={`/transfers/offers/${i.offerId}`}>Open the offer</Link> : null}
                  </div>
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </div>
      <FormError error={act.error} />
    </section>
  );
}

/** Incoming or outgoing offers as a server-paged table with a status filter kept in the URL. */
export function OffersPage({ box }: { box: OfferBox }) {
  const styles = useListStyles();
  const { account, isLoading, canWrite } = useSession();
  const { search, page, update } = useListParams();
  const status = FILTERS.find((f) => f.value === search.get('status'))?.value ?? 'all';
  const query = useQuery({
    ...offersQuery(box, status === 'all' ? undefined : status, page, PAGE_SIZE),
    enabled: account?.role === 'dealer',
  });
  const table = useTable({ features, columns, data: query.data?.items ?? EMPTY });
  const [offering, setOffering] = useState(false);
  const [made, setMade] = useState<string | null>(null);
  const title = box === 'incoming' ? 'Incoming offers' : 'Outgoing offers';

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to={`/sign-in?next=/transfers/${box}`} replace />;
  if (account.role !== 'dealer') return <Text>Only dealers take part in transfers.</Text>;

  return (
    <section className={styles.page} aria-labelledby="offers-title">
      <div className={styles.head}>
        <Title2 as="h1" id="offers-title" className={styles.grow}>
          {title}
        </Title2>
        {box === 'outgoing' && canWrite ? (
          <Button appearance="primary" onClick={() => setOffering(true)}>
            Offer a lot
          </Button>
        ) : null}
      </div>
      {made ? (
        <MessageBar intent="success">
          <MessageBarBody>{made}</MessageBarBody>
        </MessageBar>
      ) : null}
      <div className={styles.tabs}>
        <FilterButtons
          label="Offers by status"
          value={status}
          options={FILTERS}
          onChange={(v) => update({ status: v === 'all' ? undefined : String(v) })}
        />
      </div>
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label={title}>
          <TableHeader>
            {table.getHeaderGroups().map((group) => (
              <TableRow key={group.id}>
                {group.headers.map((header) => (
                  <TableHeaderCell key={header.id}>
                    {header.column.id === 'other' ? (
                      box === 'incoming' ? (
                        'From'
                      ) : (
                        'To'
                      )
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </TableHeaderCell>
                ))}
              </TableRow>
            ))}
          </TableHeader>
          <TableBody>
            {table.getRowModel().rows.map((row) => {
              const o = row.original;
              const other = box === 'incoming' ? o.offerer : o.recipient;
              return (
                <TableRow key={row.id}>
                  <TableCell>
                    <Link to={`/transfers/offers/${o.id}`}>{o.lot.title || 'Untitled lot'}</Link>
                    <div className={styles.sub}>{o.lot.displayCode}</div>
                  </TableCell>
                  <TableCell>
                    {other ? other.displayName : '—'}
                    {other ? <div className={styles.sub}>{other.business}</div> : null}
                  </TableCell>
                  <TableCell>{formatDateTime(o.offeredAt)}</TableCell>
                  <TableCell>
                    <Badge appearance="tint" color={o.status === 'open' ? 'brand' : 'informative'}>
                      {OFFER_STATUS_LABEL[o.status]}
                    </Badge>
                  </TableCell>
                  <TableCell>{formatMoney(o.price)}</TableCell>
                  <TableCell>
                    <div className={styles.actions}>
                      {o.status === 'open' && box === 'incoming' ? (
                        <Link to={`/transfers/offers/${o.id}`}>Answer</Link>
                      ) : null}
                      {o.status === 'open' && box === 'outgoing' ? <Withdraw offer={o} /> : null}
                    </div>
                  </TableCell>
                </TableRow>
              );
            })}
          </TableBody>
        </Table>
      </div>
      {query.data && query.data.total === 0 ? <Text>No offers here.</Text> : null}
      <Pager
        page={page}
        total={query.data?.total ?? 0}
        pageSize={PAGE_SIZE}
        noun="offers"
        onPage={(p) => update({ page: String(p) })}
      />
      {box === 'outgoing' ? <Invitations /> : null}
      {offering ? (
        <OfferDialog
          onClose={() => setOffering(false)}
          onDone={(r) =>
            setMade(
              r.offer
                ? `Offer sent to ${r.offer.recipient?.displayName ?? 'the dealer'}.`
                : 'Invitation sent. The offer is made once the registrar verifies that dealer.',
            )
          }
        />
      ) : null}
    </section>
  );
}
