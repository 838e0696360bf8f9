import { CURRENCIES } from '@beadroll/core';
import { Field, FieldContextProvider, Input, makeStyles, Select, tokens } from '@fluentui/react-components';

const useStyles = makeStyles({
  row: { display: 'flex', gap: tokens.spacingHorizontalS },
  amount: { flexGrow: 1, minWidth: 0 },
  // A native select is as wide as its longest option; the currency names would push past a phone.
  currency: { width: '7.5rem', flexShrink: 0 },
});

/** Common trade currencies first, then every other one core knows (ISO 4217). */
export const COMMON_CURRENCIES = [
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
        {/* Out of the Field's context: the Field's id, label and message belong to the amount. */}
        <FieldContextProvider value={undefined}>
          <Select
            className={styles.currency}
            value={currency}
            onChange={(_, d) => onCurrency(d.value)}
            aria-label={`${label}: currency`}
          >
            <optgroup label="Common">
              {COMMON_CURRENCIES.map((c) => (
                <option key={c} value={c}>
                  {c}
                </option>
              ))}
            </optgroup>
            <optgroup label="All currencies">
              {CURRENCIES.filter((c) => !COMMON_CURRENCIES.includes(c.code)).map((c) => (
                <option key={c.code} value={c.code}>
                  {c.code} · {c.name}
                </option>
              ))}
            </optgroup>
          </Select>
        </FieldContextProvider>
      </div>
    </Field>
  );
}
