import { Field, Input, makeStyles, Select, tokens } from '@fluentui/react-components';

const useStyles = makeStyles({
  row: { display: 'flex', gap: tokens.spacingHorizontalS },
  amount: { flexGrow: 1 },
});

/** Common trade currencies first; any other ISO 4217 code can be typed by the server API. */
export const CURRENCIES = [
  'EUR',
  'GBP',
  'USD',
  'CHF',
  'SEK',
  'DKK',
  'NOK',
  'CZK',
  'PLN',
  'JPY',
  'CAD',
  'AUD',
];

/** An amount typed in major units with its ISO 4217 currency. */
export function MoneyField({
  label,
  amount,
  currency,
  onAmount,
  onCurrency,
  validationMessage,
  hint,
  required,
  autoFocus,
}: {
  label: string;
  amount: string;
  currency: string;
  onAmount: (v: string) => void;
  onCurrency: (v: string) => void;
  validationMessage?: string;
  hint?: string;
  required?: boolean;
  /** Puts the cursor in the amount at once (a sale at a fair: type the price, tap once). */
  autoFocus?: boolean;
}) {
  const styles = useStyles();
  return (
    <Field label={label} validationMessage={validationMessage} hint={hint} required={required}>
      <div className={styles.row}>
        <Input
          className={styles.amount}
          inputMode="decimal"
          value={amount}
          onChange={(_, d) => onAmount(d.value)}
          aria-label={`${label}: amount`}
          placeholder="0.00"
          autoFocus={autoFocus}
        />
        <Select value={currency} onChange={(_, d) => onCurrency(d.value)} aria-label={`${label}: currency`}>
          {CURRENCIES.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </Select>
      </div>
    </Field>
  );
}
