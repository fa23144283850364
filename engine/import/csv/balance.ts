/**
 * Running-balance column check. In chronological order, each stated balance must equal the
 * previous stated balance plus the booked amounts since (rows without a balance carry
 * their amount forward; pending rows are not part of the booked balance). The check yields
 * one end-of-day balance per date that has a stated balance.
 */
import type { CalendarDate } from '../../core/dates';

/** One row as the check sees it (parallel arrays or typed arrays, file order). */
export interface BalanceRows {
  /** Booking dates `YYYY-MM-DD`. */
  readonly dates: ArrayLike<CalendarDate>;
  readonly amounts: ArrayLike<number>;
  /** Stated balance in minor units, NaN where the cell is empty. */
  readonly balances: ArrayLike<number>;
  /** True (or 1) for a pending row. */
  readonly pending: ArrayLike<boolean | number>;
  readonly lines: ArrayLike<number>;
}

/** A row whose stated balance does not follow from the one before. */
export interface BalanceMismatch {
  readonly line: number;
  readonly found: number;
  readonly expected: number;
  readonly previousLine: number;
  readonly previous: number;
  /** Booked amounts between the previous balance and this one, this row included. */
  readonly amount: number;
}

/** The balance at the end of a day: the last stated balance of the day plus the booked amounts after it. */
export interface EndOfDayBalance {
  readonly day: CalendarDate;
  readonly amount: number;
  readonly line: number;
}

/** Mismatches listed before the check stops. */
export const MAX_BALANCE_MISMATCHES = 20;

/**
 * Checks the running balance over rows taken in the order `sequence` (indexes into the
 * arrays, oldest first). After a mismatch the check continues from the stated balance, so
 * one missing row is reported once. O(n).
 *
 * @example
 * checkRunningBalance({ dates: ['2025-01-01', '2025-01-02'], amounts: [5, 3], balances: [105, 108], pending: [false, false], lines: [2, 3] }, [0, 1])
 *   // { mismatches: [], endOfDay: [{ day: '2025-01-01', amount: 105, line: 2 },
 *   //                             { day: '2025-01-02', amount: 108, line: 3 }] }
 */
export function checkRunningBalance(
  rows: BalanceRows,
  sequence: ArrayLike<number>,
): { mismatches: BalanceMismatch[]; endOfDay: EndOfDayBalance[] } {
  const mismatches: BalanceMismatch[] = [];
  const endOfDay: EndOfDayBalance[] = [];
  let previous = Number.NaN;
  let previousLine = 0;
  let since = 0;
  // End-of-day bookkeeping for the day being walked.
  let currentDay = '';
  let dayBalance = Number.NaN;
  let dayLine = 0;
  let afterBalance = 0;
  const closeDay = (): void => {
    if (!Number.isNaN(dayBalance)) endOfDay.push({ day: currentDay, amount: dayBalance + afterBalance, line: dayLine });
  };
  for (let s = 0; s < sequence.length; s++) {
    const k = sequence[s] as number;
    if (rows.pending[k]) continue;
    const day = rows.dates[k] as string;
    if (day !== currentDay) {
      closeDay();
      currentDay = day;
      dayBalance = Number.NaN;
      afterBalance = 0;
    }
    const amount = rows.amounts[k] as number;
    const stated = rows.balances[k] as number;
    since += amount;
    afterBalance += amount;
    if (Number.isNaN(stated)) continue;
    if (!Number.isNaN(previous)) {
      const expected = previous + since;
      if (expected !== stated && mismatches.length < MAX_BALANCE_MISMATCHES) {
        mismatches.push({
          line: rows.lines[k] as number,
          found: stated,
          expected,
          previousLine,
          previous,
          amount: since,
        });
      }
    }
    previous = stated;
    previousLine = rows.lines[k] as number;
    since = 0;
    dayBalance = stated;
    dayLine = previousLine;
    afterBalance = 0;
  }
  closeDay();
  return { mismatches, endOfDay };
}
