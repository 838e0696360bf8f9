import { Spinner, Text } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { NoteField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { openOfferOfLotQuery, transfersApi } from './transfers.api';

/** Withdraws the holder's open offer of this lot, from the lot page (a `transfer-withdrawn` entry). */
export function WithdrawOfferAction({ code, close }: { code: string; close: () => void }) {
  const client = useQueryClient();
  const offer = useQuery(openOfferOfLotQuery(code));
  const form = useFormValues({ note: '' });
  const withdraw = useMutation({
    mutationFn: (id: string) => transfersApi.answer(id, 'withdraw', form.values.note.trim() || undefined),
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
      error={withdraw.error ?? offer.error}
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
          <NoteField
            label="Note on the roll (optional)"
            hint="Everyone who reads the lot's history sees it."
            {...form.bind(withdraw.error)('note')}
          />
        </>
      ) : (
        <Text>This lot has no open offer of yours any more.</Text>
      )}
    </ActionDialog>
  );
}
