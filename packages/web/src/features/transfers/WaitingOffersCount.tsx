import { CounterBadge, makeStyles, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useSession } from '../accounts/accounts.api';
import { offersQuery } from './transfers.api';

const useStyles = makeStyles({ badge: { marginInlineStart: tokens.spacingHorizontalXS } });

/** The number of offers waiting for the signed-in dealer's answer, beside "Incoming". */
export function WaitingOffersCount() {
  const styles = useStyles();
  const { account } = useSession();
  const waiting = useQuery({
    ...offersQuery('incoming', 'open', 1, 1),
    enabled: account?.role === 'dealer',
    refetchInterval: 60_000,
  });
  const n = waiting.data?.total ?? 0;
  if (n === 0) return null;
  return (
    <CounterBadge
      className={styles.badge}
      count={n}
      overflowCount={99}
      size="small"
      color="danger"
      aria-label={`${n} waiting`}
    />
  );
}
