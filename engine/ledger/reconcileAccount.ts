/**
 * Rebuilds an account's balances from its stated balances (anchors) and its kept
 * transactions, and checks every stated balance against them.
 *
 * The starting balance comes from one anchor: the earliest opening balance, else the
 * earliest closing, running or interim balance (back-computed through the transactions up
 * to it). Every other anchor is then compared with the balance rebuilt from that start;
 * a mismatch is reported with the first anchor that disagrees and the last day that still
 * agreed, and nothing is adjusted to make later days fit (a mismatch is never smoothed).
 * An account with no anchor has relative balances starting at 0.
 *
 * Anchor semantics (engine/import/types.ts): `at: 'start'` of a date is the end of the day
 * before; `available` balances are informational and never compared.
 *
 * Complexity: O((t + a) log t) for t transactions and a anchors.
 */
import { fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import type { AccountReconciliation, BalanceAnchor, BalanceMismatch } from './types';

/** Cumulative booked amounts by day: `net(e)` = Σ amounts booked on or before day e. */
export interface CumulativeFlows {
  /** Distinct booking day numbers, ascending. */
  readonly days: Int32Array;
  /** `totals[i]` = Σ amounts booked on or before `days[i]`. */
  readonly totals: Float64Array;
}

/**
 * Cumulative flows of transactions (any order).
 * @example cumulativeFlows([{ bookingDate: '2026-01-02', amount: 5 }]).totals // Float64Array [5]
 */
export function cumulativeFlows(
  transactions: readonly { readonly bookingDate: CalendarDate; readonly amount: number }[],
): CumulativeFlows {
  const byDay = new Map<number, number>();
  // Transactions come in runs of one day: the last date's day number is reused while it repeats.
  let lastDate: string | undefined;
  let lastDay = 0;
  for (const t of transactions) {
    if (t.bookingDate !== lastDate) {
      lastDay = toDayNumber(t.bookingDate);
      lastDate = t.bookingDate;
    }
    byDay.set(lastDay, (byDay.get(lastDay) ?? 0) + t.amount);
  }
  const days = Int32Array.from(byDay.keys()).sort();
  const totals = new Float64Array(days.length);
  let running = 0;
  days.forEach((d, i) => {
    running += byDay.get(d) as number;
    totals[i] = running;
  });
  return { days, totals };
}

/**
 * Σ amounts booked on or before day number `day` (binary search).
 * @example netThrough(cumulativeFlows([]), 0) // 0
 */
export function netThrough(flows: CumulativeFlows, day: number): number {
  let lo = 0;
  let hi = flows.days.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((flows.days[mid] as number) <= day) lo = mid + 1;
    else hi = mid;
  }
  return lo === 0 ? 0 : (flows.totals[lo - 1] as number);
}

/** Day number whose end the anchor's balance describes. */
export function anchorEndDay(anchor: Pick<BalanceAnchor, 'date' | 'at'>): number {
  return toDayNumber(anchor.date) - (anchor.at === 'start' ? 1 : 0);
}

/** True for anchors that take part in reconciliation (all but `available`). */
export function isCheckedAnchor(anchor: Pick<BalanceAnchor, 'kind'>): boolean {
  return anchor.kind !== 'available';
}

/**
 * Reconciles one account.
 *
 * @param transactions the account's kept transactions.
 * @param anchors the account's anchors (any order; `available` ones are ignored).
 * @example
 * reconcileAccount('A', [{ bookingDate: '2026-01-05', amount: -500 }], [
 *   { kind: 'opening', date: '2026-01-01', at: 'start', amount: 1000, … },
 *   { kind: 'closing', date: '2026-01-31', at: 'end', amount: 500, … },
 * ]).reconciled // true
 */
export function reconcileAccount(
  accountId: string,
  transactions: readonly { readonly bookingDate: CalendarDate; readonly amount: number }[],
  anchors: readonly BalanceAnchor[],
): AccountReconciliation {
  const flows = cumulativeFlows(transactions);
  const checked = anchors
    .filter(isCheckedAnchor)
    .map((anchor, order) => ({ anchor, end: anchorEndDay(anchor), order }))
    .sort((a, b) => a.end - b.end || a.order - b.order);

  let first = flows.days.length > 0 ? (flows.days[0] as number) : Number.POSITIVE_INFINITY;
  let last = flows.days.length > 0 ? (flows.days[flows.days.length - 1] as number) : Number.NEGATIVE_INFINITY;
  for (const c of checked) {
    first = Math.min(first, toDayNumber(c.anchor.date));
    last = Math.max(last, c.end);
  }
  const firstDate = Number.isFinite(first) ? fromDayNumber(first) : null;
  const lastDate = Number.isFinite(last) ? fromDayNumber(last) : null;

  const base = checked.find((c) => c.anchor.kind === 'opening') ?? checked[0];
  if (base === undefined) {
    return {
      accountId,
      reconciled: null,
      relative: true,
      startingBalance: 0,
      startingFrom: null,
      checkedAnchors: 0,
      mismatchedAnchors: 0,
      firstMismatch: null,
      firstDate,
      lastDate,
      closingBalance: lastDate === null ? 0 : netThrough(flows, last),
      note: 'no stated balance: balances are relative',
    };
  }

  const startingBalance = base.anchor.amount - netThrough(flows, base.end);
  let checkedAnchors = 0;
  let mismatchedAnchors = 0;
  let firstMismatch: BalanceMismatch | null = null;
  let lastAgreementDay: number | null = base.end;
  for (const c of checked) {
    if (c === base) continue;
    checkedAnchors++;
    const computed = startingBalance + netThrough(flows, c.end);
    if (computed === c.anchor.amount) {
      if (firstMismatch === null && (lastAgreementDay === null || c.end > lastAgreementDay)) lastAgreementDay = c.end;
      continue;
    }
    mismatchedAnchors++;
    if (firstMismatch === null) {
      firstMismatch = {
        date: c.anchor.date,
        at: c.anchor.at,
        kind: c.anchor.kind,
        expected: c.anchor.amount,
        computed,
        difference: c.anchor.amount - computed,
        sourceFile: c.anchor.sourceFile,
        source: c.anchor.source,
        lastAgreement: lastAgreementDay !== null && lastAgreementDay < c.end ? fromDayNumber(lastAgreementDay) : null,
      };
    }
  }
  return {
    accountId,
    reconciled: checkedAnchors === 0 ? null : mismatchedAnchors === 0,
    relative: false,
    startingBalance,
    startingFrom: { kind: base.anchor.kind, date: base.anchor.date, sourceFile: base.anchor.sourceFile },
    checkedAnchors,
    mismatchedAnchors,
    firstMismatch,
    firstDate,
    lastDate,
    closingBalance: startingBalance + netThrough(flows, last),
    note: checkedAnchors === 0 ? 'one stated balance only: nothing to check it against' : null,
  };
}
