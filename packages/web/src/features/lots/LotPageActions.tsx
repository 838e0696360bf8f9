import type { Observations } from '@beadroll/core';
import { MessageBar, MessageBarBody, Text } from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';
import { FormError } from '../accounts/FormPage';
import { ActionDialog } from './ActionDialog';
import type { LotActionContext } from './lot-actions';
import {
  draftFromDescription,
  draftToRequest,
  EMPTY_DRAFT,
  type FieldErrors,
  type LotDraft,
} from './lot-draft';
import { DescriptionSections, PrivateSections, type Change } from './LotFormSections';
import { lotsApi } from './lots.api';
import { ObservationChecklist } from './ObservationChecklist';

type Props = LotActionContext & { close: () => void };

/** After a write: reload the lot's roll (re-verified on arrival) and the lists. */
function useLotWrite<T>(fn: (v: T) => Promise<unknown>, close: () => void) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['lots'] });
      close();
    },
  });
}

/** Writes a full new description (`described`), optionally with new private details. */
export function DescribeAction({ code, state, close }: Props) {
  const [draft, setDraft] = useState<LotDraft>(() =>
    state.description ? draftFromDescription(state.description) : EMPTY_DRAFT,
  );
  const [local, setLocal] = useState<FieldErrors>({});
  const write = useLotWrite(
    (input: Parameters<typeof lotsApi.describe>[1]) => lotsApi.describe(code, input),
    close,
  );
  const change: Change = (key, value) => setDraft((d) => ({ ...d, [key]: value }));
  const error = (f: string) =>
    local[f] ?? (write.error instanceof ApiError ? write.error.fieldMessage(f) : undefined);
  return (
    <ActionDialog
      title="Describe the lot"
      close={close}
      submitLabel={write.isPending ? 'Saving…' : 'Save the new description'}
      pending={write.isPending}
      onSubmit={() => {
        const { input, errors } = draftToRequest({ ...draft, observations: {} });
        setLocal(errors);
        if (input) write.mutate({ description: input.description, sealed: input.sealed });
      }}
    >
      <Text>A new description replaces the current one on the lot page; the old one stays on the roll.</Text>
      <DescriptionSections draft={draft} change={change} error={error} />
      <PrivateSections draft={draft} change={change} error={error} />
      <FormError error={write.error} />
    </ActionDialog>
  );
}

/** Records new observations (`observed`). */
export function ObserveAction({ code, close }: Props) {
  const [obs, setObs] = useState<Observations>({});
  const [empty, setEmpty] = useState(false);
  const write = useLotWrite((o: Observations) => lotsApi.observe(code, o), close);
  const error = (f: string) =>
    write.error instanceof ApiError ? write.error.fieldMessage(`observations.${f}`) : undefined;
  return (
    <ActionDialog
      title="Record observations"
      close={close}
      submitLabel={write.isPending ? 'Saving…' : 'Record'}
      pending={write.isPending}
      onSubmit={() => {
        const o = { ...obs };
        if (o.note !== undefined && !o.note.trim()) delete o.note;
        setEmpty(Object.keys(o).length === 0);
        if (Object.keys(o).length) write.mutate(o);
      }}
    >
      <ObservationChecklist value={obs} onChange={setObs} idPrefix="observe" error={error} />
      {empty ? (
        <MessageBar intent="error">
          <MessageBarBody>Choose at least one clue, or write a note.</MessageBarBody>
        </MessageBar>
      ) : null}
      <FormError error={write.error} />
    </ActionDialog>
  );
}

/** Lists or unlists the lot (a `described` entry with only `listed` changed). */
export function ListingAction({ code, state, close }: Props) {
  const next = !state.listed;
  const write = useLotWrite(() => lotsApi.setListing(code, next), close);
  return (
    <ActionDialog
      title={next ? 'List the lot' : 'Unlist the lot'}
      close={close}
      submitLabel={next ? 'List it' : 'Unlist it'}
      pending={write.isPending}
      onSubmit={() => write.mutate(undefined)}
    >
      <Text>
        {next
          ? 'The lot gets a public page: anyone with its tag or link can read its history. Private details are never shown there.'
          : 'The public page goes away; the history stays on the roll, and you still see it here.'}
      </Text>
      <FormError error={write.error} />
    </ActionDialog>
  );
}
