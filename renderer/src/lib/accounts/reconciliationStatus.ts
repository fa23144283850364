/**
 * How an account's stated balances agree with its transactions, in plain words for the
 * accounts table: reconciled, a mismatch with its first day and both balances, or nothing
 * to check.
 */
import type { AccountRecord } from '../db/records';
import { formatMoney, type MoneyFormatOptions } from '../format/money';

export interface ReconciliationStatus {
  /** `data-reconciled` value: 'true', 'false' or 'none'. */
  readonly attribute: 'true' | 'false' | 'none';
  /** Short label for the status cell. */
  readonly label: string;
  /** One sentence with the detail (first mismatching day, expected vs computed). */
  readonly detail: string;
}

/**
 * The status of one account.
 * @example reconciliationStatus(account).label // 'Reconciled ✓'
 */
export function reconciliationStatus(account: AccountRecord, options: MoneyFormatOptions = {}): ReconciliationStatus {
  const money = (minor: number) => formatMoney(minor, account.currency, options);
  if (account.reconciled === true) {
    const n = account.checkedAnchors;
    return {
      attribute: 'true',
      label: 'Reconciled ✓',
      detail: `All ${n} stated balance${n === 1 ? '' : 's'} agree with the transactions.`,
    };
  }
  const m = account.firstMismatch;
  if (account.reconciled === false && m) {
    return {
      attribute: 'false',
      label: `Mismatch from ${m.date}`,
      detail:
        `On ${m.date} (${m.at === 'start' ? 'start' : 'end'} of day) ${m.sourceFile} states ${money(m.expected)}, ` +
        `the transactions give ${money(m.computed)} (difference ${money(m.difference)}).` +
        (m.lastAgreement ? ` The balances last agreed at the end of ${m.lastAgreement}.` : ''),
    };
  }
  return {
    attribute: 'none',
    label: account.relative ? 'No stated balance' : 'Nothing to check',
    detail: account.relative
      ? 'No file states a balance for this account: balances are counted from 0 at its first day.'
      : (account.note ?? 'Only one stated balance: it sets the starting point, there is nothing to compare.'),
  };
}
