import { Field, MessageBar, MessageBarBody, Select, Text, Textarea } from '@fluentui/react-components';
import { useMutation, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';
import { FormError } from '../../common/ui/FormPage';
import { ActionDialog } from '../../common/ui/ActionDialog';
import type { LotActionContext } from '../lots/lot-actions';
import { lotsQueries, type RawRoll } from '../lots/lots.api';
import { registryToolsApi } from './registry.api';

/** The longest note the server takes with a removal request. */
const NOTE_MAX = 1000;

/**
 * Entries the viewer may ask to have removed: their own, with a body still on the roll, other
 * than the lot's `registered` header (which holds the chain together and is never removed).
 */
export function ownRemovableEntries(roll: RawRoll, viewerId: string): Array<{ seq: number; label: string }> {
  return roll.entries
    .filter(
      (e) => e.actor === viewerId && e.body !== null && e.kind !== 'registered' && e.kind !== 'redacted',
    )
    .map((e) => ({ seq: e.seq, label: `Entry ${e.seq} · ${e.kind} · ${e.time.slice(0, 10)}` }));
}

/**
 * Lets the holder ask the registrar to remove one of their own entries (a photo with a face in
 * it, an address typed by mistake). The registrar decides; nothing changes on the roll until then.
 */
export function RemovalRequestAction({ code, viewer, close }: LotActionContext & { close: () => void }) {
  const roll = useQuery(lotsQueries.roll(code));
  const choices = roll.data && viewer ? ownRemovableEntries(roll.data, viewer.id) : [];
  const [seq, setSeq] = useState<string>('');
  const [note, setNote] = useState('');
  const send = useMutation({
    mutationFn: (v: { seq: number; note: string }) => registryToolsApi.requestRemoval(code, v),
  });
  const fieldError = (f: string) => (send.error instanceof ApiError ? send.error.fieldMessage(f) : undefined);
  const chosen = seq || (choices[0] ? String(choices[0].seq) : '');

  return (
    <ActionDialog
      title="Ask the registrar to remove an entry"
      close={close}
      narrow
      done={send.isSuccess}
      pending={send.isPending}
      submitDisabled={choices.length === 0}
      submitLabel={send.isPending ? 'Sending…' : 'Send the request'}
      onSubmit={() => {
        if (chosen) send.mutate({ seq: Number(chosen), note: note.trim() });
      }}
    >
      {send.isSuccess ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Your request is with the registrar. Until they decide, the entry stays as it is.
          </MessageBarBody>
        </MessageBar>
      ) : (
        <>
          <Text>
            The registrar can remove what an entry says (its text or files) while the roll keeps its
            fingerprint, so the history still verifies. Choose one of your own entries and say why.
          </Text>
          {choices.length === 0 && roll.isSuccess ? (
            <Text>You have no entries on this lot that can be removed.</Text>
          ) : (
            <Field label="Entry" required validationMessage={fieldError('seq')}>
              <Select value={chosen} onChange={(_, d) => setSeq(d.value)}>
                {choices.map((c) => (
                  <option key={c.seq} value={String(c.seq)}>
                    {c.label}
                  </option>
                ))}
              </Select>
            </Field>
          )}
          <Field
            label="Why it should go"
            required
            hint={`${note.length} / ${NOTE_MAX} characters`}
            validationMessage={fieldError('note')}
          >
            <Textarea
              value={note}
              maxLength={NOTE_MAX}
              rows={4}
              resize="vertical"
              onChange={(_, d) => setNote(d.value)}
            />
          </Field>
          <FormError error={send.error} />
        </>
      )}
    </ActionDialog>
  );
}
