/**
 * Cadences of recurring flows and the nominal schedules they produce. Month-based cadences
 * clamp to the month's length (the 31st in February is the 28th or 29th), then move off
 * the weekend by the flow's business-day rule.
 */
import { civilFromDays, daysFromCivil, daysInMonth, isoWeekday, type DayNumber } from '../core/dates';
import { adjustBusinessDay, lastBusinessDayOfMonth, type BusinessDayRule } from './businessDays';

/**
 * - `weekly`: every `everyWeeks` weeks on `weekday` (1 = Monday … 7 = Sunday); `phase` is
 *   the week number (days / 7, floored, from 1970-01-01 Thursday-based weeks) modulo everyWeeks.
 * - `monthDay`: every `everyMonths` months on day `day` (clamped to the month's end).
 * - `monthWeekday`: every `everyMonths` months on the `nth` `weekday` (nth −1 = the last one).
 * - `lastBusinessDay`: every `everyMonths` months on the last Monday–Friday.
 * For month cadences `phase` is (year·12 + month − 1) modulo everyMonths.
 */
export type Cadence =
  | { readonly kind: 'weekly'; readonly everyWeeks: number; readonly weekday: number; readonly phase: number }
  | { readonly kind: 'monthDay'; readonly everyMonths: number; readonly day: number; readonly phase: number }
  | {
      readonly kind: 'monthWeekday';
      readonly everyMonths: number;
      readonly nth: number;
      readonly weekday: number;
      readonly phase: number;
    }
  | { readonly kind: 'lastBusinessDay'; readonly everyMonths: number; readonly phase: number };

const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];

function ordinal(n: number): string {
  if (n === -1) return 'last';
  const s = n % 100 >= 11 && n % 100 <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th');
  return `${n}${s}`;
}

function monthWord(everyMonths: number): string {
  if (everyMonths === 1) return 'monthly';
  if (everyMonths === 3) return 'quarterly';
  if (everyMonths === 12) return 'yearly';
  return `every ${everyMonths} months`;
}

/** Month index (year·12 + month − 1) of a day. */
export function monthIndexOf(day: DayNumber): number {
  const c = civilFromDays(day);
  return c.year * 12 + c.month - 1;
}

/** Week index of a day (weeks counted from 1970-01-01). */
export function weekIndexOf(day: DayNumber): number {
  return Math.floor(day / 7);
}

/**
 * A short English description of a cadence.
 * @example describeCadence({ kind: 'monthDay', everyMonths: 1, day: 1, phase: 0 }) // 'monthly on the 1st'
 */
export function describeCadence(c: Cadence): string {
  switch (c.kind) {
    case 'weekly':
      return c.everyWeeks === 1
        ? `weekly on ${WEEKDAYS[c.weekday - 1]}`
        : `every ${c.everyWeeks} weeks on ${WEEKDAYS[c.weekday - 1]}`;
    case 'monthDay':
      if (c.everyMonths === 12) return `yearly on ${MONTHS[c.phase]} ${c.day}`;
      // The 31st is clamped to each month's end, so say what happens.
      if (c.day >= 31) return `${monthWord(c.everyMonths)} on the last day of the month`;
      return `${monthWord(c.everyMonths)} on the ${ordinal(c.day)}`;
    case 'monthWeekday':
      return `${monthWord(c.everyMonths)} on the ${ordinal(c.nth)} ${WEEKDAYS[c.weekday - 1]}`;
    case 'lastBusinessDay':
      return `${monthWord(c.everyMonths)} on the last business day`;
  }
}

/** Nominal period of a cadence in days (for tolerances and for telling an ended series). */
export function cadencePeriodDays(c: Cadence): number {
  return c.kind === 'weekly' ? 7 * c.everyWeeks : 30.44 * c.everyMonths;
}

function monthOccurrence(c: Cadence, year: number, month: number): DayNumber {
  switch (c.kind) {
    case 'monthDay':
      return daysFromCivil(year, month, Math.min(c.day, daysInMonth(year, month)));
    case 'lastBusinessDay':
      return lastBusinessDayOfMonth(year, month);
    case 'monthWeekday': {
      if (c.nth === -1) {
        let d = daysFromCivil(year, month, daysInMonth(year, month));
        while (isoWeekday(d) !== c.weekday) d--;
        return d;
      }
      let d = daysFromCivil(year, month, 1);
      while (isoWeekday(d) !== c.weekday) d++;
      return d + 7 * (c.nth - 1);
    }
    case 'weekly':
      throw new Error('unreachable');
  }
}

/**
 * Nominal occurrence days of a cadence with `from ≤ day ≤ to`, after the business-day rule
 * (a scheduled day that moves across `from` or `to` is kept or dropped by where it lands).
 *
 * @example scheduleDays({ kind: 'monthDay', everyMonths: 1, day: 31, phase: 0 }, d('2024-02-01'), d('2024-03-31'), 'none')
 *   // [2024-02-29, 2024-03-31]
 * Complexity: O((to − from) / period).
 */
export function scheduleDays(c: Cadence, from: DayNumber, to: DayNumber, rule: BusinessDayRule): DayNumber[] {
  const out: DayNumber[] = [];
  if (to < from) return out;
  if (c.kind === 'weekly') {
    const step = 7 * c.everyWeeks;
    // First day ≥ from−7 with the right weekday and week phase.
    let d = from - 7;
    while (isoWeekday(d) !== c.weekday) d++;
    while (((weekIndexOf(d) % c.everyWeeks) + c.everyWeeks) % c.everyWeeks !== c.phase) d += 7;
    for (; d <= to + 7; d += step) {
      const adjusted = adjustBusinessDay(d, rule);
      if (adjusted >= from && adjusted <= to) out.push(adjusted);
    }
    return out;
  }
  const first = monthIndexOf(from) - 1;
  const last = monthIndexOf(to) + 1;
  for (let m = first; m <= last; m++) {
    if (((m % c.everyMonths) + c.everyMonths) % c.everyMonths !== c.phase) continue;
    const year = Math.floor(m / 12);
    const month = m - year * 12 + 1;
    const adjusted = adjustBusinessDay(monthOccurrence(c, year, month), rule);
    if (adjusted >= from && adjusted <= to) out.push(adjusted);
  }
  return out;
}
