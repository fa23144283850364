/**
 * SWIFT dates: `YYMMDD` (6!n) and the `MMDD` entry date of field 61 (4!n).
 *
 * Two-digit years use a fixed pivot: `80`–`99` are 1980–1999 and `00`–`79` are 2000–2079.
 * SWIFT's own messages carry no century; the pivot keeps every statement of the last four
 * decades and the next five readable, and the writer refuses dates outside 1980–2079
 * instead of writing an ambiguous year.
 */
import { daysFromCivil, formatYmd, isValidYmd, parseIsoDate, type CalendarDate } from '../../core/dates';
import { EngineError } from '../../core/errors';

/** Two-digit years at or above the pivot belong to the 1900s, below it to the 2000s. */
export const SWIFT_YEAR_PIVOT = 80;
/** First year a two-digit SWIFT year can name (`80` → 1980). */
export const SWIFT_FIRST_YEAR = 1900 + SWIFT_YEAR_PIVOT;
/** Last year a two-digit SWIFT year can name (`79` → 2079). */
export const SWIFT_LAST_YEAR = 2000 + SWIFT_YEAR_PIVOT - 1;
/**
 * Furthest an entry date may lie from its value date (about half a year). The entry date
 * has no year of its own; the year closest to the value date is taken, which is only
 * unambiguous within half a year.
 */
export const MAX_ENTRY_DATE_DISTANCE_DAYS = 182;

/**
 * Century of a two-digit SWIFT year, by the pivot.
 * @example expandSwiftYear(99) // 1999
 * @example expandSwiftYear(25) // 2025
 */
export function expandSwiftYear(twoDigitYear: number): number {
  return twoDigitYear >= SWIFT_YEAR_PIVOT ? 1900 + twoDigitYear : 2000 + twoDigitYear;
}

/**
 * Reads a `YYMMDD` date.
 * @returns the calendar date, or a description of what is wrong (for a problem message).
 * @example parseSwiftDate('250131') // '2025-01-31'
 * @example parseSwiftDate('250431') // '"250431" is not a calendar date (YYMMDD)'
 */
export function parseSwiftDate(text: string): { date: CalendarDate } | { error: string } {
  if (!/^\d{6}$/.test(text)) return { error: `"${text}" is not 6 digits (YYMMDD)` };
  const year = expandSwiftYear(Number(text.slice(0, 2)));
  const month = Number(text.slice(2, 4));
  const day = Number(text.slice(4, 6));
  if (!isValidYmd(year, month, day)) return { error: `"${text}" is not a calendar date (YYMMDD)` };
  return { date: formatYmd(year, month, day) };
}

/**
 * Gives the `MMDD` entry (booking) date of field 61 its year: of the value date's year and
 * the years before and after, the one that puts the entry date closest to the value date.
 * So value date 2024-12-31 with entry date `0102` is 2025-01-02, and value date 2025-01-02
 * with entry date `1231` is 2024-12-31.
 *
 * @returns the calendar date, or a description of what is wrong.
 * @example resolveEntryDate('2024-12-31', '0102') // { date: '2025-01-02' }
 * @example resolveEntryDate('2025-01-03', '1231') // { date: '2024-12-31' }
 */
export function resolveEntryDate(valueDate: CalendarDate, mmdd: string): { date: CalendarDate } | { error: string } {
  if (!/^\d{4}$/.test(mmdd)) return { error: `"${mmdd}" is not 4 digits (MMDD)` };
  const value = parseIsoDate(valueDate);
  if (!value) return { error: `value date "${valueDate}" is not a calendar date` };
  const month = Number(mmdd.slice(0, 2));
  const day = Number(mmdd.slice(2, 4));
  if (month < 1 || month > 12 || day < 1 || day > 31) return { error: `"${mmdd}" is not a month and day (MMDD)` };
  const valueDay = daysFromCivil(value.year, value.month, value.day);
  let best: { date: CalendarDate; distance: number } | undefined;
  for (const year of [value.year - 1, value.year, value.year + 1]) {
    if (!isValidYmd(year, month, day)) continue;
    const distance = Math.abs(daysFromCivil(year, month, day) - valueDay);
    if (!best || distance < best.distance) best = { date: formatYmd(year, month, day), distance };
  }
  if (!best) return { error: `"${mmdd}" is not a month and day (MMDD)` };
  if (best.distance > MAX_ENTRY_DATE_DISTANCE_DAYS) {
    return { error: `"${mmdd}" is not a calendar day within half a year of the value date ${valueDate}` };
  }
  return { date: best.date };
}

function checkedParts(date: CalendarDate): { year: number; month: number; day: number } {
  const p = parseIsoDate(date);
  if (!p) throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${date}"`);
  if (p.year < SWIFT_FIRST_YEAR || p.year > SWIFT_LAST_YEAR) {
    throw new EngineError(
      'INVALID_DATE',
      `${date} cannot be written as a SWIFT YYMMDD date: two-digit years cover ${SWIFT_FIRST_YEAR}–${SWIFT_LAST_YEAR}`,
    );
  }
  return p;
}

/**
 * Writes a calendar date as `YYMMDD`.
 * @throws EngineError INVALID_DATE when the date is not a calendar date or its year lies
 *   outside 1980–2079 (the pivot's range).
 * @example formatSwiftDate('2025-01-31') // '250131'
 */
export function formatSwiftDate(date: CalendarDate): string {
  const p = checkedParts(date);
  return String(p.year % 100).padStart(2, '0') + String(p.month).padStart(2, '0') + String(p.day).padStart(2, '0');
}

/**
 * Writes the `MMDD` entry date of field 61.
 * @throws EngineError INVALID_DATE as {@link formatSwiftDate}.
 * @example formatEntryDate('2025-01-02') // '0102'
 */
export function formatEntryDate(date: CalendarDate): string {
  return formatSwiftDate(date).slice(2);
}
