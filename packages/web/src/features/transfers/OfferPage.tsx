import {
  Badge,
  Button,
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Text,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, Navigate, useParams } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import { useSession } from '../accounts/accounts.api';
import { Facts } from '../../common/ui/Facts';
import { FormError, NoteField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
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
  const form = useFormValues({ note: '' });
  const offer = useQuery({ ...offerQuery(id), enabled: !!account });
  const act = useMutation({
    mutationFn: (action: 'accept' | 'decline' | 'withdraw') =>
      transfersApi.answer(id, action, form.values.note.trim() || undefined),
    onSuccess: async (o: Offer) => {
      client.setQueryData(offerQuery(id).queryKey, o);
      await client.invalidateQueries({ queryKey: ['transfers', 'offers'] });
      await client.invalidateQueries({ queryKey: ['lots'] });
      form.reset();
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
      <Facts
        rows={[
          [
            'Lot',
            <>
              <Link to={`/lots/${o.lot.code}`}>{o.lot.title || 'Untitled lot'}</Link> ({o.lot.displayCode})
            </>,
          ],
          ['From', who(o.offerer)],
          ['To', who(o.recipient)],
          ['Offered', formatDateTime(o.offeredAt)],
          !!o.lapsesAt && ['Lapses', `${formatDateTime(o.lapsesAt)} if nobody answers`],
          [
            'Agreed price',
            o.price ? `${formatMoney(o.price)} (sealed: only the two of you see it)` : 'none recorded',
          ],
          !!o.note && ['Note', o.note],
          !!o.answeredAt && [
            OFFER_STATUS_LABEL[o.status],
            `${formatDateTime(o.answeredAt)}${o.answerNote ? ` — “${o.answerNote}”` : ''}`,
          ],
        ]}
      />
      {open ? (
        <>
          <Text>
            {mine
              ? 'Accepting makes you the holder; both sides are written on the lot’s history. You never see the earlier holder’s sealed details.'
              : 'The lot stays yours until they accept. You can withdraw the offer until it is answered.'}
          </Text>
          <NoteField
            label="Note (optional)"
            hint="Written on the lot’s history."
            {...form.bind(act.error)('note')}
          />
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
