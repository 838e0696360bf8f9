import {
  Button,
  Card,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { formatLotCode, verifyRoll } from '@beadroll/core';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import type { QueuedWrite } from '../../lib/outbox';
import { useSession } from '../accounts/accounts.api';
import { may, type LotActionContext } from '../lots/lot-actions';
import { lotsQueries } from '../lots/lots.api';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import { OfferDialog } from '../transfers/OfferDialog';
import { RecordSaleDialog } from '../transfers/RecordSaleDialog';
import { formatMoney, transfersApi, type Sale } from '../transfers/transfers.api';
import { useOutbox } from '../outbox/OutboxPanel';
import { scannerQueries } from './scanner.api';
import { ScanScreen } from './ScanScreen';

const useStyles = makeStyles({
  card: { display: 'grid', gap: tokens.spacingVerticalS, padding: tokens.spacingHorizontalL },
  code: { fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase500 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  quick: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fit, minmax(min(100%, 10rem), 1fr))',
    gap: tokens.spacingHorizontalM,
  },
  big: { minHeight: '48px' },
});

function groupRef(ref: string): string {
  return `${ref.slice(0, 5)}-${ref.slice(5)}`;
}

/**
 * A lot the dealer just scanned (or typed), with the actions a fair stand needs: sell (the
 * price is all there is to type: two taps in all), offer to a dealer, print a tag, history.
 */
export function ScannedLotPage() {
  const styles = useStyles();
  const { code = '' } = useParams();
  const [params] = useSearchParams();
  const tagRef = params.get('ref');
  const navigate = useNavigate();
  const client = useQueryClient();
  const lot = useQuery(scannerQueries.lot(code));
  const { account } = useSession();
  // What the dealer may do is decided as on the lot page: core's rules over the verified roll,
  // never the list row the tag lookup answers with.
  const held = lot.data?.held === true;
  const roll = useQuery({ ...lotsQueries.roll(lot.data?.code ?? code), enabled: held });
  const verified = useMemo(() => (roll.data ? verifyRoll(roll.data.entries) : null), [roll.data]);
  const ctx: LotActionContext | null =
    verified?.ok && account ? { code: verified.state.lot, state: verified.state, viewer: account } : null;
  const [action, setAction] = useState<'sell' | 'offer' | null>(null);
  // The same big button whether or not the lot could be looked up.
  const sellButton = (
    <Button appearance="primary" size="large" className={styles.big} onClick={() => setAction('sell')}>
      Sell
    </Button>
  );
  const [sold, setSold] = useState<Sale | null>(null);
  const [offered, setOffered] = useState(false);
  const [madeHere, setQueued] = useState<QueuedWrite | null>(null);
  // A sale or offer of this lot already waiting on this phone (made before a reload, too).
  const { mine } = useOutbox();
  const queued =
    madeHere ??
    mine.find(
      (w) =>
        !w.refused &&
        (w.path === transfersApi.salesPath || w.path === transfersApi.offersPath) &&
        w.body?.lot === code,
    ) ??
    null;
  const waitingMessage = queued ? (
    <MessageBar intent="info">
      <MessageBarBody>
        {queued.path === transfersApi.offersPath ? 'Offer' : 'Sale'} recorded on this device: waiting to send.
      </MessageBarBody>
    </MessageBar>
  ) : null;
  const offerButton = (
    <Button size="large" className={styles.big} onClick={() => setAction('offer')}>
      Offer to a dealer
    </Button>
  );

  // No signal and the lot not opened before on this page: the code from the tag is all there is.
  // A sale can still be recorded; it waits on this device and the server checks it when sent.
  const noSignal =
    (lot.isPending && (lot.fetchStatus === 'paused' || navigator.onLine === false)) ||
    (lot.isError && lot.error instanceof ApiError && lot.error.status === 0);
  if (noSignal)
    return (
      <ScanScreen title={`Lot ${formatLotCode(code)}`} titleId="lot-title">
        <MessageBar intent="warning" layout="multiline">
          <MessageBarBody>
            No signal: the lot’s details cannot be looked up now. You can still record a sale or an offer; it
            waits on this device and is sent when the signal returns, and the server then checks that you hold
            the lot.
          </MessageBarBody>
        </MessageBar>
        {queued ? (
          waitingMessage
        ) : (
          <div className={styles.quick} role="group" aria-label="Quick actions">
            {sellButton}
            {offerButton}
          </div>
        )}
        <Button onClick={() => navigate('/scan')}>Scan the next tag</Button>
        {action === 'sell' ? (
          <RecordSaleDialog code={code} onClose={() => setAction(null)} onQueued={setQueued} />
        ) : null}
        {action === 'offer' ? (
          <OfferDialog code={code} onClose={() => setAction(null)} onQueued={setQueued} />
        ) : null}
      </ScanScreen>
    );
  if (lot.isPending) return <Spinner label="Opening the lot…" />;
  if (lot.isError || !lot.data.held)
    return (
      <ScanScreen>
        <MessageBar intent="warning">
          <MessageBarBody>This is not a lot you hold.</MessageBarBody>
        </MessageBar>
        <Link to="/scan">Scan another tag</Link>
      </ScanScreen>
    );
  const l = lot.data;
  // With no signal for the roll, a sale may still wait on this device; the server checks it when sent.
  const rollOffline = roll.error instanceof ApiError && roll.error.status === 0;
  const canSell = ctx !== null ? may(ctx, 'sold') : rollOffline;
  const canOffer = ctx !== null ? may(ctx, 'transfer-offered') : rollOffline;
  const status = ctx?.state.status ?? l.status;
  return (
    <ScanScreen title={l.title} titleId="lot-title">
      <Card className={styles.card}>
        <Text className={styles.code} aria-label="Lot code">
          {formatLotCode(l.code)}
        </Text>
        <Text>
          Status: {status} · {l.listed ? 'listed (public page)' : 'unlisted (no public page)'}
        </Text>
        <Text>
          Newest entry: entry {l.seq} · {groupRef(l.ref!)}
        </Text>
        {tagRef &&
          (tagRef === l.ref ? (
            <MessageBar intent="success">
              <MessageBarBody>This tag names the newest entry.</MessageBarBody>
            </MessageBar>
          ) : (
            <MessageBar intent="info">
              <MessageBarBody>
                This tag was printed at an earlier entry ({groupRef(tagRef)}). It still checks out on the
                public page; print a new one so buyers see that it is current.
              </MessageBarBody>
            </MessageBar>
          ))}
      </Card>
      {verified && !verified.ok ? (
        <MessageBar intent="error">
          <MessageBarBody>
            This lot’s roll does not verify: open its history before you sell or offer it.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      {sold ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Sold for {formatMoney(sold.price)} on {sold.date}.
            {sold.receiptSent ? ' The buyer’s receipt is on its way.' : ''}
          </MessageBarBody>
        </MessageBar>
      ) : null}
      {waitingMessage}
      {offered ? (
        <MessageBar intent="success">
          <MessageBarBody>Offered. The lot changes hands when the other dealer accepts.</MessageBarBody>
        </MessageBar>
      ) : null}
      <div className={styles.quick} role="group" aria-label="Quick actions">
        {!sold && !offered && !queued && canSell ? sellButton : null}
        {!sold && !offered && !queued && canOffer ? offerButton : null}
        {roll.isPending ? <Spinner size="small" label="Checking the roll…" /> : null}
        <PrintTagsDialog
          lots={[{ code: l.code, listed: Boolean(l.listed) }]}
          triggerLabel="Print a new tag"
        />
        <Button size="large" className={styles.big} as="a" href={`/lots/${l.code}`}>
          History
        </Button>
      </div>
      <div className={styles.actions}>
        {l.listed && (
          <Button as="a" href={`/l/${l.code}`}>
            Public history
          </Button>
        )}
        <Button appearance={sold || offered ? 'primary' : 'secondary'} onClick={() => navigate('/scan')}>
          Scan the next tag
        </Button>
      </div>
      {action === 'sell' ? (
        <RecordSaleDialog
          code={l.code}
          title={l.title}
          onClose={() => setAction(null)}
          onDone={(sale) => {
            setSold(sale);
            void client.invalidateQueries({ queryKey: ['tags', 'lot', code] });
            void client.invalidateQueries({ queryKey: ['lots'] });
          }}
          onQueued={setQueued}
        />
      ) : null}
      {action === 'offer' ? (
        <OfferDialog
          code={l.code}
          title={l.title}
          onClose={() => setAction(null)}
          onDone={() => {
            setOffered(true);
            void client.invalidateQueries({ queryKey: ['tags', 'lot', code] });
            void client.invalidateQueries({ queryKey: ['lots'] });
          }}
          onQueued={setQueued}
        />
      ) : null}
    </ScanScreen>
  );
}
