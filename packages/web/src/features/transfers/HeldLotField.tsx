import { Field, Select } from '@fluentui/react-components';
import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';
import { fieldError } from '../../common/ui/FormPage';
import { heldLotsQuery, priceProblem, toMinorUnits } from './transfers.api';

/** Picks one of the lots the dealer holds, for a dialog opened away from a lot's page. */
export function HeldLotField({
  lot,
  onLot,
  error,
}: {
  lot: string;
  onLot: (code: string) => void;
  error: unknown;
}) {
  const held = useQuery(heldLotsQuery());
  return (
    <Field label="Lot" required validationMessage={fieldError(error, 'lot')}>
      <Select value={lot} onChange={(_, d) => onLot(d.value)}>
        <option value="">Choose one of your lots…</option>
        {(held.data?.items ?? []).map((l) => (
          <option key={l.code} value={l.code}>
            {l.title} ({l.displayCode})
          </option>
        ))}
      </Select>
    </Field>
  );
}

/**
 * A sealed price being typed into a `MoneyField`: `field(error)` gives its props, with the
 * server's reason against `price` in `error`; `entered` once an amount is typed; `value()` gives
 * the price in minor units, or throws a refusal naming the price field before anything is sent.
 */
export function usePriceField(currency: string | (() => string)) {
  const [amount, setAmount] = useState('');
  const [chosen, setCurrency] = useState(currency);
  return {
    field: (error: unknown) => ({
      amount,
      currency: chosen,
      onAmount: setAmount,
      onCurrency: setCurrency,
      validationMessage: fieldError(error, 'price'),
    }),
    entered: amount.trim() !== '',
    value(): { amount: number; currency: string } {
      const minor = toMinorUnits(amount, chosen);
      if (minor === null)
        throw new ApiError(400, 'validation', 'Check the price.', [
          { field: 'price', reason: priceProblem(amount, chosen) ?? 'Enter the price' },
        ]);
      return { amount: minor, currency: chosen };
    },
  };
}

/** After an offer or a sale: the lists of transfers and of lots have changed. */
export async function refreshAfterTransfer(client: QueryClient): Promise<void> {
  await client.invalidateQueries({ queryKey: ['transfers'] });
  await client.invalidateQueries({ queryKey: ['lots'] });
}
