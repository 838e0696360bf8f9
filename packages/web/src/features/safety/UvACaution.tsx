import { uvCaution } from '@beadroll/core';
import {
  Link,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  makeStyles,
  tokens,
} from '@fluentui/react-components';

const useStyles = makeStyles({
  list: { margin: 0, paddingInlineStart: tokens.spacingHorizontalXL },
  sources: { marginBlockStart: tokens.spacingVerticalXS, fontSize: tokens.fontSizeBase200 },
});

/** The one caution shown wherever a dealer works with an ultraviolet lamp; its words and sources come from core. */
export function UvACaution() {
  const styles = useStyles();
  const caution = uvCaution();
  return (
    <MessageBar intent="warning" layout="multiline" aria-label="Caution: ultraviolet light">
      <MessageBarBody>
        <MessageBarTitle>Working with ultraviolet light</MessageBarTitle>
        <ul className={styles.list}>
          {caution.points.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
        <details className={styles.sources}>
          <summary>Sources</summary>
          <ul className={styles.list}>
            {caution.sources.map((s) => (
              <li key={s.title}>
                {s.url ? (
                  <Link href={s.url} target="_blank" rel="noreferrer">
                    {s.title}
                  </Link>
                ) : (
                  s.title
                )}
              </li>
            ))}
          </ul>
        </details>
      </MessageBarBody>
    </MessageBar>
  );
}
