import {
  Link,
  makeStyles,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  Subtitle2,
  Text,
  tokens,
} from '@fluentui/react-components';
import type { AidResult, AidSource } from '@beadroll/core';
import { UvACaution } from '../safety/UvACaution';
import { ORIGIN_LABELS, TECHNIQUE_LABELS } from './words';

const useStyles = makeStyles({
  root: { display: 'grid', gap: tokens.spacingVerticalM },
  list: {
    margin: 0,
    paddingInlineStart: tokens.spacingHorizontalXL,
    display: 'grid',
    gap: tokens.spacingVerticalS,
  },
  sources: { color: tokens.colorNeutralForeground3 },
  disclaimer: {
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground3,
  },
});

const STANDING_WORDS: Record<AidSource['standing'], string> = {
  museum: 'museum',
  standard: 'standards or safety body',
  scholar: 'bead scholar',
  'trade-page': 'trade page',
  'common-practice': 'trade practice',
  'from-memory': 'from memory, unchecked',
};

/** Sources of one rule: museums and standards bodies first (core already orders them). */
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

/**
 * What the attribution aid makes of the clues and the draft: ranked indications with their
 * reasons and sources, plausibility warnings, and the safety cautions that apply.
 */
export function AidPanel({ result }: { result: AidResult }) {
  const styles = useStyles();
  const otherCautions = result.cautions.filter((c) => c.rule !== 'uv-a-torch');
  const uv = result.cautions.some((c) => c.rule === 'uv-a-torch');
  return (
    <section className={styles.root} aria-labelledby="aid-title">
      <Subtitle2 as="h3" id="aid-title">
        Attribution aid
      </Subtitle2>
      <Text block className={styles.disclaimer} role="note">
        {result.disclaimer}
      </Text>
      {result.warnings.length > 0 && (
        <div aria-label="Plausibility warnings">
          {result.warnings.map((w) => (
            <MessageBar key={w.rule} intent="warning" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>
                  {w.wholePeriod ? 'The whole period is too early' : 'The period starts too early'}
                </MessageBarTitle>
                <Text block>
                  {w.message} (not before {w.notBefore})
                </Text>
                <Sources sources={w.sources} />
              </MessageBarBody>
            </MessageBar>
          ))}
        </div>
      )}
      {result.indications.length === 0 ? (
        <Text>No clue recorded on this lot points anywhere yet. Record observations to get indications.</Text>
      ) : (
        <ol className={styles.list} aria-label="Indications">
          {result.indications.map((ind) => (
            <li key={`${ind.origin ?? ''}${ind.technique ?? ''}`}>
              <Text weight="semibold">
                {ind.origin ? ORIGIN_LABELS[ind.origin] : TECHNIQUE_LABELS[ind.technique!]}
              </Text>{' '}
              <Text size={200}>(weight {ind.score})</Text>
              {ind.reasons.map((r) => (
                <div key={r.rule}>
                  <Text block>{r.text}</Text>
                  <Sources sources={r.sources} />
                </div>
              ))}
            </li>
          ))}
        </ol>
      )}
      {(uv || otherCautions.length > 0) && (
        <div aria-label="Cautions">
          {uv && <UvACaution />}
          {otherCautions.map((c) => (
            <MessageBar key={c.rule} intent="warning" layout="multiline">
              <MessageBarBody>
                <Text block>{c.text}</Text>
                <Sources sources={c.sources} />
              </MessageBarBody>
            </MessageBar>
          ))}
        </div>
      )}
    </section>
  );
}
