/**
 * Calendar dates as `YYYY-MM-DD` strings and as integer day numbers (days since
 * 1970-01-01). Statement dates are calendar dates, not instants: nothing here touches
 * `Date` or a time zone, so a date never drifts by a day.
 *
 * Day-number conversion follows H. Hinnant, "chrono-Compatible Low-Level Date
 * Algorithms" (days_from_civil / civil_from_days), exact for the proleptic Gregorian
 * calendar.
 */
import { EngineError } from './errors';

/** A calendar date `YYYY-MM-DD`. */
export type CalendarDate = string;

/** Days since 1970-01-01 (may be negative). */
export type DayNumber = number;

/** True for Gregorian leap years. @example isLeapYear(2024) // true */
export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** Days in `month` (1–12) of `year`. @example daysInMonth(2025, 2) // 28 */
export function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/** True when year/month/day name a real calendar day (1 ≤ year ≤ 9999). */
export function isValidYmd(year: number, month: number, day: number): boolean {
  return (
    Number.isInteger(year) &&
    Number.isInteger(month) &&
    Number.isInteger(day) &&
    year >= 1 &&
    year <= 9999 &&
    month >= 1 &&
    month <= 12 &&
    day >= 1 &&
    day <= daysInMonth(year, month)
  );
}

/** Day number of a civil date. @example daysFromCivil(1970, 1, 1) // 0 */
export function daysFromCivil(year: number, month: number, day: number): DayNumber {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** Civil date of a day number. @example civilFromDays(0) // { year: 1970, month: 1, day: 1 } */
export function civilFromDays(days: DayNumber): { year: number; month: number; day: number } {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

/** Formats year/month/day as `YYYY-MM-DD` (no validation). */
export function formatYmd(year: number, month: number, day: number): CalendarDate {
  return `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
}

/**
 * The digits of a strict `YYYY-MM-DD` (ASCII digits, dashes at 4 and 7, nothing else) as
 * the number YYYYMMDD, or -1. Read from char codes: dates are parsed for every entry of a
 * statement, so no regular expression and no match array.
 */
function packedIsoDate(text: string): number {
  if (typeof text !== 'string' || text.length !== 10) return -1;
  if (text.charCodeAt(4) !== 0x2d || text.charCodeAt(7) !== 0x2d) return -1;
  let value = 0;
  for (let i = 0; i < 10; i++) {
    if (i === 4 || i === 7) continue;
    const digit = text.charCodeAt(i) - 0x30;
    if (digit < 0 || digit > 9) return -1;
    value = value * 10 + digit;
  }
  return value;
}

/**
 * Parses a strict `YYYY-MM-DD` date; returns undefined when it is not a real day.
 * @example parseIsoDate('2025-04-31') // undefined
 */
export function parseIsoDate(text: string): { year: number; month: number; day: number } | undefined {
  const packed = packedIsoDate(text);
  if (packed < 0) return undefined;
  const year = Math.floor(packed / 10000);
  const month = Math.floor(packed / 100) % 100;
  const day = packed % 100;
  return isValidYmd(year, month, day) ? { year, month, day } : undefined;
}

/** True for a strict, real `YYYY-MM-DD` date. */
export function isCalendarDate(text: string): boolean {
  return parseIsoDate(text) !== undefined;
}

/**
 * Day number of a `YYYY-MM-DD` date.
 * @throws EngineError INVALID_DATE when the text is not a real calendar date.
 * @example toDayNumber('1970-01-02') // 1
 */
export function toDayNumber(date: CalendarDate): DayNumber {
  const packed = packedIsoDate(date);
  const year = Math.floor(packed / 10000);
  const month = Math.floor(packed / 100) % 100;
  const day = packed % 100;
  if (packed < 0 || !isValidYmd(year, month, day)) {
    throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${date}"`);
  }
  return daysFromCivil(year, month, day);
}

/** `YYYY-MM-DD` of a day number. @example fromDayNumber(1) // '1970-01-02' */
export function fromDayNumber(days: DayNumber): CalendarDate {
  const c = civilFromDays(days);
  return formatYmd(c.year, c.month, c.day);
}

/** Adds whole days to a calendar date. @example addDays('2024-02-28', 2) // '2024-03-01' */
export function addDays(date: CalendarDate, days: number): CalendarDate {
  return fromDayNumber(toDayNumber(date) + days);
}

/** ISO weekday of a day number: 1 = Monday … 7 = Sunday. @example isoWeekday(0) // 4 (Thursday) */
export function isoWeekday(days: DayNumber): number {
  return ((((days + 3) % 7) + 7) % 7) + 1;
}

/** True on Saturday and Sunday. */
export function isWeekend(days: DayNumber): boolean {
  return isoWeekday(days) >= 6;
}

/** Whole days from `a` to `b` (b − a). @example daysBetween('2024-01-01', '2024-03-01') // 60 */
export function daysBetween(a: CalendarDate, b: CalendarDate): number {
  return toDayNumber(b) - toDayNumber(a);
}

/**
 * Adds calendar months, clamping to the month's last day (Jan 31 + 1 month = Feb 28/29).
 * @example addMonths('2024-01-31', 1) // '2024-02-29'
 */
export function addMonths(date: CalendarDate, months: number): CalendarDate {
  const p = parseIsoDate(date);
  if (!p) throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${date}"`);
  const index = p.year * 12 + (p.month - 1) + months;
  const year = Math.floor(index / 12);
  const month = index - year * 12 + 1;
  return formatYmd(year, month, Math.min(p.day, daysInMonth(year, month)));
}
