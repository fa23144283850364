/**
 * Money for charts and their captions: integer minor units written with the currency's
 * ISO 4217 exponent (engine/core/currency.ts). The decimal text comes from the engine's
 * exact `formatMinor`; Intl only adds grouping and the currency code, so no amount passes
 * through a binary fraction on its way to the screen.
 */
import { minorUnitExponent } from '../../../../engine/core/currency';
import { formatMinor } from '../../../../engine/core/money';

const formatters = new Map<string, Intl.NumberFormat>();

/** Exponent used to show a currency; 2 for a code outside the table (shown, never computed with). */
export function shownExponent(currency: string): number {
  return minorUnitExponent(currency) ?? 2;
}

function formatter(currency: string, digits: number, withCode: boolean, signed: boolean): Intl.NumberFormat {
  const key = `${currency}|${digits}|${withCode}|${signed}`;
  let f = formatters.get(key);
  if (!f) {
    const base: Intl.NumberFormatOptions = {
      minimumFractionDigits: digits,
      maximumFractionDigits: digits,
      signDisplay: signed ? 'exceptZero' : 'auto',
    };
    try {
      f = new Intl.NumberFormat(
        'en-GB',
        withCode ? { ...base, style: 'currency', currency, currencyDisplay: 'code' } : base,
      );
    } catch {
      f = new Intl.NumberFormat('en-GB', base);
    }
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
 * @example moneyText(-123456, 'EUR') // '-EUR 1,234.56'
 * @example moneyText(1234, 'JPY', { code: false }) // '1,234'
 * @example moneyText(1234567, 'EUR', { whole: true, code: false }) // '12,346'
 */
export function moneyText(minor: number, currency: string, options: MoneyTextOptions = {}): string {
  const exponent = shownExponent(currency);
  const code = options.code ?? true;
  const signed = options.signed ?? false;
  if (options.whole) {
    const major = Math.round(minor / 10 ** exponent);
    return formatter(currency, 0, code, signed).format(major === 0 ? 0 : major);
  }
  const rounded = Math.round(minor);
  const text = formatMinor(rounded === 0 ? 0 : rounded, exponent) as Intl.StringNumericLiteral;
  return formatter(currency, exponent, code, signed).format(text);
}
