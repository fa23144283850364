/**
 * Calendar dates (`YYYY-MM-DD`) on a chart's time axis and in readable text. A date is
 * placed at local midnight of that calendar day — never parsed as UTC — so it shows as
 * the same day in every time zone (`new Date('2026-01-05')` would be UTC midnight, the
 * evening of 4 January west of Greenwich).
 */
import { format } from 'date-fns';

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function parts(date: string): [number, number, number] {
  const m = ISO_DATE.exec(date);
  if (!m) throw new RangeError(`"${date}" is not a YYYY-MM-DD date`);
  return [Number(m[1]), Number(m[2]), Number(m[3])];
}

/**
 * The local `Date` at midnight of a calendar date.
 * @throws RangeError for text that is not `YYYY-MM-DD`.
 * @example localDate('2026-01-05').getDate() // 5, in any time zone
 */
export function localDate(date: string): Date {
  const [y, m, d] = parts(date);
  const value = new Date(y, m - 1, d);
  value.setFullYear(y); // years 0–99 would otherwise be read as 1900–1999
  return value;
}

/** Milliseconds of local midnight of a calendar date: the x value on a time axis. */
export function dayTime(date: string): number {
  return localDate(date).getTime();
}

/**
 * A calendar date in words, by a date-fns pattern (default `d MMM yyyy`).
 * @example formatDay('2027-01-12') // '12 Jan 2027'
 * @example formatDay('2027-01-12', 'd MMM') // '12 Jan'
 */
export function formatDay(date: string, pattern = 'd MMM yyyy'): string {
  return format(localDate(date), pattern);
}

/** A time-axis value (local midnight ms) back in words. */
export function formatDayTime(time: number, pattern = 'd MMM yyyy'): string {
  return format(new Date(time), pattern);
}
