import { Badge, Button, MessageBar, MessageBarBody, Text, Title3 } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, Navigate } from 'react-router-dom';
import { FormError } from '../../common/ui/FormPage';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { filterValue, type FilterOption, useListParams } from '../../common/ui/list/list-params';
import { ListFilter, ListView, useListStyles } from '../../common/ui/list/ListView';
import { useSession } from '../accounts/accounts.api';
import { OfferDialog } from './OfferDialog';
import {
  formatDateTime,
  formatMoney,
  type Invitation,
  invitationsQuery,
  type Offer,
  type OfferBox,
  OFFER_STATUS_LABEL,
  offersQuery,
  type OfferStatus,
  transfersApi,
} from './transfers.api';
import { Page } from '../../common/ui/Page';

const FILTERS: Array<FilterOption<OfferStatus | 'all'>> = [
  { value: 'all', label: 'All' },
  { value: 'open', label: 'Waiting' },
  { value: 'accepted', label: 'Accepted' },
  { value: 'declined', label: 'Declined' },
  { value: 'withdrawn', label: 'Withdrawn' },
  { value: 'lapsed', label: 'Lapsed' },
];
const INVITATION_STATUS: Record<Invitation['status'], string> = {
  waiting: 'Waiting for them to join',
  offered: 'Offer made',
  stalled: 'Could not be offered',
  cancelled: 'Cancelled',
};

function useColumns(box: OfferBox): Array<ListColumn<Offer>> {
  const styles = useListStyles();
  return [
    {
      id: 'lot',
      header: 'Lot',
      cell: (o) => (
        <>
          <Link to={`/transfers/offers/${o.id}`}>{o.lot.title || 'Untitled lot'}</Link>
          <div className={styles.sub}>{o.lot.displayCode}</div>
        </>
      ),
    },
    {
      id: 'other',
      header: box === 'incoming' ? 'From' : 'To',
      cell: (o) => {
        const other = box === 'incoming' ? o.offerer : o.recipient;
        return other ? (
          <>
            {other.displayName}
            <div className={styles.sub}>{other.business}</div>
          </>
        ) : (
          '—'
        );
      },
    },
    { id: 'offeredAt', header: 'Offered', cell: (o) => formatDateTime(o.offeredAt) },
    {
      id: 'status',
      header: 'Status',
      cell: (o) => (
        <Badge appearance="tint" color={o.status === 'open' ? 'brand' : 'informative'}>
          {OFFER_STATUS_LABEL[o.status]}
        </Badge>
      ),
    },
    { id: 'price', header: 'Agreed price', cell: (o) => formatMoney(o.price) },
    {
      id: 'actions',
      header: '',
      cell: (o) => (
        <div className={styles.actions}>
          {o.status === 'open' && box === 'incoming' ? (
            <Link to={`/transfers/offers/${o.id}`}>Answer</Link>
          ) : null}
          {o.status === 'open' && box === 'outgoing' ? <Withdraw offer={o} /> : null}
        </div>
      ),
    },
  ];
}

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
  const columns: Array<ListColumn<Invitation>> = [
    { id: 'lot', header: 'Lot', cell: (i) => `${i.lot.title} (${i.lot.displayCode})` },
    {
      id: 'invited',
      header: 'Invited',
      cell: (i) => (
        <>
          {i.email}
          <div className={styles.sub}>{formatDateTime(i.createdAt)}</div>
        </>
      ),
    },
    {
      id: 'status',
      header: 'Status',
      cell: (i) => (
        <>
          {INVITATION_STATUS[i.status]}
          {i.statusReason ? <div className={styles.sub}>{i.statusReason}</div> : null}
        </>
      ),
    },
    {
      id: 'actions',
      header: '',
      cell: (i) => (
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
      ),
    },
  ];
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
      <DataTable label="Invitations" columns={columns} rows={items} rowKey={(i) => i.id} wide />
      <FormError error={act.error} />
    </section>
  );
}

/** Incoming or outgoing offers as a server-paged table with a status filter kept in the URL. */
export function OffersPage({ box }: { box: OfferBox }) {
  const { account, isLoading, canWrite } = useSession();
  const list = useListParams();
  const columns = useColumns(box);
  const status = filterValue(list, 'status', FILTERS);
  const query = useQuery({
    ...offersQuery(box, status === 'all' ? undefined : status, list.page, list.pageSize),
    enabled: account?.role === 'dealer',
  });
  const [offering, setOffering] = useState(false);
  const [made, setMade] = useState<string | null>(null);
  const title = box === 'incoming' ? 'Incoming offers' : 'Outgoing offers';

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to={`/sign-in?next=/transfers/${box}`} replace />;
  if (account.role !== 'dealer') return <Text>Only dealers take part in transfers.</Text>;

  return (
    <Page
      title={title}
      actions={
        box === 'outgoing' && canWrite ? (
          <Button appearance="primary" onClick={() => setOffering(true)}>
            Offer a lot
          </Button>
        ) : null
      }
    >
      {made ? (
        <MessageBar intent="success">
          <MessageBarBody>{made}</MessageBarBody>
        </MessageBar>
      ) : null}
      <ListFilter list={list} name="status" label="Offers by status" options={FILTERS} />
      <ListView
        label={title}
        columns={columns}
        query={query}
        list={list}
        noun={['offer', 'offers']}
        empty="No offers here."
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
    </Page>
  );
}
