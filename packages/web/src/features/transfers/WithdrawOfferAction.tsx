import { Field, Spinner, Text, Textarea } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, FormError } from '../../common/ui/FormPage';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { openOfferOfLotQuery, transfersApi } from './transfers.api';

/** Withdraws the holder's open offer of this lot, from the lot page (a `transfer-withdrawn` entry). */
export function WithdrawOfferAction({ code, close }: { code: string; close: () => void }) {
  const client = useQueryClient();
  const offer = useQuery(openOfferOfLotQuery(code));
  const [note, setNote] = useState('');
  const withdraw = useMutation({
    mutationFn: (id: string) => transfersApi.answer(id, 'withdraw', note.trim() || undefined),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['transfers'] });
      await client.invalidateQueries({ queryKey: ['lots'] });
      close();
    },
  });
  const to = offer.data?.recipient?.displayName ?? offer.data?.recipient?.handle;
  return (
    <ActionDialog
      title="Withdraw the offer"
      close={close}
      submitLabel={withdraw.isPending ? 'Withdrawing…' : 'Withdraw the offer'}
      pending={withdraw.isPending || !offer.data}
      onSubmit={() => offer.data && withdraw.mutate(offer.data.id)}
    >
      {offer.isPending ? (
        <Spinner label="Finding the offer…" />
      ) : offer.data ? (
        <>
          <Text>
            {to
              ? `${to} can no longer accept this lot. `
              : 'The other dealer can no longer accept this lot. '}
            The lot stays yours; the roll records the withdrawal, never the price.
          </Text>
          <Field
            label="Note on the roll (optional)"
            hint="Everyone who reads the lot's history sees it."
            validationMessage={fieldError(withdraw.error, 'note')}
          >
            <Textarea value={note} onChange={(_, d) => setNote(d.value)} resize="vertical" />
          </Field>
        </>
      ) : (
        <Text>This lot has no open offer of yours any more.</Text>
      )}
      <FormError error={withdraw.error ?? offer.error} />
    </ActionDialog>
  );
}
