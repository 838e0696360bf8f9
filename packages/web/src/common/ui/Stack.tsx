import { makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import type { HTMLAttributes } from 'react';

const useStyles = makeStyles({
  stack: { display: 'grid' },
  S: { gap: tokens.spacingVerticalS },
  M: { gap: tokens.spacingVerticalM },
  L: { gap: tokens.spacingVerticalL },
});

/** Blocks one under another with the theme's space between them (`gap`, medium unless told). */
export function Stack({
  gap = 'M',
  className,
  ...rest
}: { gap?: 'S' | 'M' | 'L' } & HTMLAttributes<HTMLDivElement>) {
  const styles = useStyles();
  return <div className={mergeClasses(styles.stack, styles[gap], className)} {...rest} />;
}
