import {
  makeStyles,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  Subtitle2,
  Text,
  tokens,
} from '@fluentui/react-components';
import type { AidResult, Indication } from '@beadroll/core';
import { SafetyCautions } from '../safety/SafetyCautions';
import { Sources } from '../safety/Sources';
import { UvACaution } from '../safety/UvACaution';
import { ORIGIN_LABELS, QUALIFIER_LABELS, TECHNIQUE_LABELS } from './words';

function indicationLabel(ind: Indication): string {
  if (ind.origin) return ORIGIN_LABELS[ind.origin];
  if (ind.technique) return TECHNIQUE_LABELS[ind.technique];
  return ind.qualifier === 'later-copy' ? 'Later work in an older style' : QUALIFIER_LABELS[ind.qualifier!];
}

const useStyles = makeStyles({
  root: { display: 'grid', gap: tokens.spacingVerticalM },
  list: {
    margin: 0,
    paddingInlineStart: tokens.spacingHorizontalXL,
    display: 'grid',
    gap: tokens.spacingVerticalS,
  },
  disclaimer: {
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground3,
  },
});

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
                  {w.clueIsHint
                    ? w.wholePeriod
                      ? 'The whole period may be too early'
                      : 'The period may start too early'
                    : w.wholePeriod
                      ? 'The whole period is too early'
                      : 'The period starts too early'}
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
            <li key={`${ind.origin ?? ''}${ind.technique ?? ''}${ind.qualifier ?? ''}`}>
              <Text weight="semibold">{indicationLabel(ind)}</Text>{' '}
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
          <SafetyCautions cautions={otherCautions} />
        </div>
      )}
    </section>
  );
}
