import { makeStyles, tokens } from '@fluentui/react-components';
import { Fragment, type ReactNode } from 'react';

const useStyles = makeStyles({
  facts: {
    display: 'grid',
    gridTemplateColumns: 'minmax(8rem, max-content) minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    margin: 0,
    '@media (max-width: 480px)': { gridTemplateColumns: 'minmax(0, 1fr)' },
  },
  term: { color: tokens.colorNeutralForeground3 },
  detail: { margin: 0, whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' },
});

/** One fact: its name and what it is. A row that is `false` or `null` is left out. */
export type Fact = readonly [string, ReactNode];

/**
 * Named facts as a definition list, names beside values (above them on a phone). Each name
 * appears once; a value keeps the line breaks it was written with.
 */
export function Facts({ rows }: { rows: ReadonlyArray<Fact | false | null | undefined> }) {
  const styles = useStyles();
  return (
    <dl className={styles.facts}>
      {rows.map((row) =>
        row ? (
          <Fragment key={row[0]}>
            <dt className={styles.term}>{row[0]}</dt>
            <dd className={styles.detail}>{row[1]}</dd>
          </Fragment>
        ) : null,
      )}
    </dl>
  );
}
