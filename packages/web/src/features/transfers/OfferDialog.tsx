import { makeStyles, Radio, RadioGroup, Text, tokens } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
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
 * The price is sealed: only the two dealers ever see it.
 */
export function OfferDialog({
  code,
  title,
  onClose,
  onDone,
}: {
  /** The lot; when absent the dialog asks for one of the dealer's held lots. */
  code?: string;
  title?: string;
  onClose: () => void;
  onDone?: (made: { offer?: Offer; invitation?: Invitation }) => void;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const [lot, setLot] = useState(code ?? '');
  const [mode, setMode] = useState<'dealer' | 'email'>('dealer');
  const [q, setQ] = useState('');
  const [recipient, setRecipient] = useState('');
  const form = useFormValues({ email: '', note: '' });
  const { email, note } = form.values;
  const price = usePriceField('EUR');
  const search = useQuery(dealerSearchQuery(q));
  const send = useMutation({
    mutationFn: () => {
      return transfersApi.offer({
        lot,
        ...(mode === 'dealer' ? { recipient } : { email }),
        ...(note.trim() ? { note: note.trim() } : {}),
        ...(price.entered ? { price: price.value() } : {}),
      });
    },
    onSuccess: async (made) => {
      await refreshAfterTransfer(client);
      onDone?.(made);
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
