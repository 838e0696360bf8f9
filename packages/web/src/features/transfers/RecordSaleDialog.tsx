import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  Field,
  Input,
  makeStyles,
  Select,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { formatLotCode } from '@beadroll/core';
import { ApiError } from '../../lib/api';
import { sendOrQueue, type QueuedWrite } from '../../lib/outbox';
import { fieldError, FormError } from '../../shared/ui/FormPage';
import { MoneyField } from '../../shared/ui/MoneyField';
import { heldLotsQuery, type Sale, priceProblem, today, toMinorUnits, transfersApi } from './transfers.api';

const useStyles = makeStyles({
  form: { display: 'grid', gap: tokens.spacingVerticalM },
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
  const [date, setDate] = useState(today);
  const [amount, setAmount] = useState('');
  const [currency, setCurrency] = useState(() => localStorage.getItem(LAST_CURRENCY) ?? 'EUR');
  const [more, setMore] = useState(false);
  const [buyerNote, setBuyerNote] = useState('');
  const [buyerEmail, setBuyerEmail] = useState('');
  const held = useQuery({ ...heldLotsQuery(), enabled: !code });
  const save = useMutation({
    mutationFn: () => {
      const minor = toMinorUnits(amount, currency);
      if (minor === null)
        throw new ApiError(400, 'validation', 'Check the price.', [
          { field: 'price', reason: priceProblem(amount, currency) ?? 'Enter the price' },
        ]);
      localStorage.setItem(LAST_CURRENCY, currency);
      // At a fair stand with no signal the sale waits on this device (same key when sent).
      return sendOrQueue<Sale>({
        path: transfersApi.salesPath,
        method: 'POST',
        body: {
          lot,
          date,
          price: { amount: minor, currency },
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
      await client.invalidateQueries({ queryKey: ['transfers'] });
      await client.invalidateQueries({ queryKey: ['lots'] });
      onDone?.(result.answer);
      onClose();
    },
  });
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <form
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate();
          }}
        >
          <DialogBody>
            <DialogTitle>Record a sale{title ? `: ${title}` : ''}</DialogTitle>
            <DialogContent className={styles.form}>
              {code ? null : (
                <Field label="Lot" required validationMessage={fieldError(save.error, 'lot')}>
                  <Select value={lot} onChange={(_, d) => setLot(d.value)}>
                    <option value="">Choose one of your lots…</option>
                    {(held.data?.items ?? []).map((l) => (
                      <option key={l.code} value={l.code}>
                        {l.title} ({l.displayCode})
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
              <MoneyField
                label="Price"
                required
                hint="Sealed: only you see it."
                amount={amount}
                currency={currency}
                onAmount={setAmount}
                onCurrency={setCurrency}
                validationMessage={fieldError(save.error, 'price')}
                autoFocus={Boolean(code)}
              />
              <Field label="Date of the sale" validationMessage={fieldError(save.error, 'date')}>
                <Input type="date" value={date} onChange={(_, d) => setDate(d.value)} />
              </Field>
              {more ? (
                <>
                  <Field
                    label="Note about the buyer (optional)"
                    hint="Sealed: only you see it."
                    validationMessage={fieldError(save.error, 'buyerNote')}
                  >
                    <Textarea
                      value={buyerNote}
                      onChange={(_, d) => setBuyerNote(d.value)}
                      resize="vertical"
                    />
                  </Field>
                  <Field
                    label="Buyer’s e-mail for a receipt (optional)"
                    hint="Used once to send the link to the lot’s public history; not kept."
                    validationMessage={fieldError(save.error, 'buyerEmail')}
                  >
                    <Input type="email" value={buyerEmail} onChange={(_, d) => setBuyerEmail(d.value)} />
                  </Field>
                </>
              ) : (
                <Button className={styles.more} appearance="subtle" onClick={() => setMore(true)}>
                  Add a buyer note or send a receipt…
                </Button>
              )}
              <Text className={styles.sub} size={200}>
                The lot’s public page stays up and says it was sold to a private buyer on that date.
              </Text>
              <FormError error={save.error} />
            </DialogContent>
            <DialogActions>
              <Button onClick={onClose}>Cancel</Button>
              <Button appearance="primary" type="submit" disabled={save.isPending || !lot || !amount.trim()}>
                Record the sale
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
