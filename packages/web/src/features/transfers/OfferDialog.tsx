import {
  makeStyles,
  MessageBar,
  MessageBarBody,
  Radio,
  RadioGroup,
  Text,
  tokens,
} from '@fluentui/react-components';
import { formatLotCode } from '@beadroll/core';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { sendOrQueue, type QueuedWrite } from '../../lib/outbox';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { fieldError, NoteField, TextField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { MoneyField } from '../../common/ui/MoneyField';
import { HeldLotField, refreshAfterTransfer, usePriceField } from './HeldLotField';
import { dealerSearchQuery, type Offer, type Invitation, transfersApi } from './transfers.api';

const useStyles = makeStyles({
  results: { display: 'grid', gap: tokens.spacingVerticalXS },
  sub: { color: tokens.colorNeutralForeground3 },
});

/**
 * Offers a lot to another dealer (found by name, handle or business) or to an e-mail address.
 * The price is sealed: only the two dealers ever see it. Given `onQueued` (the scanner at a fair
 * stand), an offer made with no signal waits on this device and is sent when the signal returns;
 * finding a dealer by name needs a signal, so it then starts on the e-mail address.
 */
export function OfferDialog({
  code,
  title,
  onClose,
  onDone,
  onQueued,
}: {
  /** The lot; when absent the dialog asks for one of the dealer's held lots. */
  code?: string;
  title?: string;
  onClose: () => void;
  onDone?: (made: { offer?: Offer; invitation?: Invitation }) => void;
  /** With no signal the offer is kept on this device and sent later; told here when so. */
  onQueued?: (write: QueuedWrite) => void;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const [lot, setLot] = useState(code ?? '');
  const noSignal = onQueued !== undefined && navigator.onLine === false;
  const [mode, setMode] = useState<'dealer' | 'email'>(noSignal ? 'email' : 'dealer');
  const [q, setQ] = useState('');
  const [recipient, setRecipient] = useState('');
  const form = useFormValues({ email: '', note: '' });
  const { email, note } = form.values;
  const price = usePriceField('EUR');
  const search = useQuery(dealerSearchQuery(q));
  const send = useMutation({
    mutationFn: async (): Promise<{
      made?: { offer?: Offer; invitation?: Invitation };
      queued?: QueuedWrite;
    }> => {
      const draft = {
        lot,
        ...(mode === 'dealer' ? { recipient } : { email: email.trim() }),
        ...(note.trim() ? { note: note.trim() } : {}),
        ...(price.entered ? { price: price.value() } : {}),
      };
      if (!onQueued) return { made: await transfersApi.offer(draft) };
      const to =
        mode === 'dealer'
          ? (search.data?.items.find((p) => p.id === recipient)?.displayName ?? 'a dealer')
          : email.trim();
      const result = await sendOrQueue<{ offer?: Offer; invitation?: Invitation }>({
        path: transfersApi.offersPath,
        method: 'POST',
        body: draft,
        label: `offer of ${formatLotCode(lot)} to ${to}`,
      });
      return result.sent ? { made: result.answer } : { queued: result.queued };
    },
    // Runs with no signal too when it may wait on this device.
    networkMode: onQueued ? 'always' : 'online',
    onSuccess: async ({ made, queued }) => {
      if (queued) onQueued?.(queued);
      else {
        await refreshAfterTransfer(client);
        onDone?.(made ?? {});
      }
      onClose();
    },
  });
  const field = form.bind(send.error);
  return (
    <ActionDialog
      title={`Offer ${title ? `“${title}”` : 'this lot'} to another dealer`}
      close={onClose}
      onSubmit={() => send.mutate()}
      submitLabel="Send the offer"
      pending={send.isPending}
      error={send.error}
      submitDisabled={!lot || (mode === 'dealer' ? !recipient : !email.trim())}
      narrow
    >
      {code ? null : <HeldLotField lot={lot} onLot={setLot} error={send.error} />}
      {noSignal ? (
        <MessageBar intent="warning" layout="multiline">
          <MessageBarBody>
            No signal: finding a dealer by name needs one. An offer to an e-mail address waits on this device
            and is sent when the signal returns; the server then checks that you hold the lot.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      <RadioGroup
        value={mode}
        onChange={(_, d) => setMode(d.value as 'dealer' | 'email')}
        layout="horizontal"
        aria-label="Offer to"
      >
        <Radio value="dealer" label="A dealer on Beadroll" />
        <Radio value="email" label="An e-mail address" />
      </RadioGroup>
      {mode === 'dealer' ? (
        <TextField
          label="Find the dealer by name, handle or business"
          value={q}
          onChange={setQ}
          placeholder="at least 2 letters"
          validationMessage={fieldError(send.error, 'recipient')}
        />
      ) : (
        <TextField
          label="Their e-mail address"
          hint="If they have no verified account yet, they get an invitation; the offer is made once the registrar verifies them."
          type="email"
          {...field('email')}
        />
      )}
      {mode === 'dealer' && search.data ? (
        search.data.items.length ? (
          <RadioGroup
            className={styles.results}
            value={recipient}
            onChange={(_, d) => setRecipient(d.value)}
            aria-label="Dealers found"
          >
            {search.data.items.map((p) => (
              <Radio
                key={p.id}
                value={p.id}
                label={`${p.displayName} — ${p.business}, ${p.town} (@${p.handle})`}
              />
            ))}
          </RadioGroup>
        ) : (
          <Text className={styles.sub}>No verified dealer matches. Try an e-mail address instead.</Text>
        )
      ) : null}
      <NoteField
        label="Note (optional)"
        hint="Written on the lot’s history: everyone who reads the history sees it."
        {...field('note')}
      />
      <MoneyField
        label="Agreed price (optional)"
        hint="Sealed: only you and the other dealer see it; never in e-mails or on the public page."
        {...price.field(send.error)}
      />
    </ActionDialog>
  );
}
