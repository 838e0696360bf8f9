import { LIMITS, VOID_WINDOW_MS, type Observations } from '@beadroll/core';
import { Field, MessageBar, MessageBarBody, Text, Textarea } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import { FormError } from '../../common/ui/FormPage';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { correctionOf, CorrectionFields, NO_CORRECTION, type CorrectionDraft } from './CorrectionFields';
import type { LotActionContext } from './lot-actions';
import {
  draftFromDescription,
  draftToRequest,
  EMPTY_DRAFT,
  type FieldErrors,
  type LotDraft,
  saveDraft,
} from './lot-draft';
import { DescriptionSections, PrivateSections, type Change } from './LotFormSections';
import { lotsApi, lotsQueries } from './lots.api';
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
  const [fix, setFix] = useState<CorrectionDraft>(NO_CORRECTION);
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
        const { corrects, problem } = correctionOf(fix);
        if (problem) errors['corrects.reason'] = problem;
        setLocal(errors);
        if (input && !problem)
          write.mutate({
            description: input.description,
            sealed: input.sealed,
            ...(corrects ? { corrects } : {}),
          });
      }}
    >
      <Text>A new description replaces the current one on the lot page; the old one stays on the roll.</Text>
      <CorrectionFields
        value={fix}
        onChange={setFix}
        seqs={state.descriptionSeqs ?? []}
        what="description"
        error={error('corrects.reason') ?? error('corrects')}
      />
      <DescriptionSections draft={draft} change={change} error={error} />
      <PrivateSections draft={draft} change={change} error={error} />
      <FormError error={write.error} />
    </ActionDialog>
  );
}

/** Records new observations (`observed`). */
export function ObserveAction({ code, state, close }: Props) {
  const [obs, setObs] = useState<Observations>({});
  const [empty, setEmpty] = useState(false);
  const [fix, setFix] = useState<CorrectionDraft>(NO_CORRECTION);
  const [fixProblem, setFixProblem] = useState<string | undefined>();
  const write = useLotWrite(
    (v: { observations: Observations; corrects?: { seq: number; reason: string } }) =>
      lotsApi.observe(code, v.observations, v.corrects),
    close,
  );
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
        const { corrects, problem } = correctionOf(fix);
        setFixProblem(problem);
        if (Object.keys(o).length && !problem)
          write.mutate({ observations: o, ...(corrects ? { corrects } : {}) });
      }}
    >
      <CorrectionFields
        value={fix}
        onChange={setFix}
        seqs={state.observationSeqs ?? []}
        what="observation"
        error={
          fixProblem ?? (write.error instanceof ApiError ? write.error.fieldMessage('corrects') : undefined)
        }
      />
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

/** Voids the lot's sale recorded by mistake (`sale-voided`): the seller, within 24 hours of it. */
export function VoidSaleAction({ code, state, close }: Props) {
  const [reason, setReason] = useState('');
  const write = useLotWrite(() => lotsApi.voidSale(code, reason.trim() || undefined), close);
  const until = state.soldTime ? new Date(Date.parse(state.soldTime) + VOID_WINDOW_MS) : null;
  return (
    <ActionDialog
      title="Void the sale"
      close={close}
      submitLabel={write.isPending ? 'Voiding…' : 'Void the sale'}
      pending={write.isPending}
      onSubmit={() => write.mutate(undefined)}
    >
      <Text>
        Use this only when the sale was recorded by mistake. The sale stays on the roll with the void written
        after it, and the lot is yours to sell again.
        {until ? ` You can void it until ${until.toLocaleString()}.` : ''}
      </Text>
      <Field label="Why (shown on the history)">
        <Textarea
          value={reason}
          maxLength={LIMITS.longText}
          onChange={(_, d) => setReason(d.value)}
          resize="vertical"
        />
      </Field>
      <FormError error={write.error} />
    </ActionDialog>
  );
}

/**
 * "Register another like this": the register form opens with this lot's description and latest
 * observations copied in; photos and private details are not copied.
 */
export function RegisterLikeAction({ code, state, close }: Props) {
  const navigate = useNavigate();
  const detail = useQuery(lotsQueries.detail(code));
  useEffect(() => {
    if (!state.description || detail.isPending) return;
    const observations = detail.data?.observations ?? {};
    saveDraft({ ...draftFromDescription(state.description), observations: observations ?? {} });
    close();
    navigate('/lots/new?like=' + encodeURIComponent(code));
  }, [state.description, detail.isPending, detail.data, close, navigate, code]);
  return null;
}
