/**
 * OFX amounts: signed decimals from the customer's point of view (+ money in, − money
 * out), with no digit grouping (OFX Banking Specification 2.3, data types, amounts;
 * from memory, not checked against the primary text). Converted to integer minor units
 * without floating point.
 */
import { parsePlainDecimal } from '../../core/money';

/**
 * Parses an OFX amount into signed minor units of a currency with `exponent` decimals.
 * A decimal point is standard; a single decimal comma is tolerated (`-12,50`), because
 * files from countries that write decimal commas use it. Digit grouping is refused
 * (`1,234.56`, `1.234,56`, `1 234.56`), as are more significant decimals than the
 * currency allows. A leading decimal separator (`-.50`) is read as `-0.50`.
 *
 * @returns minor units, or a string saying what is wrong with the value, to follow the
 *   quoted value in a message.
 * @throws Never.
 * @example parseOfxAmount('-1234.5', 2) // -123450
 * @example parseOfxAmount('12,50', 2) // 1250
 * @example parseOfxAmount('1.234', 2) // 'has 3 decimals, the currency allows 2'
 */
export function parseOfxAmount(text: string, exponent: number): number | string {
  let value = text.trim();
  if (value === '') return 'is empty, expected a signed amount';
  const points = value.split('.').length - 1;
  const commas = value.split(',').length - 1;
  if (/\s/.test(value) || points + commas > 1) {
    return 'has digit grouping or several separators, expected a plain decimal such as -1234.56';
  }
  if (commas === 1) value = value.replace(',', '.');
  value = value.replace(/^([+-]?)\./, '$10.');
  const minor = parsePlainDecimal(value, exponent);
  if (minor === 'is not a decimal number') return 'is not a decimal number, expected a signed amount such as -1234.56';
  return minor;
}

/**
 * Parses an exchange rate (`CURRATE`): an unsigned decimal, point or comma, as a ratio
 * `numerator / 10^scale` so that conversion stays exact.
 *
 * @returns the ratio, or undefined when the text is not a positive decimal.
 * @example parseOfxRate('1.25') // { numerator: 125n, scale: 2 }
 */
export function parseOfxRate(text: string): { numerator: bigint; scale: number } | undefined {
  const m = /^(\d{1,15})(?:[.,](\d{1,15}))?$/.exec(text.trim());
  if (!m) return undefined;
  const fraction = m[2] ?? '';
  const numerator = BigInt((m[1] ?? '0') + fraction);
  return numerator > 0n ? { numerator, scale: fraction.length } : undefined;
}

/**
 * Converts minor units of one currency to another at `rate` (target units per source
 * unit), rounding half away from zero to the target's minor unit. Exact (BigInt).
 *
 * @returns the converted minor units, or undefined when the result is not a safe integer.
 * @example convertMinor(1000, 2, { numerator: 125n, scale: 2 }, 0) // 13  (10.00 × 1.25 = 12.5 → 13)
 */
export function convertMinor(
  minor: number,
  fromExponent: number,
  rate: { numerator: bigint; scale: number },
  toExponent: number,
): number | undefined {
  const negative = minor < 0;
  const num = BigInt(Math.abs(minor)) * rate.numerator * 10n ** BigInt(toExponent);
  const den = 10n ** BigInt(fromExponent + rate.scale);
  const rounded = (2n * num + den) / (2n * den);
  const value = Number(rounded);
  if (!Number.isSafeInteger(value)) return undefined;
  return value === 0 ? 0 : negative ? -value : value;
}
