import { data as iso4217 } from 'currency-codes';

// The currency table lives apart from the other bounds: only writers check money, so a verifier
// bundled for a browser (the public lot page) leaves the ISO 4217 data out.

/**
 * ISO 4217 codes that are not money a dealer pays with: precious metals, bond-market units,
 * the testing and "no currency" codes, special drawing rights and unit-of-account codes, and
 * the fund codes (List One marks these as funds; from memory).
 */
const NOT_TRADE_CURRENCIES = new Set([
  'XAG',
  'XAU',
  'XPD',
  'XPT',
  'XBA',
  'XBB',
  'XBC',
  'XBD',
  'XDR',
  'XSU',
  'XUA',
  'XTS',
  'XXX',
  'BOV',
  'CHE',
  'CHW',
  'CLF',
  'COU',
  'MXV',
  'USN',
  'UYI',
  'UYW',
]);

/** One currency a dealer may record: ISO 4217 code, name and minor-unit digits. */
export interface Currency {
  code: string;
  name: string;
  /** Digits after the decimal point (2 for EUR, 0 for JPY, 3 for KWD). */
  digits: number;
}

/** Active ISO 4217 currencies (from the `currency-codes` package), alphabetical by code. */
export const CURRENCIES: readonly Currency[] = iso4217
  .filter((c) => !NOT_TRADE_CURRENCIES.has(c.code))
  .map((c) => ({ code: c.code, name: c.currency, digits: c.digits }))
  .sort((a, b) => (a.code < b.code ? -1 : 1));

const BY_CODE = new Map(CURRENCIES.map((c) => [c.code, c]));

/** The currency with this ISO 4217 code, or undefined when it is not one dealers pay with. */
export function currencyOf(code: unknown): Currency | undefined {
  return typeof code === 'string' ? BY_CODE.get(code) : undefined;
}
