/**
 * Business-day adjustment of scheduled dates, after the 2006 ISDA Definitions section 4.12
 * (Following, Modified Following, Preceding). Weekends only: public holidays differ by
 * country and are not modelled, which the recurring-flow timing spread absorbs.
 */
import { civilFromDays, daysFromCivil, daysInMonth, isWeekend, type DayNumber } from '../core/dates';

export type BusinessDayRule = 'none' | 'following' | 'modifiedFollowing' | 'preceding';

/**
 * Moves a day off the weekend by `rule`.
 * @example adjustBusinessDay(daysFromCivil(2025, 5, 31), 'modifiedFollowing') // Friday 2025-05-30
 */
export function adjustBusinessDay(day: DayNumber, rule: BusinessDayRule): DayNumber {
  if (rule === 'none' || !isWeekend(day)) return day;
  if (rule === 'preceding') {
    let d = day;
    while (isWeekend(d)) d--;
    return d;
  }
  let d = day;
  while (isWeekend(d)) d++;
  if (rule === 'modifiedFollowing' && civilFromDays(d).month !== civilFromDays(day).month) {
    d = day;
    while (isWeekend(d)) d--;
  }
  return d;
}

/** Last weekday (Mon–Fri) of a month. @example lastBusinessDayOfMonth(2025, 5) // Friday 2025-05-30 */
export function lastBusinessDayOfMonth(year: number, month: number): DayNumber {
  let d = daysFromCivil(year, month, daysInMonth(year, month));
  while (isWeekend(d)) d--;
  return d;
}
