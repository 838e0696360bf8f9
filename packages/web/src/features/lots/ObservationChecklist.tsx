import type { Observations } from '@beadroll/core';
import { Field, makeStyles, mergeClasses, Text, Textarea, tokens } from '@fluentui/react-components';
import { UvACaution } from '../safety/UvACaution';
import { ClueIcon } from './ClueIcon';
import { OBSERVATION_QUESTIONS } from './labels';

const useStyles = makeStyles({
  list: { display: 'grid', gap: tokens.spacingVerticalL },
  group: {
    border: 'none',
    margin: 0,
    padding: 0,
    display: 'grid',
    gap: tokens.spacingVerticalS,
    minWidth: 0,
  },
  legend: { fontWeight: tokens.fontWeightSemibold, paddingBlockEnd: tokens.spacingVerticalXS },
  choices: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fill, minmax(13rem, 1fr))',
    gap: tokens.spacingHorizontalS,
  },
  choice: {
    position: 'relative',
    display: 'flex',
    alignItems: 'flex-start',
    gap: tokens.spacingHorizontalS,
    padding: tokens.spacingHorizontalS,
    borderRadius: tokens.borderRadiusMedium,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    cursor: 'pointer',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
    ':focus-within': { outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}` },
  },
  chosen: {
    border: `${tokens.strokeWidthThick} solid ${tokens.colorBrandStroke1}`,
    backgroundColor: tokens.colorBrandBackground2,
  },
  radio: { position: 'absolute', opacity: 0, width: '1px', height: '1px', margin: 0 },
  words: { display: 'grid', gap: tokens.spacingVerticalXXS },
  hint: { color: tokens.colorNeutralForeground3 },
  clear: {
    justifySelf: 'start',
    background: 'none',
    border: 'none',
    padding: 0,
    color: tokens.colorBrandForegroundLink,
    textDecorationLine: 'underline',
    cursor: 'pointer',
    fontSize: tokens.fontSizeBase200,
  },
});

/**
 * The physical clues as quick choices, each with a one-line explanation and a drawing. Leaving
 * a clue unanswered records nothing for it. Choosing a UV-A result shows the UV caution.
 */
export function ObservationChecklist({
  value,
  onChange,
  idPrefix = 'obs',
  error,
}: {
  value: Observations;
  onChange: (next: Observations) => void;
  idPrefix?: string;
  /** The server's reasons, by field name under `observations`. */
  error?: (field: string) => string | undefined;
}) {
  const styles = useStyles();
  const set = (key: keyof Observations, v: string | undefined) => {
    const next = { ...value } as Record<string, string>;
    if (v === undefined) delete next[key];
    else next[key] = v;
    onChange(next as Observations);
  };
  const uvTested = value.uvA !== undefined && value.uvA !== 'not-tested';
  return (
    <div className={styles.list}>
      {OBSERVATION_QUESTIONS.map((q) => {
        const name = `${idPrefix}-${q.key}`;
        const problem = error?.(q.key);
        return (
          <fieldset
            key={q.key}
            className={styles.group}
            aria-describedby={problem ? `${name}-error` : undefined}
            data-invalid={problem ? 'true' : undefined}
          >
            <legend className={styles.legend}>{q.label}</legend>
            <div className={styles.choices}>
              {q.choices.map((c) => {
                const checked = value[q.key] === c.value;
                return (
                  <label key={c.value} className={mergeClasses(styles.choice, checked && styles.chosen)}>
                    <input
                      type="radio"
                      className={styles.radio}
                      name={name}
                      value={c.value}
                      checked={checked}
                      onChange={() => set(q.key, c.value)}
                    />
                    <ClueIcon question={q.key} value={c.value} />
                    <span className={styles.words}>
                      <Text weight="semibold">{c.label}</Text>
                      <Text size={200} className={styles.hint}>
                        {c.hint}
                      </Text>
                    </span>
                  </label>
                );
              })}
            </div>
            {value[q.key] !== undefined ? (
              <button type="button" className={styles.clear} onClick={() => set(q.key, undefined)}>
                Clear “{q.label.toLowerCase()}” (not recorded)
              </button>
            ) : null}
            {q.key === 'uvA' && uvTested ? <UvACaution /> : null}
            {problem ? (
              <Text id={`${name}-error`} role="alert">
                {problem}
              </Text>
            ) : null}
          </fieldset>
        );
      })}
      <Field label="Anything else you noticed" validationMessage={error?.('note')}>
        <Textarea
          value={value.note ?? ''}
          onChange={(_, d) => {
            const next = { ...value };
            if (d.value) next.note = d.value;
            else delete next.note;
            onChange(next);
          }}
          resize="vertical"
        />
      </Field>
    </div>
  );
}
