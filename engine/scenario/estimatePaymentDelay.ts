/**
 * How late an expected payment is likely to arrive, learned from the workspace's own
 * history where it can be, for a planned item's `delayDays`.
 *
 * Statements show when money arrived, never when an invoice was issued or fell due, so
 * lateness can only be measured against something else. Three methods, tried in order:
 *
 * 1. Invoice dates (best): the user has entered issued invoices (number, issue date,
 *    payment terms). Each is matched to the first incoming payment on or after its issue
 *    date whose text contains its number (compared on letters and digits only, so
 *    "INV-2025-031" matches "inv 2025/031"); lateness = payment date − (issue date + terms).
 *    Limit: invoices still unpaid on the as-of date are not observations; when some of them
 *    are already overdue the estimate is too short, and the explanation says how many.
 * 2. Monthly spacing: a counterparty that pays about once a month for monthly invoices.
 *    Lateness = payment date − the nominal due day of the month. The due day is the user's
 *    (`dueDay`) when given; otherwise it is the counterparty's own earliest usual payment
 *    day (the day after the longest gap between paying days around the month), so
 *    lateness is then relative to its best habit, not to the invoice terms: when every
 *    payment is late the delay is understated. Spacing is accepted as monthly when the
 *    median gap between payments is 25–35 days and none is under 10 days (a late payer
 *    may pay two months' invoices in one calendar month, but not days apart).
 * 3. Fallback: the user's own range, drawn uniformly.
 *
 * A method needs `minObservations` payments (default 4); below that the next is tried,
 * since a delay "learned" from two payments says little. The result gives the empirical
 * distribution (early payments as negative days) and the uniform whole-day range for the
 * plan schema (engine/scenario/delayDistribution.ts).
 */
import { addDays, daysBetween, daysInMonth, formatYmd, parseIsoDate, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import type { HistoryEntry } from '../forecast/history';
import {
  delayDistributionOf,
  delayMoments,
  uniformDelayRange,
  uniformDelays,
  type DelayDistribution,
} from './delayDistribution';
import { findInvoicePayments, type InvoicePayment } from './findInvoicePayments';

/** An invoice the user entered (statements do not list issued invoices). */
export interface IssuedInvoice {
  /** The invoice number as written on the invoice, e.g. "INV-2025-031". */
  readonly reference: string;
  readonly issued: CalendarDate;
  /** Payment terms in days after the issue date ("net 30" = 30). */
  readonly termsDays: number;
}

export interface PaymentDelayOptions {
  /** Text that the payer's counterparty or the description contains (case-insensitive). */
  readonly counterparty?: string;
  readonly invoices?: readonly IssuedInvoice[];
  /** Nominal due day of the month (1–31) for the monthly-spacing method. */
  readonly dueDay?: number;
  /** The user's range of whole days late, used when the history cannot tell. */
  readonly fallback: { readonly min: number; readonly max: number };
  /** Fewest payments a learned estimate needs (default 4). */
  readonly minObservations?: number;
  /** Last day of the history (for open invoices); default the last entry's date. */
  readonly asOf?: CalendarDate;
}

/** One observed lateness. */
export interface ObservedDelay {
  readonly reference: string | null;
  readonly paid: CalendarDate;
  readonly due: CalendarDate;
  /** Whole days after the due date; negative = early. */
  readonly daysLate: number;
}

export interface PaymentDelayEstimate {
  readonly method: 'invoice dates' | 'monthly spacing' | 'fallback';
  readonly observations: number;
  readonly observed: readonly ObservedDelay[];
  /** Empirical distribution of whole days late (the fallback's uniform range for method 3). */
  readonly distribution: DelayDistribution;
  /** For PlannedItem.delayDays: whole days, 0 ≤ min ≤ max ≤ 365. */
  readonly delayDays: { readonly min: number; readonly max: number };
  readonly meanDays: number;
  readonly sdDays: number;
  /** Plain words: what was measured against what, and the method's limits. */
  readonly explanation: string;
}

const DEFAULT_MIN_OBSERVATIONS = 4;
/** Two payments closer than this are not one invoice a month (instalments, a part payment). */
const MIN_MONTHLY_GAP = 10;

function matchesCounterparty(entry: HistoryEntry, text: string | undefined): boolean {
  if (!text) return true;
  const t = text.toLowerCase();
  return (entry.counterparty ?? '').toLowerCase().includes(t) || entry.description.toLowerCase().includes(t);
}

/** Upper-case letters and digits only, for matching invoice numbers however they are written. */
function compact(text: string): string {
  return text.toUpperCase().replace(/[^\p{L}\p{N}]/gu, '');
}

function containsReference(haystack: string, needle: string): boolean {
  if (!needle) return false;
  let from = 0;
  for (;;) {
    const i = haystack.indexOf(needle, from);
    if (i < 0) return false;
    const isDigit = (c: number) => c >= 48 && c <= 57;
    // "INV2025031" must not match inside "INV20250310", nor "4711" inside "94711".
    const before = i > 0 && isDigit(needle.charCodeAt(0)) && isDigit(haystack.charCodeAt(i - 1));
    if (!before && !isDigit(haystack.charCodeAt(i + needle.length))) return true;
    from = i + 1;
  }
}

function fromInvoices(
  invoices: readonly IssuedInvoice[],
  payments: readonly { readonly id: string; readonly date: CalendarDate }[],
  texts: ReadonlyMap<string, string>,
  asOf: CalendarDate,
): { observed: ObservedDelay[]; openOverdue: number; longestOpen: number } {
  const observed: ObservedDelay[] = [];
  let openOverdue = 0;
  let longestOpen = 0;
  const sorted = [...payments].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  invoices.forEach((inv, i) => {
    if (!parseIsoDate(inv.issued)) {
      throw new EngineError(
        'INVALID_DATE',
        `invoice ${i + 1} (${inv.reference}): issue date "${inv.issued}" is not YYYY-MM-DD`,
      );
    }
    if (!Number.isInteger(inv.termsDays) || inv.termsDays < 0 || inv.termsDays > 365) {
      throw new EngineError('INVALID_ARGUMENT', `invoice ${inv.reference}: terms must be whole days 0–365`);
    }
    const due = addDays(inv.issued, inv.termsDays);
    const key = compact(inv.reference);
    const paid = sorted.find((p) => p.date >= inv.issued && containsReference(texts.get(p.id) ?? '', key));
    if (paid) {
      observed.push({ reference: inv.reference, paid: paid.date, due, daysLate: daysBetween(due, paid.date) });
    } else if (due < asOf) {
      openOverdue++;
      longestOpen = Math.max(longestOpen, daysBetween(due, asOf));
    }
  });
  return { observed, openOverdue, longestOpen };
}

/** Start of the smallest arc of the month's days that holds every paying day. */
function habitualDueDay(days: readonly number[]): number {
  const sorted = [...new Set(days)].sort((a, b) => a - b);
  let bestGap = -1;
  let start = sorted[0] as number;
  for (let i = 0; i < sorted.length; i++) {
    const here = sorted[i] as number;
    const next = i + 1 < sorted.length ? (sorted[i + 1] as number) : (sorted[0] as number) + 31;
    if (next - here > bestGap) {
      bestGap = next - here;
      start = next > 31 ? next - 31 : next;
    }
  }
  return start;
}

/** The due date a payment belongs to: this month's, unless that is more than `early` days ahead. */
function dueDateFor(paid: CalendarDate, dueDay: number, early: number): CalendarDate {
  const p = parseIsoDate(paid) as { year: number; month: number; day: number };
  const thisMonth = formatYmd(p.year, p.month, Math.min(dueDay, daysInMonth(p.year, p.month)));
  if (daysBetween(thisMonth, paid) >= -early) return thisMonth;
  const year = p.month === 1 ? p.year - 1 : p.year;
  const month = p.month === 1 ? 12 : p.month - 1;
  return formatYmd(year, month, Math.min(dueDay, daysInMonth(year, month)));
}

function fromMonthlySpacing(
  payments: readonly InvoicePayment[],
  dueDay: number | undefined,
): { observed: ObservedDelay[]; dueDay: number } | null {
  const sorted = [...payments].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  if (sorted.length < 2) return null;
  const gaps = sorted.slice(1).map((p, i) => daysBetween((sorted[i] as InvoicePayment).date, p.date));
  gaps.sort((a, b) => a - b);
  if ((gaps[0] as number) < MIN_MONTHLY_GAP) return null;
  const mid = gaps.length >> 1;
  const median = gaps.length % 2 ? (gaps[mid] as number) : ((gaps[mid - 1] as number) + (gaps[mid] as number)) / 2;
  if (median < 25 || median > 35) return null;
  const nominal = dueDay ?? habitualDueDay(sorted.map((p) => Number(p.date.slice(8, 10))));
  // With the user's due day an early payment (up to a week) is early; with the habitual day
  // nothing is before it by construction.
  const early = dueDay === undefined ? 0 : 7;
  const observed = sorted.map((p) => {
    const due = dueDateFor(p.date, nominal, early);
    return { reference: p.reference, paid: p.date, due, daysLate: daysBetween(due, p.date) };
  });
  return { observed, dueDay: nominal };
}

function describeShare(observed: readonly ObservedDelay[]): string {
  const early = observed.filter((o) => o.daysLate < 0).length;
  return early > 0
    ? ` ${early} of ${observed.length} paid early; a plan item cannot pay before its date, so the range counts them as on time.`
    : '';
}

/**
 * @throws EngineError INVALID_ARGUMENT for a fallback range that is not whole days
 *   0 ≤ min ≤ max ≤ 365, a due day outside 1–31 or invoice terms outside 0–365;
 *   INVALID_DATE for a malformed invoice date.
 * @example
 * estimatePaymentDelay(history.entries, { counterparty: 'Saltmarrow', invoices, fallback: { min: 0, max: 30 } }).delayDays
 * Complexity: O(invoices · payments) for the invoice method, O(n log n) otherwise.
 */
export function estimatePaymentDelay(
  entries: readonly HistoryEntry[],
  options: PaymentDelayOptions,
): PaymentDelayEstimate {
  const { fallback } = options;
  if (
    !Number.isInteger(fallback.min) ||
    !Number.isInteger(fallback.max) ||
    fallback.min < 0 ||
    fallback.max < fallback.min ||
    fallback.max > 365
  ) {
    throw new EngineError('INVALID_ARGUMENT', 'the fallback delay must be whole days with 0 ≤ min ≤ max ≤ 365');
  }
  if (
    options.dueDay !== undefined &&
    !(Number.isInteger(options.dueDay) && options.dueDay >= 1 && options.dueDay <= 31)
  ) {
    throw new EngineError('INVALID_ARGUMENT', `due day must be a day of the month 1–31, got ${options.dueDay}`);
  }
  const minObservations = options.minObservations ?? DEFAULT_MIN_OBSERVATIONS;
  // Entered invoices are looked for in every incoming payment (a payer may write only the
  // number); the monthly method uses the invoice-like ones.
  const inflows = entries.filter((e) => e.amount > 0 && matchesCounterparty(e, options.counterparty));
  const payments = findInvoicePayments(inflows);
  const texts = new Map(inflows.map((e) => [e.id, compact(`${e.description} ${e.counterparty ?? ''}`)]));
  const asOf = options.asOf ?? entries.reduce((m, e) => (e.date > m ? e.date : m), '0000-01-01');
  const who = options.counterparty ? ` from "${options.counterparty}"` : '';
  const learned = (
    method: 'invoice dates' | 'monthly spacing',
    observed: ObservedDelay[],
    explanation: string,
  ): PaymentDelayEstimate => {
    const distribution = delayDistributionOf(observed.map((o) => o.daysLate));
    const { mean, sd } = delayMoments(distribution);
    return {
      method,
      observations: observed.length,
      observed,
      distribution,
      delayDays: uniformDelayRange(distribution),
      meanDays: mean,
      sdDays: sd,
      explanation: explanation + describeShare(observed),
    };
  };
  let tried = '';
  if (options.invoices && options.invoices.length > 0) {
    const r = fromInvoices(options.invoices, inflows, texts, asOf);
    if (r.observed.length >= minObservations) {
      const open =
        r.openOverdue > 0
          ? ` ${r.openOverdue} overdue invoice${r.openOverdue === 1 ? ' is' : 's are'} still unpaid (up to ${r.longestOpen} days so far) and not counted, so the estimate may be too short.`
          : '';
      return learned(
        'invoice dates',
        r.observed,
        `Learned from ${r.observed.length} of your invoices${who}: days between each invoice's due date (issue date plus terms) and the payment that names its number.${open}`,
      );
    }
    tried = `Only ${r.observed.length} of the entered invoices could be matched to payments (${minObservations} needed). `;
  }
  const monthly = fromMonthlySpacing(payments, options.dueDay);
  if (monthly && monthly.observed.length >= minObservations) {
    const against =
      options.dueDay !== undefined
        ? `the due day you gave (day ${monthly.dueDay} of each month)`
        : `its own earliest usual payment day (day ${monthly.dueDay} of the month), not the invoice terms, so if every payment is late the delay is understated; give the due day for a better estimate`;
    return learned(
      'monthly spacing',
      monthly.observed,
      `${tried}Learned from ${monthly.observed.length} monthly invoice payments${who}, measured against ${against}.`,
    );
  }
  const distribution = uniformDelays(fallback.min, fallback.max);
  const { mean, sd } = delayMoments(distribution);
  const reason =
    payments.length === 0
      ? `No invoice-like payments${who} were found in the statements`
      : `The ${payments.length} invoice-like payment${payments.length === 1 ? '' : 's'}${who} do not show a pattern to learn from (no matching invoice dates, no monthly spacing, or fewer than ${minObservations})`;
  return {
    method: 'fallback',
    observations: 0,
    observed: [],
    distribution,
    delayDays: { min: fallback.min, max: fallback.max },
    meanDays: mean,
    sdDays: sd,
    explanation: `${tried}${reason}, so your range of ${fallback.min}–${fallback.max} days late is used, each day equally likely.`,
  };
}
