import {
  Badge,
  Button,
  Card,
  Field,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Text,
  Textarea,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, Navigate, useParams } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import { useSession } from '../accounts/accounts.api';
import { fieldError, FormError } from '../../common/ui/FormPage';
import {
  formatDateTime,
  formatMoney,
  type Offer,
  OFFER_STATUS_LABEL,
  offerQuery,
  type Party,
  transfersApi,
} from './transfers.api';

const useStyles = makeStyles({
  card: {
    maxWidth: '640px',
    width: '100%',
    marginInline: 'auto',
    padding: tokens.spacingHorizontalXL,
    display: 'grid',
    gap: tokens.spacingVerticalM,
  },
  facts: {
    display: 'grid',
    gridTemplateColumns: 'max-content 1fr',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    margin: 0,
  },
  term: { color: tokens.colorNeutralForeground3 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalM, flexWrap: 'wrap' },
});

function who(p: Party | null): string {
  return p ? `${p.displayName} — ${p.business}, ${p.town}` : 'a dealer';
}

/** One offer, reached from the e-mailed link: the recipient accepts or declines, the offerer may withdraw. */
export function OfferPage() {
  const styles = useStyles();
  const { id = '' } = useParams();
  const { account, isLoading } = useSession();
  const client = useQueryClient();
  const [note, setNote] = useState('');
  const offer = useQuery({ ...offerQuery(id), enabled: !!account });
  const act = useMutation({
    mutationFn: (action: 'accept' | 'decline' | 'withdraw') =>
      transfersApi.answer(id, action, note.trim() || undefined),
    onSuccess: async (o: Offer) => {
      client.setQueryData(offerQuery(id).queryKey, o);
      await client.invalidateQueries({ queryKey: ['transfers', 'offers'] });
      await client.invalidateQueries({ queryKey: ['lots'] });
      setNote('');
    },
    onError: () => client.invalidateQueries({ queryKey: offerQuery(id).queryKey }),
  });

  if (isLoading) return <Text>Loading…</Text>;
  if (!account)
    return <Navigate to={`/sign-in?next=${encodeURIComponent(`/transfers/offers/${id}`)}`} replace />;
  if (offer.error)
    return (
      <Card className={styles.card}>
        <Title2 as="h1">Offer not found</Title2>
        <Text>
          {offer.error instanceof ApiError && offer.error.status === 404
            ? 'This offer does not exist, or it was made to another account. Check that you are signed in as the dealer it was sent to.'
            : offer.error.message}
        </Text>
      </Card>
    );
  if (!offer.data) return <Text>Loading…</Text>;
  const o = offer.data;
  const open = o.status === 'open';
  const mine = o.viewerIs === 'recipient';
  return (
    <Card className={styles.card}>
      <Title2 as="h1">
        {mine ? `${o.offerer?.displayName ?? 'A dealer'} offers you a lot` : 'Your offer'}
      </Title2>
      <div>
        <Badge appearance="tint" color={open ? 'brand' : o.status === 'accepted' ? 'success' : 'informative'}>
          {OFFER_STATUS_LABEL[o.status]}
        </Badge>
      </div>
      <dl className={styles.facts}>
        <dt className={styles.term}>Lot</dt>
        <dd>
          <Link to={`/lots/${o.lot.code}`}>{o.lot.title || 'Untitled lot'}</Link> ({o.lot.displayCode})
        </dd>
        <dt className={styles.term}>From</dt>
        <dd>{who(o.offerer)}</dd>
        <dt className={styles.term}>To</dt>
        <dd>{who(o.recipient)}</dd>
        <dt className={styles.term}>Offered</dt>
        <dd>{formatDateTime(o.offeredAt)}</dd>
        {o.lapsesAt ? (
          <>
            <dt className={styles.term}>Lapses</dt>
            <dd>{formatDateTime(o.lapsesAt)} if nobody answers</dd>
          </>
        ) : null}
        <dt className={styles.term}>Agreed price</dt>
        <dd>{o.price ? `${formatMoney(o.price)} (sealed: only the two of you see it)` : 'none recorded'}</dd>
        {o.note ? (
          <>
            <dt className={styles.term}>Note</dt>
            <dd>{o.note}</dd>
          </>
        ) : null}
        {o.answeredAt ? (
          <>
            <dt className={styles.term}>{OFFER_STATUS_LABEL[o.status]}</dt>
            <dd>
              {formatDateTime(o.answeredAt)}
              {o.answerNote ? ` — “${o.answerNote}”` : ''}
            </dd>
          </>
        ) : null}
      </dl>
      {open ? (
        <>
          <Text>
            {mine
              ? 'Accepting makes you the holder; both sides are written on the lot’s history. You never see the earlier holder’s sealed details.'
              : 'The lot stays yours until they accept. You can withdraw the offer until it is answered.'}
          </Text>
          <Field
            label="Note (optional)"
            hint="Written on the lot’s history."
            validationMessage={fieldError(act.error, 'note')}
          >
            <Textarea value={note} onChange={(_, d) => setNote(d.value)} resize="vertical" />
          </Field>
          <div className={styles.actions}>
            {mine ? (
              <>
                <Button appearance="primary" disabled={act.isPending} onClick={() => act.mutate('accept')}>
                  Accept the lot
                </Button>
                <Button disabled={act.isPending} onClick={() => act.mutate('decline')}>
                  Decline
                </Button>
              </>
            ) : (
              <Button disabled={act.isPending} onClick={() => act.mutate('withdraw')}>
                Withdraw the offer
              </Button>
            )}
          </div>
        </>
      ) : null}
      {o.status === 'accepted' && mine ? (
        <MessageBar intent="success">
          <MessageBarBody>
            The lot is yours now. It is in your <Link to="/transfers/incoming">incoming offers</Link> and in
            your lots.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      <FormError error={act.error} />
    </Card>
  );
}
