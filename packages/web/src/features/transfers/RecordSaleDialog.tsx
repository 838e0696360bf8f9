import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { formatLotCode } from '@beadroll/core';
import { sendOrQueue, type QueuedWrite } from '../../lib/outbox';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { NoteField, TextField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { MoneyField } from '../../common/ui/MoneyField';
import { HeldLotField, refreshAfterTransfer, usePriceField } from './HeldLotField';
import { type Sale, today, transfersApi } from './transfers.api';

const useStyles = makeStyles({
  more: { justifySelf: 'start' },
  sub: { color: tokens.colorNeutralForeground3 },
});

const LAST_CURRENCY = 'beadroll.sale-currency';

/**
 * Records a sale to a private buyer, quick enough for a fair: the date is today and the
 * currency the last one used, so it is the price and one tap. The price and the buyer note are
 * sealed (only the seller sees them); a buyer's e-mail address is used once for a receipt.
 */
export function RecordSaleDialog({
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
  onDone?: (sale: Sale) => void;
  /** With no signal the sale is kept on this device and sent later; told here when so. */
  onQueued?: (write: QueuedWrite) => void;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const [lot, setLot] = useState(code ?? '');
  const price = usePriceField(() => localStorage.getItem(LAST_CURRENCY) ?? 'EUR');
  const [more, setMore] = useState(false);
  const form = useFormValues({ date: today(), buyerNote: '', buyerEmail: '' });
  const { date, buyerNote, buyerEmail } = form.values;
  const save = useMutation({
    mutationFn: () => {
      const sold = price.value();
      localStorage.setItem(LAST_CURRENCY, sold.currency);
      // At a fair stand with no signal the sale waits on this device (same key when sent).
      return sendOrQueue<Sale>({
        path: transfersApi.salesPath,
        method: 'POST',
        body: {
          lot,
          date,
          price: sold,
          ...(buyerNote.trim() ? { buyerNote: buyerNote.trim() } : {}),
          ...(buyerEmail.trim() ? { buyerEmail: buyerEmail.trim() } : {}),
        },
        label: `sale of ${formatLotCode(lot)}`,
      });
    },
    // Runs with no signal too: the write is then kept, not sent.
    networkMode: 'always',
    onSuccess: async (result) => {
      if (!result.sent) {
        onQueued?.(result.queued);
        onClose();
        return;
      }
      await refreshAfterTransfer(client);
      onDone?.(result.answer);
      onClose();
    },
  });
  const field = form.bind(save.error);
  return (
    <ActionDialog
      title={`Record a sale${title ? `: ${title}` : ''}`}
      close={onClose}
      onSubmit={() => save.mutate()}
      submitLabel="Record the sale"
      pending={save.isPending}
      error={save.error}
      submitDisabled={!lot || !price.entered}
      narrow
    >
      {code ? null : <HeldLotField lot={lot} onLot={setLot} error={save.error} />}
      <MoneyField
        label="Price"
        required
        hint="Sealed: only you see it."
        {...price.field(save.error)}
        autoFocus={Boolean(code)}
      />
      <TextField label="Date of the sale" type="date" {...field('date')} />
      {more ? (
        <>
          <NoteField
            label="Note about the buyer (optional)"
            hint="Sealed: only you see it."
            {...field('buyerNote')}
          />
          <TextField
            label="Buyer’s e-mail for a receipt (optional)"
            hint="Used once to send the link to the lot’s public history; not kept."
            type="email"
            {...field('buyerEmail')}
          />
        </>
      ) : (
        <Button className={styles.more} appearance="subtle" onClick={() => setMore(true)}>
          Add a buyer note or send a receipt…
        </Button>
      )}
      <Text className={styles.sub} size={200}>
        The lot’s public page stays up and says it was sold to a private buyer on that date.
      </Text>
    </ActionDialog>
  );
}
