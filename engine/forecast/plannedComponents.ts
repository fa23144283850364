/**
 * Turns a plan's items (an invoice due, a tax payment, a hire from a start date) into
 * simulation components: one-offs, or series expanded over the horizon.
 */
import { addMonths, fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import type { PlannedItem } from '../plan/plan';
import type { PlannedComponent } from '../simulate/types';

const STEP_DAYS: Partial<Record<NonNullable<PlannedItem['every']>, number>> = { week: 7, fortnight: 14 };
const STEP_MONTHS: Partial<Record<NonNullable<PlannedItem['every']>, number>> = { month: 1, quarter: 3, year: 12 };

/**
 * Nominal occurrence dates of an item through `lastDay` (inclusive). Month steps are taken
 * from the item's own date each time, so the 31st stays the month's last day.
 * @example occurrenceDates({ …, date: '2026-01-31', every: 'month' }, '2026-03-31') // ['2026-01-31', '2026-02-28', '2026-03-31']
 */
export function occurrenceDates(item: PlannedItem, lastDay: CalendarDate): CalendarDate[] {
  const end = item.until && item.until < lastDay ? item.until : lastDay;
  if (item.every === null) return item.date <= end ? [item.date] : [];
  const out: CalendarDate[] = [];
  const stepDays = STEP_DAYS[item.every];
  const stepMonths = STEP_MONTHS[item.every] ?? 1;
  for (let k = 0; k < 10_000; k++) {
    const date = stepDays ? fromDayNumber(toDayNumber(item.date) + k * stepDays) : addMonths(item.date, k * stepMonths);
    if (date > end) break;
    out.push(date);
  }
  return out;
}

/**
 * Simulation components of a plan's items. Occurrences before the first forecast day are
 * kept only when a delay can still bring them into the horizon.
 */
export function plannedComponents(
  items: readonly PlannedItem[],
  asOf: CalendarDate,
  horizon: number,
): PlannedComponent[] {
  const first = toDayNumber(asOf) + 1;
  const lastDate = fromDayNumber(first + horizon - 1);
  return items.map((item, i) => ({
    kind: 'planned' as const,
    key: `plan:${i}:${item.label}`,
    label: item.label,
    days: occurrenceDates(item, lastDate)
      .map((d) => toDayNumber(d) - first)
      .filter((d) => d + item.delayDays.max >= 0),
    amount: { kind: 'fixed' as const, value: item.amount },
    delayMin: item.delayDays.min,
    delayMax: item.delayDays.max,
    probability: item.probability,
  }));
}
