import { safetyCautions, type Observations } from '@beadroll/core';
import { Field, makeStyles, mergeClasses, Text, Textarea, tokens } from '@fluentui/react-components';
import { SafetyCautions } from '../safety/SafetyCautions';
import { UvACaution } from '../safety/UvACaution';
import { ClueIcon } from './ClueIcon';
import { HINT_MARK, OBSERVATION_QUESTIONS } from './labels';

/** Cautions the checklist shows as the clues are chosen: handling uranium glass, lead in glass. */
const CHECKLIST_CAUTIONS = ['uranium-handling', 'lead-glass'];

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
  mark: { color: tokens.colorNeutralForeground3, fontStyle: 'italic' },
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
 * The physical clues as quick choices, each with a one-line explanation (marked on screen as
 * common practice, no source) and a drawing. Leaving a clue unanswered records nothing for it.
 * The UV caution stands before the UV choices, so it is read before testing; a green glow brings
 * the uranium handling caution, and lead glass or crystal named in the note (or suggested by
 * the clues) the lead caution.
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
  const cautions = safetyCautions({ observations: value, words: value.note ? [value.note] : [] }).filter(
    (c) => CHECKLIST_CAUTIONS.includes(c.rule),
  );
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
            {q.key === 'uvA' ? <UvACaution /> : null}
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
            <Text size={200} className={styles.mark}>
              Hints: {HINT_MARK}.
            </Text>
            {q.key === 'uvA' ? (
              <SafetyCautions
                cautions={cautions.filter((c) => c.rule === 'uranium-handling')}
                label="Handling cautions"
              />
            ) : null}
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
      <SafetyCautions cautions={cautions.filter((c) => c.rule !== 'uranium-handling')} label="Lead caution" />
    </div>
  );
}
