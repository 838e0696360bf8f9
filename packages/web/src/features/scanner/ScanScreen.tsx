import { Title1, makeStyles, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { OutboxPanel } from '../outbox/OutboxPanel';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '40rem' },
});

/**
 * A phone-width screen of the scanner: the writes waiting for a signal, then the heading, then
 * the content. Without a title it is only the frame (a short message on its own).
 */
export function ScanScreen({
  title,
  titleId,
  children,
}: {
  title?: ReactNode;
  titleId?: string;
  children: ReactNode;
}) {
  const styles = useStyles();
  return (
    <section className={styles.page} aria-labelledby={title ? titleId : undefined}>
      {title ? (
        <>
          <OutboxPanel />
          <Title1 as="h1" id={titleId}>
            {title}
          </Title1>
        </>
      ) : null}
      {children}
    </section>
  );
}
