import { CheckGroup } from '../../common/ui/CheckGroup';
import {
  Checkbox,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Spinner,
  Switch,
  Text,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { LIMITS, formatLotCode, type BeadCount, type LotForm } from '@beadroll/core';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { UnfieldedError } from '../../common/ui/FormPage';
import { Stack } from '../../common/ui/Stack';
import { heldLotsQuery, lineageApi, type CombineResult, type HeldLot, type LotBasics } from './lineage.api';
import { LotFormSelect } from './LotFormSelect';
import { useLineageChange } from './use-lineage-change';
import { beadsText } from './words';

const useStyles = makeStyles({
  part: {
    display: 'grid',
    gap: tokens.spacingHorizontalS,
    gridTemplateColumns: 'minmax(0, 2fr) auto minmax(5rem, 1fr)',
    alignItems: 'center',
    '@media (max-width: 560px)': { gridTemplateColumns: '1fr 1fr' },
  },
});

interface Choice {
  on: boolean;
  whole: boolean;
  count: string;
}

/** Makes a new lot from beads of this lot and others the dealer holds, each whole or in part. */
export function CombineDialog({
  lot,
  onClose,
  onDone,
}: {
  lot: LotBasics;
  onClose: () => void;
  onDone?: (r: CombineResult) => void;
}) {
  const styles = useStyles();
  const held = useQuery(heldLotsQuery());
  const [choices, setChoices] = useState<Record<string, Choice>>({
    [lot.code]: { on: true, whole: true, count: String(lot.remaining.value) },
  });
  const [title, setTitle] = useState('');
  const [form, setForm] = useState<LotForm>('necklace');
  const [listed, setListed] = useState(lot.description?.listed ?? false);

  const lots: HeldLot[] = [
    {
      code: lot.code,
      displayCode: formatLotCode(lot.code),
      title: lot.description?.title ?? '',
      count: lot.remaining,
      status: lot.status,
    },
    ...(held.data ?? []).filter((h) => h.code !== lot.code),
  ];
  const chosen = lots.filter((l) => choices[l.code]?.on);
  const takes = (l: HeldLot): BeadCount =>
    choices[l.code]!.whole ? l.count : { value: Number(choices[l.code]!.count) || 0, estimated: false };
  const total = chosen.reduce((s, l) => s + takes(l).value, 0);
  const estimated = chosen.some((l) => takes(l).estimated);
  const badPart = chosen.some((l) => {
    const c = choices[l.code]!;
    return (
      !c.whole &&
      (!/^\d+$/.test(c.count) ||
        Number(c.count) < 1 ||
        (!l.count.estimated && Number(c.count) > l.count.value))
    );
  });

  const { mutation, done, err } = useLineageChange(
    () =>
      lineageApi.combine(
        chosen.map((l) => (choices[l.code]!.whole ? { lot: l.code } : { lot: l.code, count: takes(l) })),
        {
          ...lot.description!,
          title: title.trim(),
          form,
          listed,
          count: { value: total, estimated },
        },
      ),
    onDone,
  );
  const set = (code: string, patch: Partial<Choice>, l: HeldLot) => {
    const was: Choice = choices[code] ?? { on: false, whole: true, count: String(l.count.value) };
    setChoices({ ...choices, [code]: { ...was, ...patch } });
  };
  const partMessage = (code: string) => {
    const i = chosen.findIndex((l) => l.code === code);
    return i < 0 ? undefined : (err?.fieldMessage(`parts.${i}`) ?? undefined);
  };

  return (
    <ActionDialog
      title="Combine into a new lot"
      close={onClose}
      describedBy="combine-intro"
      done={done !== null}
      pending={mutation.isPending}
      submitDisabled={chosen.length < 2 || badPart || !title.trim() || !lot.description}
      submitLabel={mutation.isPending ? 'Combining…' : 'Combine'}
      onSubmit={() => {
        if (chosen.length >= 2 && !badPart && title.trim()) mutation.mutate();
      }}
    >
      {done ? (
        <MessageBar intent="success">
          <MessageBarBody>
            New lot {done.lot.displayCode} made from {done.parents.length} lots ({beadsText(done.lot.count)}).{' '}
            <PrintTagsDialog lots={[{ code: done.lot.code, listed }]} triggerLabel="Print its tag" />
          </MessageBarBody>
        </MessageBar>
      ) : (
        <>
          <Text id="combine-intro">
            Choose the lots the new piece is made from, and how many beads each gives. Each of them records
            that its beads went into the new lot; a lot that gives all its beads leaves your inventory.
          </Text>
          {held.isLoading && <Spinner size="tiny" label="Loading your lots…" />}
          <Stack role="group" aria-label="Lots to take beads from">
            {lots.map((l) => {
              const c = choices[l.code];
              return (
                <CheckGroup key={l.code} className={styles.part} validationMessage={partMessage(l.code)}>
                  <Checkbox
                    label={`${l.displayCode} · ${l.title} (${beadsText(l.count)})`}
                    checked={c?.on ?? false}
                    onChange={(_e, d) => set(l.code, { on: d.checked === true }, l)}
                  />
                  {c?.on && (
                    <Checkbox
                      label="Whole lot"
                      checked={c.whole}
                      onChange={(_e, d) => set(l.code, { whole: d.checked === true }, l)}
                    />
                  )}
                  {c?.on && !c.whole && (
                    <Input
                      aria-label={`Beads from ${l.displayCode}`}
                      type="number"
                      min={1}
                      value={c.count}
                      onChange={(_e, d) => set(l.code, { count: d.value }, l)}
                    />
                  )}
                </CheckGroup>
              );
            })}
          </Stack>
          <Field
            label="Title of the new lot"
            required
            validationMessage={err?.fieldMessage('description.title')}
          >
            <Input value={title} maxLength={LIMITS.title} onChange={(_e, d) => setTitle(d.value)} />
          </Field>
          <LotFormSelect value={form} onChange={setForm} />
          <Switch
            label="Listed (has a public page)"
            checked={listed}
            onChange={(_e, d) => setListed(d.checked)}
          />
          <Field
            validationMessage={
              chosen.length < 2 ? 'Choose at least two lots.' : err?.fieldMessage('description.count')
            }
            validationState={chosen.length < 2 || err?.fieldMessage('description.count') ? 'error' : 'none'}
          >
            <Text role="status">The new lot holds {beadsText({ value: total, estimated })}.</Text>
          </Field>
          <UnfieldedError error={err} />
        </>
      )}
    </ActionDialog>
  );
}
