import { Link, makeStyles, Text, tokens } from '@fluentui/react-components';
import type { AidSource } from '@beadroll/core';

const useStyles = makeStyles({
  sources: { color: tokens.colorNeutralForeground3 },
});

/** How much a source counts for, in words beside it. */
export const STANDING_WORDS: Record<AidSource['standing'], string> = {
  museum: 'museum',
  standard: 'standards or safety body',
  scholar: 'bead scholar',
  'trade-page': 'trade page',
  'student-page': 'student web page',
  'common-practice': 'trade practice',
  'from-memory': 'from memory, unchecked',
};

/** Sources of one fact, beside it: museums and standards bodies first (core already orders them). */
export function Sources({ sources }: { sources: AidSource[] }) {
  const styles = useStyles();
  return (
    <Text block size={200} className={styles.sources}>
      Sources:{' '}
      {sources.map((s, i) => (
        <span key={`${s.title}-${i}`}>
          {i > 0 ? '; ' : ''}
          {s.url ? (
            <Link href={s.url} target="_blank" rel="noreferrer">
              {s.title}
            </Link>
          ) : (
            s.title
          )}{' '}
          ({STANDING_WORDS[s.standing]})
        </span>
      ))}
    </Text>
  );
}
