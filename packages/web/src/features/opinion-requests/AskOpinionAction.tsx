import {
  Button,
  Field,
  makeStyles,
  Radio,
  RadioGroup,
  SearchBox,
  Spinner,
  Text,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, FormError, NoteField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { ActionDialog } from '../../common/ui/ActionDialog';
import type { LotActionContext } from '../lots/lot-actions';
import { opinionRequestQueries, opinionRequestsApi, REQUEST_STATUS } from './opinion-requests.api';

const useStyles = makeStyles({
  list: {
    display: 'grid',
    gap: tokens.spacingVerticalXS,
    margin: 0,
    paddingInlineStart: tokens.spacingHorizontalL,
  },
  sub: { color: tokens.colorNeutralForeground3 },
});

const ANY = 'any';

/**
 * Asks a named assessor, or any verified assessor, for an opinion on this lot. While the request
 * is open the assessor can read the lot, listed or not; it ends when they answer or it is cancelled.
 */
export function AskOpinionAction({ code, state, close }: LotActionContext & { close: () => void }) {
  const styles = useStyles();
  const client = useQueryClient();
  const [q, setQ] = useState('');
  const [who, setWho] = useState(ANY);
  const form = useFormValues({ note: '' });
  const [done, setDone] = useState(false);
  const assessors = useQuery(opinionRequestQueries.assessors(q));
  const sent = useQuery(opinionRequestQueries.box('sent'));
  const mine = (sent.data?.items ?? []).filter((r) => r.lot.code === code);
  const ask = useMutation({
    mutationFn: () =>
      opinionRequestsApi.ask({
        lot: code,
        ...(who === ANY ? {} : { assessor: who }),
        ...(form.values.note.trim() ? { note: form.values.note.trim() } : {}),
      }),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['opinion-requests'] });
      setDone(true);
    },
  });
  const cancel = useMutation({
    mutationFn: (id: string) => opinionRequestsApi.cancel(id),
    onSuccess: () => client.invalidateQueries({ queryKey: ['opinion-requests'] }),
  });

  return (
    <ActionDialog
      title="Ask for an opinion"
      close={close}
      done={done}
      submitLabel={ask.isPending ? 'Asking…' : 'Ask'}
      pending={ask.isPending}
      onSubmit={() => ask.mutate()}
    >
      {done ? (
        <Text>
          Asked. The assessor finds the lot in their queue and can read it until they record an opinion or you
          cancel.
        </Text>
      ) : (
        <>
          <Text>
            The assessor you ask can read this lot and its history until they answer or you cancel the
            request.
            {state.listed
              ? ''
              : ' The lot is unlisted: they can read it, but their opinion goes on its roll only once you list it.'}
          </Text>
          <Field label="Find an assessor">
            <SearchBox value={q} onChange={(_, d) => setQ(d.value)} placeholder="Name or business" />
          </Field>
          <Field label="Whom to ask" validationMessage={fieldError(ask.error, 'assessor')}>
            <RadioGroup value={who} onChange={(_, d) => setWho(d.value)}>
              <Radio value={ANY} label="Any verified assessor" />
              {assessors.isPending ? <Spinner size="tiny" label="Finding assessors…" /> : null}
              {(assessors.data?.items ?? []).map((a) => (
                <Radio key={a.id} value={a.id} label={`${a.displayName} (${a.business})`} />
              ))}
            </RadioGroup>
          </Field>
          <NoteField
            label="What to look at (optional)"
            hint="Only the assessor sees this."
            {...form.bind(ask.error)('note')}
          />
          <FormError error={ask.error} />
        </>
      )}
      {mine.length ? (
        <section aria-label="Your requests for this lot">
          <Text weight="semibold">Your requests for this lot</Text>
          <ul className={styles.list}>
            {mine.map((r) => (
              <li key={r.id}>
                <Text>
                  {r.assessor ? r.assessor.displayName : 'Any verified assessor'}: {REQUEST_STATUS[r.status]}
                  {r.answeredBy ? ` by ${r.answeredBy.displayName}` : ''}
                </Text>{' '}
                {r.status === 'open' ? (
                  <Button size="small" onClick={() => cancel.mutate(r.id)} disabled={cancel.isPending}>
                    Cancel the request
                  </Button>
                ) : null}
              </li>
            ))}
          </ul>
          <FormError error={cancel.error} />
        </section>
      ) : null}
    </ActionDialog>
  );
}
