/**
 * The history a forecast starts from: the booked entries of one currency scope up to the
 * as-of date and the balance at the end of that day. The CLI builds it from a ledger, the
 * app from its stored transactions; both then run the same forecast.
 */
import { EngineError } from '../core/errors';
import { addDays, fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import { dailySeries, type SeriesScope } from '../ledger/dailySeries';
import type { Ledger } from '../ledger/types';

export interface HistoryEntry {
  readonly id: string;
  readonly date: CalendarDate;
  /** Signed minor units. */
  readonly amount: number;
  readonly description: string;
  readonly counterparty?: string;
}

export interface ForecastHistory {
  readonly currency: string;
  /** First day of the history. */
  readonly start: CalendarDate;
  /** The as-of date: the forecast covers the days after it. */
  readonly asOf: CalendarDate;
  /** End-of-day balance on the as-of date (minor units). */
  readonly endBalance: number;
  /** True when no statement stated a balance: balances are relative to the first day. */
  readonly relative: boolean;
  /** Booked entries from `start` through `asOf`, by date. */
  readonly entries: readonly HistoryEntry[];
}

/**
 * Builds the forecast history of a ledger scope.
 *
 * @param asOf defaults to the last day with statement data; later dates carry the last
 *   balance forward.
 * @throws EngineError INVALID_ARGUMENT when the scope has no entries or `asOf` is before
 *   the first day; as dailySeries for mixed currencies without an account.
 * @example historyFromLedger(ledger, { currency: 'EUR' }).asOf // '2026-10-31'
 */
export function historyFromLedger(ledger: Ledger, scope: SeriesScope = {}, asOf?: CalendarDate): ForecastHistory {
  const set = dailySeries(ledger, scope);
  if (set.days === 0)
    throw new EngineError('INVALID_ARGUMENT', 'the selected accounts have no entries to forecast from');
  const last = addDays(set.start, set.days - 1);
  const end = asOf ?? last;
  const endDay = toDayNumber(end);
  const startDay = toDayNumber(set.start);
  if (endDay < startDay) {
    throw new EngineError('INVALID_ARGUMENT', `--as-of ${end} is before the first statement day ${set.start}`);
  }
  const index = Math.min(endDay - startDay, set.days - 1);
  const endBalance = Math.round(set.combined.balance[index] as number);
  const ids = new Set(set.accounts.map((a) => a.accountId));
  const entries: HistoryEntry[] = [];
  for (const t of ledger.transactions) {
    if (!ids.has(t.accountId) || t.bookingDate > end) continue;
    entries.push({
      id: t.id,
      date: t.bookingDate,
      amount: t.amount,
      description: t.description,
      counterparty: t.counterparty,
    });
  }
  entries.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  return {
    currency: set.currency,
    start: set.start,
    asOf: fromDayNumber(endDay),
    endBalance,
    relative: set.combined.relative,
    entries,
  };
}
