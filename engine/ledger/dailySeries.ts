/**
 * Daily inflow, outflow, net flow and end-of-day balance per account and combined, on
 * consecutive calendar days (every day present, days without entries zero-filled). This is
 * the input of decomposition, models and simulation (DESIGN.md section 4, step 1).
 *
 * Amounts are minor units in `Float64Array`s. Balances are rebuilt from the account's
 * starting balance (engine/ledger/reconcileAccount.ts) and its kept transactions; a day
 * before an account's first entry carries its starting balance. An account without any
 * stated balance has relative balances (starting at 0) and says so.
 */
import { fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import type { Ledger } from './types';

/** Daily series on `days` consecutive calendar days from `start`. */
export interface DailySeries {
  readonly start: CalendarDate;
  readonly days: number;
  /** Σ credits of the day (≥ 0). */
  readonly inflow: Float64Array;
  /** Σ |debits| of the day, a positive magnitude. */
  readonly outflow: Float64Array;
  /** inflow − outflow. */
  readonly net: Float64Array;
  /** End-of-day balance. */
  readonly balance: Float64Array;
  /** True when the balance level is unknown (no stated balance) and starts at 0. */
  readonly relative: boolean;
}

/** One account's series. */
export interface AccountDailySeries extends DailySeries {
  readonly accountId: string;
}

/** The series of every account in scope and their sum, all in one currency. */
export interface DailySeriesSet {
  readonly currency: string;
  readonly start: CalendarDate;
  readonly days: number;
  readonly accounts: readonly AccountDailySeries[];
  /** Sum over the accounts in scope; `relative` when any of them is. */
  readonly combined: DailySeries;
}

/** Which accounts to combine. */
export interface SeriesScope {
  /** Account ids; default all accounts (of `currency` when given). */
  readonly accountIds?: readonly string[];
  readonly currency?: string;
}

/** Inclusive calendar range; each end defaults to the scope's first or last day. */
export interface SeriesRange {
  readonly from?: CalendarDate;
  readonly to?: CalendarDate;
}

/**
 * Daily series of the accounts in scope.
 *
 * @throws EngineError INVALID_ARGUMENT for an unknown account id, a scope that selects no
 *   account, accounts of several currencies without a currency or account choice, or a
 *   range that ends before it starts; NOT_ENOUGH_DATA when the scope has no entries or
 *   balances and no range is given; INVALID_DATE for a malformed range date.
 * @example
 * const s = dailySeries(ledger, { currency: 'EUR' }, { from: '2026-01-01', to: '2026-01-31' });
 * s.days // 31
 * s.combined.balance[30] // end-of-day balance on 2026-01-31
 *
 * Complexity: O(days × accounts + transactions).
 */
export function dailySeries(ledger: Ledger, scope: SeriesScope = {}, range: SeriesRange = {}): DailySeriesSet {
  const known = new Set(ledger.accounts.map((a) => a.id));
  for (const id of scope.accountIds ?? []) {
    if (!known.has(id)) throw new EngineError('INVALID_ARGUMENT', `no account with id "${id}" in the ledger`);
  }
  const wanted = scope.accountIds ? new Set(scope.accountIds) : undefined;
  const accounts = ledger.accounts.filter(
    (a) =>
      (wanted === undefined || wanted.has(a.id)) && (scope.currency === undefined || a.currency === scope.currency),
  );
  if (accounts.length === 0) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      scope.currency !== undefined ? `no account in ${scope.currency} in scope` : 'no account in scope',
    );
  }
  const currencies = [...new Set(accounts.map((a) => a.currency))];
  if (currencies.length > 1) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `accounts in several currencies (${currencies.join(', ')}): choose an account or a currency`,
    );
  }
  const reconciliation = new Map(ledger.reconciliation.map((r) => [r.accountId, r]));

  let first = Number.POSITIVE_INFINITY;
  let last = Number.NEGATIVE_INFINITY;
  for (const a of accounts) {
    const r = reconciliation.get(a.id);
    if (r?.firstDate) first = Math.min(first, toDayNumber(r.firstDate));
    if (r?.lastDate) last = Math.max(last, toDayNumber(r.lastDate));
  }
  const fromDay = range.from !== undefined ? toDayNumber(range.from) : first;
  const toDay = range.to !== undefined ? toDayNumber(range.to) : last;
  if (!Number.isFinite(fromDay) || !Number.isFinite(toDay)) {
    throw new EngineError('NOT_ENOUGH_DATA', 'the accounts in scope have no entries and no stated balances');
  }
  if (toDay < fromDay) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `range ends (${fromDayNumber(toDay)}) before it starts (${fromDayNumber(fromDay)})`,
    );
  }
  const days = toDay - fromDay + 1;
  const start = fromDayNumber(fromDay);

  const index = new Map(accounts.map((a, i) => [a.id, i]));
  const before = new Float64Array(accounts.length);
  const inflows = accounts.map(() => new Float64Array(days));
  const outflows = accounts.map(() => new Float64Array(days));
  for (const t of ledger.transactions) {
    const i = index.get(t.accountId);
    if (i === undefined) continue;
    const d = toDayNumber(t.bookingDate) - fromDay;
    if (d < 0) before[i] = (before[i] as number) + t.amount;
    else if (d < days) {
      const target = (t.amount >= 0 ? inflows[i] : outflows[i]) as Float64Array;
      target[d] = (target[d] as number) + Math.abs(t.amount);
    }
  }

  const combined = {
    inflow: new Float64Array(days),
    outflow: new Float64Array(days),
    net: new Float64Array(days),
    balance: new Float64Array(days),
  };
  let anyRelative = false;
  const series: AccountDailySeries[] = accounts.map((a, i) => {
    const r = reconciliation.get(a.id);
    const relative = r?.relative ?? true;
    anyRelative ||= relative;
    const inflow = inflows[i] as Float64Array;
    const outflow = outflows[i] as Float64Array;
    const net = new Float64Array(days);
    const balance = new Float64Array(days);
    let running = (r?.startingBalance ?? 0) + (before[i] as number);
    for (let d = 0; d < days; d++) {
      const n = (inflow[d] as number) - (outflow[d] as number);
      net[d] = n;
      running += n;
      balance[d] = running;
      combined.inflow[d] = (combined.inflow[d] as number) + (inflow[d] as number);
      combined.outflow[d] = (combined.outflow[d] as number) + (outflow[d] as number);
      combined.net[d] = (combined.net[d] as number) + n;
      combined.balance[d] = (combined.balance[d] as number) + running;
    }
    return { accountId: a.id, start, days, inflow, outflow, net, balance, relative };
  });
  return {
    currency: currencies[0] as string,
    start,
    days,
    accounts: series,
    combined: { start, days, ...combined, relative: anyRelative },
  };
}
