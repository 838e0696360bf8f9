import { makeStyles, mergeClasses, Title2, tokens } from '@fluentui/react-components';
import { useId, type ReactNode } from 'react';

const useStyles = makeStyles({
  page: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalL },
  narrow: { maxWidth: '720px' },
  medium: { maxWidth: '960px' },
  head: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  grow: { flexGrow: 1 },
});

/**
 * A signed-in page: its heading (the page's one h1, naming the section) with any buttons beside
 * it, then the content. `width` keeps a form or a text from stretching across a wide screen.
 */
export function Page({
  title,
  actions,
  width,
  headingId,
  children,
}: {
  title: ReactNode;
  /** A fixed id for the heading, where something links to it; otherwise one is made up. */
  headingId?: string;
  actions?: ReactNode;
  width?: 'narrow' | 'medium';
  children: ReactNode;
}) {
  const styles = useStyles();
  const madeId = useId();
  const id = headingId ?? madeId;
  const heading = (
    <Title2 as="h1" id={id} className={actions ? styles.grow : undefined}>
      {title}
    </Title2>
  );
  return (
    <section className={mergeClasses(styles.page, width && styles[width])} aria-labelledby={id}>
      {actions ? (
        <div className={styles.head}>
          {heading}
          {actions}
        </div>
      ) : (
        heading
      )}
      {children}
    </section>
  );
}
