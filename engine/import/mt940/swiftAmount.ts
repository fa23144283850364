/**
 * SWIFT amounts (`15d`): digits with one mandatory decimal comma, at least one digit before
 * it, at most 15 characters including the comma, and no more digits after it than the
 * currency's ISO 4217 minor unit allows (`1234,5`, `0,`, `12,00`). The sign is never part of
 * the amount; a separate D/C mark carries it.
 */
import { minorUnitExponent } from '../../core/currency';
import { EngineError } from '../../core/errors';

/** Longest `15d` amount, comma included. */
export const SWIFT_AMOUNT_MAX_LENGTH = 15;

/**
 * Reads a `15d` amount into non-negative minor units of `currency`.
 *
 * @returns `{ minor }`, or `{ error }` with a message such as
 *   `amount "12.5" uses a point, expected a decimal comma (15d)`.
 * @example parseSwiftAmount('1234,5', 'EUR') // { minor: 123450 }
 * @example parseSwiftAmount('12,345', 'EUR') // { error: 'amount "12,345" has 3 decimals, EUR allows 2 (ISO 4217)' }
 */
export function parseSwiftAmount(text: string, currency: string): { minor: number } | { error: string } {
  const shown = `amount "${text}"`;
  if (text === '') return { error: 'amount is missing, expected digits with a decimal comma such as 1234,56 (15d)' };
  const hasComma = text.includes(',');
  if (text.includes('.')) {
    return {
      error: hasComma
        ? `${shown} contains a point; 15d allows digits and one decimal comma, no digit grouping`
        : `${shown} uses a point, expected a decimal comma (15d)`,
    };
  }
  if (!/^[0-9,]+$/.test(text)) return { error: `${shown} is not digits with a decimal comma (15d)` };
  if (!hasComma)
    return { error: `${shown} has no decimal comma, expected e.g. "${text}," (15d: the comma is mandatory)` };
  if (text.indexOf(',') !== text.lastIndexOf(',')) return { error: `${shown} has more than one comma (15d)` };
  if (text.startsWith(',')) return { error: `${shown} has no digit before the decimal comma (15d)` };
  if (text.length > SWIFT_AMOUNT_MAX_LENGTH) {
    return { error: `${shown} is ${text.length} characters long, 15d allows ${SWIFT_AMOUNT_MAX_LENGTH}` };
  }
  const exponent = minorUnitExponent(currency);
  if (exponent === undefined) return { error: `${shown} cannot be read: currency "${currency}" is not ISO 4217` };
  const [whole = '', fraction = ''] = text.split(',');
  if (fraction.length > exponent) {
    return { error: `${shown} has ${fraction.length} decimals, ${currency} allows ${exponent} (ISO 4217)` };
  }
  const minor = Number(whole + fraction.padEnd(exponent, '0'));
  if (!Number.isSafeInteger(minor)) return { error: `${shown} is too large to be held exactly` };
  return { minor };
}

/**
 * Writes non-negative minor units as a `15d` amount: no grouping, a decimal comma, trailing
 * zeros kept to the currency's digits (`0,00`, `1234,50`, `1234,` for JPY).
 *
 * @throws EngineError UNKNOWN_CURRENCY for a code outside ISO 4217; INVALID_AMOUNT for a
 *   negative or unsafe integer, or one longer than 15 characters.
 * @example formatSwiftAmount(123450, 'EUR') // '1234,50'
 * @example formatSwiftAmount(5, 'JPY') // '5,'
 */
export function formatSwiftAmount(minor: number, currency: string): string {
  const exponent = minorUnitExponent(currency);
  if (exponent === undefined) throw new EngineError('UNKNOWN_CURRENCY', `unknown ISO 4217 currency code "${currency}"`);
  if (!Number.isSafeInteger(minor) || minor < 0) {
    throw new EngineError('INVALID_AMOUNT', `a SWIFT amount must be a non-negative safe integer, got ${minor}`);
  }
  const digits = String(minor).padStart(exponent + 1, '0');
  const text = digits.slice(0, digits.length - exponent) + ',' + digits.slice(digits.length - exponent);
  if (text.length > SWIFT_AMOUNT_MAX_LENGTH) {
    throw new EngineError('INVALID_AMOUNT', `amount ${text} is longer than 15 characters (15d)`);
  }
  return text;
}
