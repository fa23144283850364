/**
 * Money on screen: integer minor units formatted with the currency's ISO 4217 exponent
 * (engine/core/currency.ts), never with the formatter's own idea of the digits, and never
 * through a binary fraction (the decimal text of engine/core/money.ts `formatMinor` is
 * what Intl.NumberFormat formats). Typed amounts are read back to minor units exactly.
 */
import { minorUnitExponent } from '../../../../engine/core/currency';
import { formatMinor, parsePlainDecimal } from '../../../../engine/core/money';

export interface MoneyFormatOptions {
  /** BCP 47 locale; the browser's locale by default. */
  readonly locale?: string;
  /**
   * 'code' (12.50 EUR, the default: unambiguous in tables, and the order the engine's
   * sentences use, so a screen reads one way), 'symbol' (€12.50) or 'none' (12.50).
   */
  readonly display?: 'code' | 'symbol' | 'none';
  /** 'exceptZero' writes a + before money in. Default 'auto'. */
  readonly signDisplay?: 'auto' | 'exceptZero' | 'always' | 'never';
}

const formatters = new Map<string, Intl.NumberFormat>();

/** The exponent of a currency, 2 for a code outside the table (shown, never computed with). */
export function displayExponent(currency: string): number {
  return minorUnitExponent(currency) ?? 2;
}

function formatterFor(currency: string, options: MoneyFormatOptions): Intl.NumberFormat {
  const display = options.display ?? 'code';
  const key = `${options.locale ?? ''}|${currency}|${display}|${options.signDisplay ?? 'auto'}`;
  let f = formatters.get(key);
  if (!f) {
    const digits = displayExponent(currency);
    const base: Intl.NumberFormatOptions = {
      minimumFractionDigits: digits,
      maximumFractionDigits: digits,
      signDisplay: options.signDisplay ?? 'auto',
    };
    try {
      f = new Intl.NumberFormat(
        options.locale,
        display === 'none' ? base : { ...base, style: 'currency', currency, currencyDisplay: display },
      );
    } catch {
      f = new Intl.NumberFormat(options.locale, base); // a code Intl does not know
    }
    formatters.set(key, f);
  }
  return f;
}

/**
 * Formats minor units of `currency`.
 * @example formatMoney(-123456, 'EUR', { locale: 'en' }) // '-1,234.56 EUR'
 * @example formatMoney(1234, 'JPY', { locale: 'en', display: 'none' }) // '1,234'
 * @example formatMoney(1234, 'KWD', { locale: 'en', display: 'none' }) // '1.234'
 */
export function formatMoney(minor: number, currency: string, options: MoneyFormatOptions = {}): string {
  const text = formatMinor(minor, displayExponent(currency)) as Intl.StringNumericLiteral;
  if ((options.display ?? 'code') === 'code') {
    // The number in the locale's digits, then the code, as engine/report/plainFormat.ts
    // writes amounts in sentences ("-1,234.56 EUR").
    return `${formatterFor(currency, { ...options, display: 'none' }).format(text)} ${currency}`;
  }
  return formatterFor(currency, options).format(text);
}

/**
 * Minor units as the plain decimal a person edits (no grouping, point as separator).
 * @example amountInputText(-1250, 'EUR') // '-12.50'
 */
export function amountInputText(minor: number, currency: string): string {
  return formatMinor(minor, displayExponent(currency));
}

/**
 * Reads an amount a person typed: `1234.5`, `1,234.50`, `1.234,50`, `1 234,5`, `-12`,
 * `−12` (minus sign). When only one kind of separator appears once and is followed by at
 * most the currency's digits, it is the decimal separator; otherwise it groups thousands.
 *
 * @returns minor units, or a message saying what is wrong.
 * @example parseAmountInput('1.234,50', 'EUR') // 123450
 * @example parseAmountInput('1,234', 'EUR') // 123400 (three digits after one separator group thousands)
 * @example parseAmountInput('0.125', 'EUR') // 'has 3 decimals, the currency allows 2'
 */
export function parseAmountInput(text: string, currency: string): number | string {
  const exponent = minorUnitExponent(currency);
  if (exponent === undefined) return `currency "${currency}" is not an ISO 4217 code`;
  let t = text
    .trim()
    .replace(/\u2212/g, '-')
    .replace(/[\s\u00a0\u202f']/g, '');
  if (t === '') return 'is empty, expected an amount such as 1250.00';
  const lastComma = t.lastIndexOf(',');
  const lastPoint = t.lastIndexOf('.');
  if (lastComma >= 0 && lastPoint >= 0) {
    const decimal = lastComma > lastPoint ? ',' : '.';
    const group = decimal === ',' ? '.' : ',';
    t = t.split(group).join('').replace(decimal, '.');
  } else if (lastComma >= 0 || lastPoint >= 0) {
    const sep = lastComma >= 0 ? ',' : '.';
    const parts = t.split(sep);
    const tail = parts[parts.length - 1] ?? '';
    const isDecimal = parts.length === 2 && (tail.length !== 3 || exponent >= 3 || /^-?0?$/.test(parts[0] ?? ''));
    t = isDecimal ? parts.join('.') : parts.join('');
  }
  const value = parsePlainDecimal(t, exponent);
  if (typeof value === 'string') return value === 'is not a decimal number' ? `"${text.trim()}" ${value}` : value;
  return value;
}
