import { LIMITS, BASE_GLASS, DECORATIONS, LOT_FORMS, safetyCautions } from '@beadroll/core';
import {
  Button,
  Checkbox,
  Field,
  Input,
  Link,
  makeStyles,
  Radio,
  RadioGroup,
  Switch,
  Text,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { useState, type ReactNode } from 'react';
import { CheckGroup } from '../../common/ui/CheckGroup';
import { NoteField, TextField } from '../../common/ui/FormPage';
import type { BoundField } from '../../common/ui/form-values';
import { SafetyCautions } from '../safety/SafetyCautions';
import { BASE_GLASS_LABEL, DECORATION_LABEL, FORM_LABEL, inchesOf, MM_PER_INCH } from './labels';
import { estimateBeads, inchesToMm, type LotDraft } from './lot-draft';
import { MoneyField } from '../../common/ui/MoneyField';
import { PrivateMark } from './PrivateMark';

const useStyles = makeStyles({
  section: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    margin: 0,
    minWidth: 0,
  },
  private: {
    border: `${tokens.strokeWidthThick} dashed ${tokens.colorPaletteMarigoldBorder2}`,
    backgroundColor: tokens.colorPaletteMarigoldBackground1,
  },
  row: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fit, minmax(11rem, 1fr))',
    gap: tokens.spacingHorizontalM,
    alignItems: 'start',
  },
  checks: { display: 'flex', flexWrap: 'wrap', columnGap: tokens.spacingHorizontalM },
  // Fluent's horizontal radio group keeps to one line; five forms do not fit a phone.
  choices: { flexWrap: 'wrap' },
  source: { color: tokens.colorNeutralForeground3, flexBasis: '100%' },
  helper: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    padding: tokens.spacingHorizontalS,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground3,
  },
  lead: { color: tokens.colorNeutralForeground3 },
});

export type Change = <K extends keyof LotDraft>(key: K, value: LotDraft[K]) => void;
export type ErrorOf = (field: string) => string | undefined;

/** What each group of the form's sections edits: the draft, its setter and the reasons against it. */
interface DraftProps {
  draft: LotDraft;
  change: Change;
  error: ErrorOf;
}

/** The draft's parts that a text field edits. */
type TextPart = { [K in keyof LotDraft]: LotDraft[K] extends string ? K : never }[keyof LotDraft];

/**
 * Binds text fields to the draft: `field(part, path)` gives a field its value from the draft, its
 * setter, and the server's reason against the request field at `path`.
 */
function draftFields(draft: LotDraft, change: Change, error: ErrorOf) {
  return (part: TextPart, path: string): BoundField => ({
    value: draft[part],
    onChange: (v) => change(part, v),
    validationMessage: error(path),
  });
}

/** One titled section of the form. */
export function Section({
  id,
  title,
  lead,
  privateSection,
  children,
}: {
  id: string;
  title: string;
  lead?: ReactNode;
  privateSection?: boolean;
  children: ReactNode;
}) {
  const styles = useStyles();
  return (
    <section
      className={privateSection ? `${styles.section} ${styles.private}` : styles.section}
      aria-labelledby={`${id}-title`}
    >
      <Title3 as="h2" id={`${id}-title`}>
        {title}
      </Title3>
      {privateSection ? <PrivateMark /> : null}
      {lead ? <Text className={styles.lead}>{lead}</Text> : null}
      {children}
    </section>
  );
}

function toggle<T>(list: T[], item: T, on: boolean): T[] {
  return on ? [...list.filter((x) => x !== item), item] : list.filter((x) => x !== item);
}

/** A length typed as a decimal number, its unit shown after it. */
function MeasureField({
  label,
  hint,
  unit = 'mm',
  value,
  onChange,
  validationMessage,
}: {
  label: string;
  hint?: string;
  unit?: 'mm' | 'in';
  value: string;
  onChange: (v: string) => void;
  validationMessage?: string;
}) {
  return (
    <Field label={label} hint={hint} validationMessage={validationMessage}>
      <Input
        inputMode="decimal"
        value={value}
        contentAfter={<Text size={200}>{unit}</Text>}
        onChange={(_, d) => onChange(d.value)}
      />
    </Field>
  );
}

/** Any number of values from a fixed list, one checkbox each, in the order ticked. */
function ChecksField<T extends string>({
  label,
  options,
  labels,
  value,
  onChange,
  validationMessage,
}: {
  label: string;
  options: readonly T[];
  labels: Record<T, string>;
  value: T[];
  onChange: (v: T[]) => void;
  validationMessage?: string;
}) {
  const styles = useStyles();
  return (
    <CheckGroup label={label} className={styles.checks} validationMessage={validationMessage}>
      {options.map((o) => (
        <Checkbox
          key={o}
          label={labels[o]}
          checked={value.includes(o)}
          onChange={(_, d) => onChange(toggle(value, o, d.checked === true))}
        />
      ))}
    </CheckGroup>
  );
}

function inchesHint(mm: string): string | undefined {
  const n = Number(mm.replace(',', '.'));
  return mm.trim() && Number.isFinite(n) && n > 0 ? `= ${inchesOf(n)} in` : undefined;
}

/** Where the count helper's formula comes from, shown beside it. */
function CountSource() {
  const styles = useStyles();
  return (
    <Text block size={200} className={styles.source}>
      Formula from the trade pages “How Many Beads in a Strand” (
      <Link
        href="https://www.wirejewelry.com/jewelry_making_tips_techniques/How-Many-Beads-in-a-Strand_416.html"
        target="_blank"
        rel="noreferrer"
      >
        WireJewelry.com
      </Link>
      ) and “How many beads per inch?” (
      <Link href="https://artbeads.com/how-many-beads-per-inch/" target="_blank" rel="noreferrer">
        Artbeads
      </Link>
      ): length in inches × 25.4 ÷ bead size along the string in mm.
    </Text>
  );
}

/** The public description: what it is, size and count, look, condition. */
export function DescriptionSections({ draft, change, error }: DraftProps) {
  const styles = useStyles();
  const field = draftFields(draft, change, error);
  const size = Number(draft.diameterMax || draft.diameterMin);
  const strand = Number(draft.strandLengthMm);
  const estimate = estimateBeads(strand, size);
  const [inchText, setInchText] = useState('');
  const typed = Number(inchText.replace(',', '.'));
  // Keep what was typed in inches while it still matches the length in mm.
  const inches =
    inchText && typed > 0 && inchesToMm(typed) === strand
      ? inchText
      : draft.strandLengthMm.trim() && strand > 0
        ? inchesOf(strand)
        : '';
  return (
    <>
      <Section id="lot-what" title="What it is">
        <Field label="Title" required validationMessage={error('description.title')}>
          <Input
            value={draft.title}
            maxLength={LIMITS.title}
            placeholder="Blue wound beads with pink roses"
            onChange={(_, d) => change('title', d.value)}
          />
        </Field>
        <Field label="Form" validationMessage={error('description.form')}>
          <RadioGroup
            layout="horizontal"
            className={styles.choices}
            value={draft.form}
            onChange={(_, d) => change('form', d.value as LotDraft['form'])}
          >
            {LOT_FORMS.map((f) => (
              <Radio key={f} value={f} label={FORM_LABEL[f]} />
            ))}
          </RadioGroup>
        </Field>
        <NoteField
          label="Description"
          hint="Anything a buyer should know: where the lot came from in general terms, how it is strung."
          {...field('summary', 'description.summary')}
        />
      </Section>

      <Section
        id="lot-size"
        title="Size and count"
        lead="Sizes in millimetres; inches are shown beside them."
      >
        <div className={styles.row}>
          <MeasureField
            label="Bead size, smallest (mm)"
            hint={inchesHint(draft.diameterMin)}
            value={draft.diameterMin}
            onChange={(v) => change('diameterMin', v)}
            validationMessage={error('description.diameterMm.min') ?? error('description.diameterMm')}
          />
          <MeasureField
            label="Bead size, largest (mm)"
            hint={inchesHint(draft.diameterMax)}
            {...field('diameterMax', 'description.diameterMm.max')}
          />
        </div>
        <div className={styles.row}>
          <MeasureField
            label="Strand length (mm)"
            {...field('strandLengthMm', 'description.strandLengthMm')}
          />
          <MeasureField
            label="or in inches"
            hint={`1 in = ${MM_PER_INCH} mm`}
            unit="in"
            value={inches}
            onChange={(v) => {
              setInchText(v);
              const n = Number(v.replace(',', '.'));
              change('strandLengthMm', v.trim() && n > 0 ? String(inchesToMm(n)) : '');
            }}
          />
        </div>
        <div className={styles.row}>
          <Field
            label="Number of beads"
            required
            validationMessage={error('description.count.value') ?? error('description.count')}
          >
            <Input
              inputMode="numeric"
              value={draft.countValue}
              onChange={(_, d) => change('countValue', d.value)}
            />
          </Field>
          <Checkbox
            label="This is an estimate"
            checked={draft.countEstimated}
            onChange={(_, d) => change('countEstimated', d.checked === true)}
          />
        </div>
        <div className={styles.helper} role="status" aria-label="Count helper">
          {estimate !== null ? (
            <>
              <Text>
                Count helper: {strand} mm ÷ {size} mm ≈ <strong>{estimate} beads</strong> (knots and spacers
                make it fewer).
              </Text>
              <CountSource />
              <Button
                size="small"
                onClick={() => {
                  change('countValue', String(estimate));
                  change('countEstimated', true);
                }}
              >
                Use {estimate} as an estimate
              </Button>
            </>
          ) : (
            <>
              <Text size={200}>
                Count helper: give a strand length and a bead size, and the number of beads is estimated as
                length ÷ size.
              </Text>
              <CountSource />
            </>
          )}
        </div>
      </Section>

      <Section id="lot-look" title="Look">
        <TextField
          label="Colours"
          hint="Separate with commas: white, rose pink, green"
          {...field('colours', 'description.colours')}
        />
        <ChecksField
          label="Base glass"
          options={BASE_GLASS}
          labels={BASE_GLASS_LABEL}
          value={draft.baseGlass}
          onChange={(v) => change('baseGlass', v)}
          validationMessage={error('description.baseGlass')}
        />
        <ChecksField
          label="Decoration"
          options={DECORATIONS}
          labels={DECORATION_LABEL}
          value={draft.decoration}
          onChange={(v) => change('decoration', v)}
          validationMessage={error('description.decoration')}
        />
        <NoteField label="About the decoration" {...field('decorationNote', 'description.decorationNote')} />
      </Section>

      <Section id="lot-condition" title="Condition">
        <NoteField
          label="Condition"
          hint="Chips, cracks, worn foil, missing decoration, restringing."
          {...field('condition', 'description.condition')}
        />
      </Section>
      <SafetyCautions
        cautions={safetyCautions({
          words: [draft.title, draft.summary, draft.colours, draft.decorationNote, draft.condition],
        }).filter((c) => c.rule === 'uranium-handling' || c.rule === 'lead-glass')}
        label="Handling cautions"
      />
    </>
  );
}

/** Where the lot is kept and how it was acquired: sealed, seen only by the recording dealer. */
export function PrivateSections({ draft, change, error }: DraftProps) {
  const styles = useStyles();
  const field = draftFields(draft, change, error);
  return (
    <>
      <Section id="lot-kept" title="Where it is kept" privateSection>
        <TextField
          label="Storage location"
          hint="Shelf, box or drawer."
          {...field('storageLocation', 'sealed.storageLocation')}
        />
      </Section>
      <Section id="lot-private" title="Private details" privateSection>
        <div className={styles.row}>
          <TextField
            label="Acquired on"
            type="date"
            {...field('acquisitionDate', 'sealed.acquisition.date')}
          />
          <TextField
            label="Acquired from"
            placeholder="estate sale, auction, another dealer"
            {...field('acquisitionSource', 'sealed.acquisition.source')}
          />
        </div>
        <div className={styles.row}>
          <MoneyField
            label="Cost"
            amount={draft.costAmount}
            currency={draft.costCurrency}
            onAmount={(v) => change('costAmount', v)}
            onCurrency={(v) => change('costCurrency', v)}
            validationMessage={
              error('sealed.acquisition.cost.amount') ??
              error('sealed.acquisition.cost.currency') ??
              error('sealed.acquisition.cost')
            }
          />
        </div>
        <NoteField label="Private note" {...field('privateNote', 'sealed.privateNote')} />
      </Section>
    </>
  );
}

/** Listed or not. */
export function ListingSection({ draft, change, error }: DraftProps) {
  return (
    <Section
      id="lot-listing"
      title="Public page"
      lead="A listed lot has a public page that anyone with its tag or link can read. Private details are never shown there."
    >
      <Field validationMessage={error('description.listed')}>
        <Switch
          label={draft.listed ? 'Listed: the lot has a public page' : 'Unlisted: only you can see the lot'}
          checked={draft.listed}
          onChange={(_, d) => change('listed', d.checked)}
        />
      </Field>
    </Section>
  );
}
