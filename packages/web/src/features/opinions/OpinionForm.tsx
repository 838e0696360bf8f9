import { CheckGroup } from '../../common/ui/CheckGroup';
import {
  Button,
  Checkbox,
  Field,
  Input,
  makeStyles,
  Subtitle1,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  LIMITS,
  attributionAid,
  CONFIDENCES,
  ORIGINS,
  QUALIFIERS,
  TECHNIQUES,
  type Confidence,
  type Decoration,
  type ExhibitAddedBody,
  type Observations,
  type Origin,
  type Qualifier,
  type Technique,
  yearProblem,
} from '@beadroll/core';
import { useMemo, useRef, useState } from 'react';
import { focusFirstError } from '../../common/ui/focus-first-error';
import { fieldError, FormError, TextField } from '../../common/ui/FormPage';
import { type BoundField, useFormValues } from '../../common/ui/form-values';
import { SelectField } from '../../common/ui/SelectField';
import { lotsQueries, type RawRoll } from '../lots/lots.api';
import { AidPanel } from './AidPanel';
import { opinionsApi, type OpinionWrite } from './opinions.api';
import { CONFIDENCE_LABELS, ORIGIN_LABELS, QUALIFIER_LABELS, TECHNIQUE_LABELS } from './words';

const RATIONALE_MAX = LIMITS.longText;

const useStyles = makeStyles({
  root: {
    display: 'grid',
    gap: tokens.spacingHorizontalXXL,
    gridTemplateColumns: 'minmax(0, 3fr) minmax(0, 2fr)',
    '@media (max-width: 800px)': { gridTemplateColumns: 'minmax(0, 1fr)' },
  },
  form: { display: 'grid', gap: tokens.spacingVerticalM, alignContent: 'start' },
  row: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'end' },
  year: { width: '8rem' },
  yearInput: { minWidth: 0, width: '100%' },
  actions: { display: 'flex', gap: tokens.spacingHorizontalM },
});

interface ExhibitChoice {
  sha256: string;
  label: string;
}

/** The exhibits on the roll that an opinion can cite (named by the SHA-256 of the original). */
function exhibitsOnRoll(roll: RawRoll): ExhibitChoice[] {
  const out: ExhibitChoice[] = [];
  for (const e of roll.entries) {
    if (e.kind !== 'exhibit-added' || !e.body) continue;
    const b = JSON.parse(e.body) as ExhibitAddedBody;
    if (!('exhibit' in b)) continue;
    const caption = b.exhibit.caption ? `: ${b.exhibit.caption}` : '';
    out.push({ sha256: b.exhibit.original.sha256, label: `Entry ${e.seq}, ${b.exhibit.kind}${caption}` });
  }
  return out;
}

/** A year of the period, in a narrow box with a number keyboard. */
function YearField({ label, value, onChange, validationMessage }: BoundField & { label: string }) {
  const styles = useStyles();
  return (
    <Field label={label} required className={styles.year} validationMessage={validationMessage}>
      <Input
        className={styles.yearInput}
        inputMode="numeric"
        value={value}
        onChange={(_, d) => onChange(d.value)}
      />
    </Field>
  );
}

function yearOrNull(text: string): number | null {
  return /^-?\d{1,4}$/.test(text.trim()) ? Number(text.trim()) : null;
}

/**
 * The opinion form: origin, period, technique, decoration, qualifier, confidence, rationale and
 * cited exhibits. The attribution aid runs in the browser as the fields change, so its
 * plausibility warnings show before the opinion is recorded.
 */
export function OpinionForm({
  code,
  observations,
  decoration,
  onDone,
}: {
  code: string;
  observations: Observations | null;
  decoration: Decoration[];
  onDone?: (r: OpinionWrite) => void;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const form = useFormValues({
    origin: 'unknown' as Origin,
    originNote: '',
    from: '',
    to: '',
    technique: 'wound-lampwork' as Technique,
    decoration: '',
    qualifier: 'attributed-to' as Qualifier,
    confidence: 'medium' as Confidence,
    rationale: '',
  });
  const { origin, originNote, from, to, technique, decoration: decorationText, rationale } = form.values;
  const [approximate, setApproximate] = useState(true);
  const [cited, setCited] = useState<string[]>([]);
  const formRef = useRef<HTMLFormElement>(null);
  const exhibits = useQuery({ ...lotsQueries.roll(code), select: exhibitsOnRoll });

  const fromYear = yearOrNull(from);
  const toYear = yearOrNull(to);
  const aid = useMemo(
    () =>
      attributionAid({
        observations: observations ?? undefined,
        decoration,
        words: [originNote, decorationText, rationale, observations?.note ?? ''],
        draft: {
          origin,
          technique,
          period: fromYear !== null && toYear !== null ? { from: fromYear, to: toYear } : undefined,
        },
      }),
    [observations, decoration, origin, technique, fromYear, toYear, originNote, decorationText, rationale],
  );
  const thisYear = new Date().getUTCFullYear();
  const periodProblem =
    fromYear !== null && toYear !== null && fromYear > toYear
      ? 'The period ends before it starts.'
      : undefined;

  const record = useMutation({
    mutationFn: () =>
      opinionsApi.record(code, {
        origin,
        ...(originNote.trim() ? { originNote: originNote.trim() } : {}),
        period: { from: fromYear ?? Number.NaN, to: toYear ?? Number.NaN, approximate },
        technique,
        ...(decorationText.trim() ? { decoration: decorationText.trim() } : {}),
        qualifier: form.values.qualifier,
        confidence: form.values.confidence,
        rationale,
        exhibits: cited,
      }),
    onSuccess: async (r) => {
      await client.invalidateQueries({ queryKey: ['lots'] });
      onDone?.(r);
    },
    onError: () => focusFirstError(formRef.current),
  });
  const err = record.error;
  const field = form.bind(err);
  const yearMessage = (field: 'period.from' | 'period.to', value: string) =>
    fieldError(err, field) ??
    (value !== '' ? (yearProblem(yearOrNull(value), thisYear) ?? undefined) : undefined);
  const yearField = (end: 'from' | 'to'): BoundField => ({
    value: form.values[end],
    onChange: (v) => form.set(end, v),
    validationMessage:
      (end === 'to' ? periodProblem : undefined) ?? yearMessage(`period.${end}`, form.values[end]),
  });
  const localProblem =
    periodProblem ??
    (from !== '' && yearProblem(fromYear, thisYear)) ??
    (to !== '' && yearProblem(toYear, thisYear));

  return (
    <div className={styles.root}>
      <form
        ref={formRef}
        className={styles.form}
        noValidate
        aria-labelledby="opinion-form-title"
        onSubmit={(e) => {
          e.preventDefault();
          if (!localProblem) record.mutate();
          else focusFirstError(formRef.current);
        }}
      >
        <Subtitle1 as="h2" id="opinion-form-title">
          Record an opinion
        </Subtitle1>
        <SelectField label="Origin" required options={ORIGINS} labels={ORIGIN_LABELS} {...field('origin')} />
        <Field
          label="Origin in your own words"
          hint={origin === 'other' ? 'Say where.' : 'Optional: a town, a workshop, a region.'}
          validationMessage={fieldError(err, 'originNote')}
        >
          <Input
            value={originNote}
            maxLength={LIMITS.shortText}
            onChange={(_, d) => form.set('originNote', d.value)}
          />
        </Field>
        <div className={styles.row}>
          <YearField label="From year" {...yearField('from')} />
          <YearField label="To year" {...yearField('to')} />
          <Checkbox
            label="Approximate years"
            checked={approximate}
            onChange={(_, d) => setApproximate(d.checked === true)}
          />
        </div>
        <SelectField
          label="Technique"
          required
          options={TECHNIQUES}
          labels={TECHNIQUE_LABELS}
          {...field('technique')}
        />
        <TextField label="Decoration" {...field('decoration')} />
        <SelectField
          label="Certainty"
          required
          hint="As in a catalogue: by, attributed to, in the style of, or a later copy."
          options={QUALIFIERS}
          labels={QUALIFIER_LABELS}
          {...field('qualifier')}
        />
        <SelectField
          label="Confidence"
          required
          options={CONFIDENCES}
          labels={CONFIDENCE_LABELS}
          {...field('confidence')}
        />
        <Field
          label="Rationale"
          hint={`${rationale.length} of ${RATIONALE_MAX} characters. Plain text: the clues, the references, the reasoning.`}
          validationMessage={fieldError(err, 'rationale')}
        >
          <Textarea
            value={rationale}
            resize="vertical"
            rows={5}
            maxLength={RATIONALE_MAX}
            onChange={(_, d) => form.set('rationale', d.value)}
          />
        </Field>
        <CheckGroup
          label="Cited exhibits"
          hint="Exhibits on this lot’s roll. Add your own evidence to the lot first to cite it."
          validationMessage={fieldError(err, 'exhibits')}
        >
          {exhibits.data && exhibits.data.length > 0 ? (
            <div>
              {exhibits.data.map((x) => (
                <Checkbox
                  key={x.sha256}
                  label={x.label}
                  checked={cited.includes(x.sha256)}
                  onChange={(_, d) =>
                    setCited((c) => (d.checked ? [...c, x.sha256] : c.filter((s) => s !== x.sha256)))
                  }
                />
              ))}
            </div>
          ) : (
            <Text>No exhibits on this lot’s roll yet.</Text>
          )}
        </CheckGroup>
        {aid.warnings.length > 0 && (
          <Text role="status">
            The aid has {aid.warnings.length} plausibility{' '}
            {aid.warnings.length === 1 ? 'warning' : 'warnings'} about this period: read{' '}
            {aid.warnings.length === 1 ? 'it' : 'them'} before recording.
          </Text>
        )}
        <FormError error={err} />
        <div className={styles.actions}>
          <Button appearance="primary" type="submit" disabled={record.isPending}>
            Record opinion
          </Button>
        </div>
      </form>
      <AidPanel result={aid} />
    </div>
  );
}
