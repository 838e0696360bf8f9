import { Badge, Card, makeStyles, Spinner, Text, Title2, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { opinionRequestQueries, REQUEST_STATUS } from './opinion-requests.api';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  list: { display: 'grid', gap: tokens.spacingVerticalM, listStyleType: 'none', margin: 0, padding: 0 },
  card: { display: 'grid', gap: tokens.spacingVerticalXS, padding: tokens.spacingHorizontalL },
  code: { fontFamily: tokens.fontFamilyMonospace },
  sub: { color: tokens.colorNeutralForeground3 },
});

/** An assessor's start page: the requests for an opinion that wait for them, then the answered ones. */
export function AssessorQueue() {
  const styles = useStyles();
  const queue = useQuery(opinionRequestQueries.box('received'));
  const open = (queue.data?.items ?? []).filter((r) => r.status === 'open');
  const closed = (queue.data?.items ?? []).filter((r) => r.status !== 'open');
  return (
    <section className={styles.page} aria-labelledby="queue-title">
      <Title2 as="h1" id="queue-title">
        Opinions asked of you
      </Title2>
      {queue.isPending ? (
        <Spinner label="Loading your queue…" />
      ) : queue.isError ? (
        <Text>Your queue could not be loaded. Please try again.</Text>
      ) : open.length === 0 ? (
        <Text>No dealer is waiting for your opinion just now.</Text>
      ) : null}
      {open.length ? (
        <ul className={styles.list} aria-label="Waiting for your opinion">
          {open.map((r) => (
            <li key={r.id}>
              <Card className={styles.card}>
                <Link to={`/lots/${r.lot.code}`}>
                  <Text weight="semibold">{r.lot.title || 'Untitled lot'}</Text>
                </Link>
                <Text className={styles.code}>{r.lot.displayCode}</Text>
                <Text>
                  Asked by {r.requester.displayName} ({r.requester.business}),{' '}
                  {r.assessor ? 'of you by name' : 'of any verified assessor'}, on{' '}
                  {new Date(r.createdAt).toLocaleDateString()}.
                </Text>
                {r.note ? <Text>“{r.note}”</Text> : null}
                <Text size={200} className={styles.sub}>
                  {r.lot.listed
                    ? 'Open the lot and record your opinion there.'
                    : 'Unlisted: you can read it now; your opinion goes on its roll once the holder lists it.'}
                </Text>
              </Card>
            </li>
          ))}
        </ul>
      ) : null}
      {closed.length ? (
        <>
          <Text weight="semibold">Earlier requests</Text>
          <ul className={styles.list} aria-label="Earlier requests">
            {closed.map((r) => (
              <li key={r.id}>
                <Text>
                  {r.lot.title} ({r.lot.displayCode}) ·{' '}
                  <Badge appearance="outline">{REQUEST_STATUS[r.status]}</Badge>
                </Text>
              </li>
            ))}
          </ul>
        </>
      ) : null}
    </section>
  );
}
