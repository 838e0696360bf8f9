import {
  Button,
  Checkbox,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Switch,
  Text,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { LIMITS, formatLotCode, type LotDescription, type LotForm } from '@beadroll/core';
import { useState } from 'react';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { UnfieldedError } from '../../common/ui/FormPage';
import { lineageApi, type LotBasics, type SplitResult } from './lineage.api';
import { LotFormSelect } from './LotFormSelect';
import { useLineageChange } from './use-lineage-change';
import { beadsText } from './words';

const useStyles = makeStyles({
  rows: { display: 'grid', gap: tokens.spacingVerticalM },
  row: {
    display: 'grid',
    gap: tokens.spacingHorizontalS,
    gridTemplateColumns: 'minmax(0, 3fr) minmax(5rem, 1fr) minmax(6rem, 1fr)',
    alignItems: 'end',
    '@media (max-width: 560px)': { gridTemplateColumns: '1fr 1fr' },
  },
  flags: { display: 'flex', gap: tokens.spacingHorizontalM, flexWrap: 'wrap' },
});

interface Row {
  title: string;
  count: string;
  estimated: boolean;
  form: LotForm;
  listed: boolean;
}

function startRows(lot: LotBasics): Row[] {
  const d = lot.description;
  const each = Math.max(1, Math.floor(lot.remaining.value / 2));
  return [1, 2].map((i) => ({
    title: `${d?.title ?? 'Lot'} (part ${i})`.slice(0, 200),
    count: String(each),
    estimated: lot.remaining.estimated,
    form: d?.form ?? 'strand',
    listed: d?.listed ?? false,
  }));
}

/** The new lots' descriptions: the parent's, with each row's title, count, form and listing. */
function childDescription(base: LotDescription, r: Row): LotDescription {
  return {
    ...base,
    title: r.title.trim(),
    form: r.form,
    count: { value: Number(r.count), estimated: r.estimated },
    listed: r.listed,
  };
}

/** Divides a lot into two or more new lots; what they do not take stays with the lot. */
export function SplitDialog({
  lot,
  onClose,
  onDone,
}: {
  lot: LotBasics;
  onClose: () => void;
  onDone?: (r: SplitResult) => void;
}) {
  const styles = useStyles();
  const [rows, setRows] = useState<Row[]>(() => startRows(lot));
  const { mutation, done, err } = useLineageChange(
    () =>
      lineageApi.split(
        lot.code,
        rows.map((r) => ({ description: childDescription(lot.description!, r) })),
      ),
    onDone,
  );
  const total = rows.reduce((s, r) => s + (Number(r.count) || 0), 0);
  const left = lot.remaining.value - total;
  const over = !lot.remaining.estimated && left < 0;
  const badCount = rows.some((r) => !/^\d+$/.test(r.count) || Number(r.count) < 1);
  const set = (i: number, patch: Partial<Row>) =>
    setRows(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  const fieldMsg = (i: number, f: string) => err?.fieldMessage(`children.${i}.description.${f}`);

  return (
    <ActionDialog
      title={`Split lot ${formatLotCode(lot.code)}`}
      close={onClose}
      describedBy="split-intro"
      done={done !== null}
      pending={mutation.isPending}
      submitDisabled={over || badCount || !lot.description}
      submitLabel={mutation.isPending ? 'Splitting…' : 'Split'}
      onSubmit={() => {
        if (!over && !badCount) mutation.mutate();
      }}
    >
      {done ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Split into {done.children.map((c) => c.displayCode).join(', ')}.{' '}
            {done.remaining.value > 0
              ? `${beadsText(done.remaining)} stay with this lot.`
              : 'This lot is used up and leaves your inventory.'}{' '}
            <PrintTagsDialog
              lots={done.children.map((c, i) => ({ code: c.code, listed: rows[i]?.listed ?? false }))}
              triggerLabel={done.children.length === 1 ? 'Print its tag' : 'Print their tags'}
            />
          </MessageBarBody>
        </MessageBar>
      ) : (
        <>
          <Text id="split-intro">
            The lot has {beadsText(lot.remaining)}. Give each new lot its title and count; beads you do not
            give to a new lot stay with this one. The new lots start their own rolls, which link back to this
            one.
          </Text>
          {rows.map((r, i) => (
            <fieldset key={i} className={styles.rows} style={{ border: 'none', padding: 0, margin: 0 }}>
              <legend>
                <Text weight="semibold">New lot {i + 1}</Text>
              </legend>
              <div className={styles.row}>
                <Field label="Title" required validationMessage={fieldMsg(i, 'title')}>
                  <Input
                    value={r.title}
                    maxLength={LIMITS.title}
                    onChange={(_e, d) => set(i, { title: d.value })}
                  />
                </Field>
                <Field
                  label="Beads"
                  required
                  validationMessage={
                    fieldMsg(i, 'count') ??
                    (/^\d+$/.test(r.count) && Number(r.count) >= 1 ? undefined : 'At least one bead')
                  }
                >
                  <Input
                    type="number"
                    min={1}
                    inputMode="numeric"
                    value={r.count}
                    onChange={(_e, d) => set(i, { count: d.value })}
                  />
                </Field>
                <LotFormSelect value={r.form} onChange={(form) => set(i, { form })} />
              </div>
              <div className={styles.flags}>
                <Checkbox
                  label="Count is an estimate"
                  checked={r.estimated}
                  onChange={(_e, d) => set(i, { estimated: d.checked === true })}
                />
                <Switch
                  label="Listed (has a public page)"
                  checked={r.listed}
                  onChange={(_e, d) => set(i, { listed: d.checked })}
                />
                {rows.length > 2 && (
                  <Button appearance="subtle" onClick={() => setRows(rows.filter((_r, j) => j !== i))}>
                    Remove
                  </Button>
                )}
              </div>
            </fieldset>
          ))}
          <div>
            <Button
              onClick={() =>
                setRows([
                  ...rows,
                  {
                    ...rows[rows.length - 1]!,
                    title: `${lot.description?.title ?? 'Lot'} (part ${rows.length + 1})`.slice(0, 200),
                  },
                ])
              }
            >
              Add another new lot
            </Button>
          </div>
          <Field
            validationMessage={
              over
                ? `The new lots hold ${total} beads; the lot has ${lot.remaining.value}.`
                : err?.fieldMessage('children')
            }
            validationState={over || err?.fieldMessage('children') ? 'error' : 'none'}
          >
            <Text role="status">
              {over
                ? `${total} beads in the new lots`
                : left > 0
                  ? `${lot.remaining.estimated ? 'About ' : ''}${left} ${left === 1 ? 'bead stays' : 'beads stay'} with this lot.`
                  : 'Every bead goes into the new lots: this lot will be used up.'}
            </Text>
          </Field>
          <UnfieldedError error={err} />
        </>
      )}
    </ActionDialog>
  );
}
