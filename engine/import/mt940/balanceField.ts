/**
 * Balance fields 60F/60M (opening), 62F/62M (closing), 64 (closing available) and 65
 * (forward available), all `1!a6!n3!a15d`: D/C mark, date YYMMDD, ISO 4217 currency, amount
 * (SWIFT User Handbook, Category 9, MT940, fields 60a, 62a, 64, 65).
 */
import type { CalendarDate } from '../../core/dates';
import { isKnownCurrency } from '../../core/currency';
import { parseSwiftDate } from './swiftDate';
import { parseSwiftAmount } from './swiftAmount';

/** A balance field as read: the amount is signed (D = negative). */
export interface BalanceValue {
  readonly date: CalendarDate;
  readonly currency: string;
  readonly amount: number;
}

/**
 * Reads the text of a balance field (tag removed).
 * @returns the balance, or `{ error }` naming the subfield and what was expected.
 * @example parseBalanceField('C250131EUR1234,56') // { date: '2025-01-31', currency: 'EUR', amount: 123456 }
 * @example parseBalanceField('X250131EUR1,') // { error: 'D/C mark "X" is not C or D (1!a)' }
 */
export function parseBalanceField(text: string): BalanceValue | { error: string } {
  const mark = text.slice(0, 1);
  if (mark !== 'C' && mark !== 'D') {
    return {
      error:
        mark === ''
          ? 'is empty, expected 1!a6!n3!a15d such as C250131EUR1234,56'
          : `D/C mark "${mark}" is not C or D (1!a)`,
    };
  }
  const dateText = text.slice(1, 7);
  const date = parseSwiftDate(dateText);
  if ('error' in date) return { error: `date ${date.error} (6!n)` };
  const currency = text.slice(7, 10);
  if (!/^[A-Z]{3}$/.test(currency)) return { error: `currency "${currency}" is not three capital letters (3!a)` };
  if (!isKnownCurrency(currency)) return { error: `currency "${currency}" is not an ISO 4217 code (3!a)` };
  const amount = parseSwiftAmount(text.slice(10), currency);
  if ('error' in amount) return amount;
  return { date: date.date, currency, amount: mark === 'D' && amount.minor !== 0 ? -amount.minor : amount.minor };
}
