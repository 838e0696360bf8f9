import { Field, Select } from '@fluentui/react-components';
import { useQuery, type QueryClient } from '@tanstack/react-query';
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

/** The price in minor units, or a refusal naming the price field, before anything is sent. */
export function sealedPrice(amount: string, currency: string): number {
  const minor = toMinorUnits(amount, currency);
  if (minor === null)
    throw new ApiError(400, 'validation', 'Check the price.', [
      { field: 'price', reason: priceProblem(amount, currency) ?? 'Enter the price' },
    ]);
  return minor;
}

/** After an offer or a sale: the lists of transfers and of lots have changed. */
export async function refreshAfterTransfer(client: QueryClient): Promise<void> {
  await client.invalidateQueries({ queryKey: ['transfers'] });
  await client.invalidateQueries({ queryKey: ['lots'] });
}
