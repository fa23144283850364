/**
 * Strict readers of option values (whole numbers in documented bounds, calendar dates,
 * decimal amounts in a currency). Each mistake becomes one line naming the option, what
 * was found and what was expected, e.g. `--paths: "5" is outside 100..100000`.
 */
import { isCalendarDate, type CalendarDate } from '../core/dates';
import { exponentOf, parsePlainDecimal } from '../core/money';

/** A value, or the problem line about it. */
export type OptionValue<T> =
  { readonly ok: true; readonly value: T } | { readonly ok: false; readonly problem: string };

/**
 * A whole number from `min` to `max`: digits only (no sign, point, exponent or grouping).
 * @example wholeNumberOption('paths', '5', 100, 100000) // { ok: false, problem: '--paths: "5" is outside 100..100000' }
 */
export function wholeNumberOption(name: string, text: string, min: number, max: number): OptionValue<number> {
  if (!/^\d+$/.test(text.trim())) {
    return { ok: false, problem: `--${name}: "${text}" is not a whole number, expected ${min}..${max}` };
  }
  const value = Number(text.trim());
  if (!Number.isSafeInteger(value) || value < min || value > max) {
    return { ok: false, problem: `--${name}: "${text}" is outside ${min}..${max}` };
  }
  return { ok: true, value };
}

/**
 * A calendar date `YYYY-MM-DD` that exists.
 * @example dateOption('as-of', '2026-02-30') // { ok: false, problem: '--as-of: "2026-02-30" is not a calendar date, expected YYYY-MM-DD' }
 */
export function dateOption(name: string, text: string): OptionValue<CalendarDate> {
  if (!isCalendarDate(text)) {
    return { ok: false, problem: `--${name}: "${text}" is not a calendar date, expected YYYY-MM-DD` };
  }
  return { ok: true, value: text };
}

/**
 * A plain decimal amount in a currency's major units (`-250`, `1200.50`), converted to
 * minor units; more decimals than the currency has are refused unless they are zeros.
 * @example amountOption('threshold', '12.345', 'EUR') // { ok: false, problem: '--threshold: "12.345" has 3 decimals, EUR allows 2' }
 */
export function amountOption(name: string, text: string, currency: string): OptionValue<number> {
  const exponent = exponentOf(currency);
  const parsed = parsePlainDecimal(text, exponent);
  if (typeof parsed === 'number') return { ok: true, value: parsed };
  if (parsed.startsWith('has ')) {
    const decimals = /has (\d+) decimals/.exec(parsed)?.[1] ?? '?';
    return { ok: false, problem: `--${name}: "${text}" has ${decimals} decimals, ${currency} allows ${exponent}` };
  }
  const example = exponent === 0 ? '2500' : `2500.${'0'.repeat(exponent)}`;
  return {
    ok: false,
    problem: `--${name}: "${text}" ${parsed}, expected a decimal amount in ${currency} such as ${example}`,
  };
}
