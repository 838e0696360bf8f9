import {
  Button,
  Card,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  Title1,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { formatLotCode } from '@beadroll/core';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import { scannerQueries } from './scanner.api';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '40rem' },
  card: { display: 'grid', gap: tokens.spacingVerticalS, padding: tokens.spacingHorizontalL },
  code: { fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase500 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
});

function groupRef(ref: string): string {
  return `${ref.slice(0, 5)}-${ref.slice(5)}`;
}

/** A lot the dealer just scanned (or typed), with the actions a fair stand needs. */
export function ScannedLotPage() {
  const styles = useStyles();
  const { code = '' } = useParams();
  const [params] = useSearchParams();
  const tagRef = params.get('ref');
  const navigate = useNavigate();
  const lot = useQuery(scannerQueries.lot(code));

  if (lot.isPending) return <Spinner label="Opening the lot…" />;
  if (lot.isError || !lot.data.held)
    return (
      <section className={styles.page}>
        <MessageBar intent="warning">
          <MessageBarBody>This is not a lot you hold.</MessageBarBody>
        </MessageBar>
        <Link to="/scan">Scan another tag</Link>
      </section>
    );
  const l = lot.data;
  return (
    <section className={styles.page} aria-labelledby="lot-title">
      <Title1 as="h1" id="lot-title">
        {l.title}
      </Title1>
      <Card className={styles.card}>
        <Text className={styles.code} aria-label="Lot code">
          {formatLotCode(l.code)}
        </Text>
        <Text>
          Status: {l.status} · {l.listed ? 'listed (public page)' : 'unlisted (no public page)'}
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
      <div className={styles.actions}>
        <PrintTagsDialog
          lots={[{ code: l.code, listed: Boolean(l.listed) }]}
          triggerLabel="Print a new tag"
        />
        {l.listed && (
          <Button as="a" href={`/l/${l.code}`}>
            Public history
          </Button>
        )}
        <Button appearance="primary" onClick={() => navigate('/scan')}>
          Scan the next tag
        </Button>
      </div>
    </section>
  );
}
