/**
 * Money as integer minor units with an ISO 4217 currency. Decimal text is converted
 * without floating point, so 0.1 + 0.2 problems cannot occur.
 */
import { EngineError } from './errors';
import { minorUnitExponent } from './currency';

/** An amount in integer minor units (cents for EUR) of an ISO 4217 currency. */
export interface Money {
  readonly minor: number;
  readonly currency: string;
}

/**
 * Exponent of a currency, or throws.
 * @throws EngineError UNKNOWN_CURRENCY
 */
export function exponentOf(currency: string): number {
  const e = minorUnitExponent(currency);
  if (e === undefined) throw new EngineError('UNKNOWN_CURRENCY', `unknown ISO 4217 currency code "${currency}"`);
  return e;
}

const PLAIN_DECIMAL = /^([+-]?)(\d+)(?:\.(\d*))?$/;

/**
 * Parses a plain decimal (`-1234.5`, digits and one optional point, no grouping) into
 * minor units. Refuses more fraction digits than the currency allows, unless the extra
 * digits are zeros.
 *
 * @returns the minor units, or a string describing what was wrong.
 * @example parsePlainDecimal('-12.5', 2) // -1250
 * @example parsePlainDecimal('1.234', 2) // 'has 3 decimals, the currency allows 2'
 */
export function parsePlainDecimal(text: string, exponent: number): number | string {
  const m = PLAIN_DECIMAL.exec(text.trim());
  if (!m) return 'is not a decimal number';
  const sign = m[1] === '-' ? -1 : 1;
  const whole = m[2] ?? '0';
  let fraction = m[3] ?? '';
  if (fraction.length > exponent) {
    const extra = fraction.slice(exponent);
    if (/[^0]/.test(extra)) return `has ${fraction.length} decimals, the currency allows ${exponent}`;
    fraction = fraction.slice(0, exponent);
  }
  const digits = whole + fraction.padEnd(exponent, '0');
  const value = Number(digits);
  if (!Number.isSafeInteger(value)) return 'is too large';
  return value === 0 ? 0 : sign * value;
}

/**
 * Formats minor units as a plain decimal string with the currency's digits.
 * @example formatMinor(-1250, 2) // '-12.50'
 */
export function formatMinor(minor: number, exponent: number): string {
  const negative = minor < 0;
  const digits = String(Math.abs(minor)).padStart(exponent + 1, '0');
  const whole = exponent === 0 ? digits : digits.slice(0, digits.length - exponent);
  const fraction = exponent === 0 ? '' : '.' + digits.slice(digits.length - exponent);
  return (negative ? '-' : '') + whole + fraction;
}

/**
 * Minor units as a JSON number in major units, rounded to the currency's minor unit.
 * @example toMajor(-1250, 2) // -12.5
 */
export function toMajor(minor: number, exponent: number): number {
  return Number(formatMinor(minor, exponent));
}

/**
 * Major units (a JSON number or decimal text from a plan or threshold) to minor units,
 * rounding half away from zero at the currency's precision. The rounding is done on the
 * number's shortest decimal form (`String(major)`, the digits a person typed), not on the
 * binary product `major * 10^exponent`, which misrounds halves such as 10000000.075.
 *
 * @throws EngineError INVALID_AMOUNT for a non-finite or too large amount.
 * @example fromMajor(12.345, 2) // 1235
 * @example fromMajor(-0.5, 0) // -1
 */
export function fromMajor(major: number, exponent: number): number {
  if (!Number.isFinite(major)) throw new EngineError('INVALID_AMOUNT', `not a finite amount: ${major}`);
  const { whole, fraction } = plainDigits(Math.abs(major));
  const kept = whole + fraction.slice(0, exponent).padEnd(exponent, '0');
  const roundUp = (fraction.charCodeAt(exponent) || 48) >= 53; // next digit >= '5'
  const magnitude = Number(kept) + (roundUp ? 1 : 0);
  if (!Number.isSafeInteger(magnitude)) throw new EngineError('INVALID_AMOUNT', `amount too large: ${major}`);
  return magnitude === 0 ? 0 : major < 0 ? -magnitude : magnitude;
}

/** Whole and fraction digits of a non-negative finite number's shortest decimal form. */
function plainDigits(value: number): { whole: string; fraction: string } {
  const text = String(value);
  const e = text.indexOf('e');
  if (e < 0) {
    const point = text.indexOf('.');
    return point < 0 ? { whole: text, fraction: '' } : { whole: text.slice(0, point), fraction: text.slice(point + 1) };
  }
  // Exponent form, e.g. "1.5e-7" or "1e+21": shift the point by hand.
  const mantissa = text.slice(0, e);
  const power = Number(text.slice(e + 1));
  const point = mantissa.indexOf('.');
  const digits = point < 0 ? mantissa : mantissa.slice(0, point) + mantissa.slice(point + 1);
  const position = (point < 0 ? mantissa.length : point) + power;
  if (position <= 0) return { whole: '0', fraction: '0'.repeat(-position) + digits };
  if (position >= digits.length) return { whole: digits + '0'.repeat(position - digits.length), fraction: '' };
  return { whole: digits.slice(0, position), fraction: digits.slice(position) };
}
