/**
 * Money for charts and their captions: integer minor units written with the currency's
 * ISO 4217 exponent (engine/core/currency.ts). The decimal text comes from the engine's
 * exact `formatMinor`; Intl only adds grouping (the code follows the number), so no amount passes
 * through a binary fraction on its way to the screen.
 */
import { minorUnitExponent } from '../../../../engine/core/currency';
import { formatMinor } from '../../../../engine/core/money';

const formatters = new Map<string, Intl.NumberFormat>();

/** Exponent used to show a currency; 2 for a code outside the table (shown, never computed with). */
export function shownExponent(currency: string): number {
  return minorUnitExponent(currency) ?? 2;
}

function formatter(digits: number, signed: boolean): Intl.NumberFormat {
  const key = `${digits}|${signed}`;
  let f = formatters.get(key);
  if (!f) {
    f = new Intl.NumberFormat('en-GB', {
      minimumFractionDigits: digits,
      maximumFractionDigits: digits,
      signDisplay: signed ? 'exceptZero' : 'auto',
    });
    formatters.set(key, f);
  }
  return f;
}

export interface MoneyTextOptions {
  /** Write the currency code (default true). */
  readonly code?: boolean;
  /** Write + before positive amounts (default false). */
  readonly signed?: boolean;
  /** Whole major units only, for axis ticks (default false). */
  readonly whole?: boolean;
}

/**
 * Minor units as text: rounded to a whole minor unit (simulated quantiles are fractional),
 * then written with the currency's digits.
 * @example moneyText(-123456, 'EUR') // '-1,234.56 EUR'
 * @example moneyText(1234, 'JPY', { code: false }) // '1,234'
 * @example moneyText(1234567, 'EUR', { whole: true, code: false }) // '12,346'
 */
export function moneyText(minor: number, currency: string, options: MoneyTextOptions = {}): string {
  const exponent = shownExponent(currency);
  const signed = options.signed ?? false;
  let text: string;
  if (options.whole) {
    const major = Math.round(minor / 10 ** exponent);
    text = formatter(0, signed).format(major === 0 ? 0 : major);
  } else {
    const rounded = Math.round(minor);
    text = formatter(exponent, signed).format(
      formatMinor(rounded === 0 ? 0 : rounded, exponent) as Intl.StringNumericLiteral,
    );
  }
  // The code after the number, as the app's other amounts and the engine's sentences.
  return (options.code ?? true) ? `${text} ${currency}` : text;
}
