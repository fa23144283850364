/**
 * OFX date and date-time values (OFX Banking Specification 2.3, section 3.2.8.1 "Dates,
 * Times, and Time Zones"; the same form is in OFX 1.0.2):
 * `YYYYMMDD[HHMMSS[.XXX]][[gmt offset[:tz name]]]`, e.g. `19961005132200.124[-5:EST]`.
 */
import { formatYmd, isValidYmd, type CalendarDate } from '../../core/dates';

/** A parsed OFX date-time. `date` is the calendar date exactly as written (see parseOfxDate). */
export interface OfxDateTime {
  readonly date: CalendarDate;
  /** Seconds after local midnight, when the value has a time part. */
  readonly secondOfDay?: number;
  /** The written offset from GMT in minutes (e.g. -300 for `[-5:EST]`), when given. */
  readonly offsetMinutes?: number;
  /** The written time-zone name (`EST`), when given. */
  readonly zoneName?: string;
}

const DATE_TIME = /^(\d{4})(\d{2})(\d{2})(?:(\d{2})(\d{2})(?:(\d{2})(?:\.(\d{1,6}))?)?)?(?:\[([^\]]*)\])?$/;
const OFFSET = /^([+-]?)(\d{1,2})(?:\.(\d{1,2}))?(?::([A-Za-z][A-Za-z0-9_/+-]{0,31})?)?$/;

/**
 * Parses an OFX date or date-time value.
 *
 * The result's `date` is the calendar date **as written** (the `YYYYMMDD` part), not
 * the date after converting to UTC. A bank statement's booking date is a calendar date
 * in the bank's local time: `20240131230000[-5:EST]` is a 31 January posting, and
 * converting it to UTC (1 February, 04:00) would move a late-evening posting into the
 * next day, the next month, and here the next statement. The time and offset are still
 * read and validated, so a malformed value is refused, and are returned for callers that
 * need the instant.
 *
 * Accepted forms: `YYYYMMDD`, `YYYYMMDDHHMM` (seen in real files), `YYYYMMDDHHMMSS`,
 * with 1–6 fraction digits, each optionally followed by `[offset]` or
 * `[offset:NAME]`; the offset is signed hours with an optional `.MM` minutes
 * (`[+5.30:IST]`) or `.H` tenths of an hour (`[+5.5:IST]`), between −12 and +14.
 * Hours 00–23, minutes 00–59, seconds 00–60 (leap second).
 *
 * @returns the parsed value, or a string saying what is wrong.
 * @throws Never.
 * @example parseOfxDate('19961005132200.124[-5:EST]') // { date: '1996-10-05', secondOfDay: 48120, offsetMinutes: -300, zoneName: 'EST' }
 * @example parseOfxDate('19960431') // 'is not a calendar date: 1996-04-31 does not exist'
 */
export function parseOfxDate(text: string): OfxDateTime | string {
  const value = text.trim();
  const m = DATE_TIME.exec(value);
  if (!m) return 'is not an OFX date, expected YYYYMMDD[HHMMSS[.XXX]][[offset:TZ]]';
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  if (!isValidYmd(year, month, day)) {
    return `is not a calendar date: ${formatYmd(year, month, day)} does not exist`;
  }
  let secondOfDay: number | undefined;
  if (m[4] !== undefined) {
    const hour = Number(m[4]);
    const minute = Number(m[5]);
    const second = m[6] === undefined ? 0 : Number(m[6]);
    if (hour > 23 || minute > 59 || second > 60) {
      return `has an impossible time ${m[4]}:${m[5]}${m[6] === undefined ? '' : ':' + m[6]}`;
    }
    secondOfDay = hour * 3600 + minute * 60 + second;
  }
  let offsetMinutes: number | undefined;
  let zoneName: string | undefined;
  if (m[8] !== undefined) {
    const o = OFFSET.exec(m[8].trim());
    if (!o) return `has a malformed time-zone part [${m[8]}], expected [offset] or [offset:NAME] such as [-5:EST]`;
    const hours = Number(o[2]);
    // Files write half-hour zones both as `.30` (minutes) and `.5` (tenths of an hour).
    const fraction = o[3] === undefined ? 0 : o[3].length === 1 ? Number(o[3]) * 6 : Number(o[3]);
    if (fraction >= 60) return `has a malformed time-zone offset [${m[8]}]: minutes must be below 60`;
    const minutes = hours * 60 + fraction;
    const signed = o[1] === '-' ? -minutes : minutes;
    if (signed < -12 * 60 || signed > 14 * 60) {
      return `has a time-zone offset [${m[8]}] outside −12…+14 hours`;
    }
    offsetMinutes = signed === 0 ? 0 : signed;
    zoneName = o[4];
  }
  const result: { date: CalendarDate; secondOfDay?: number; offsetMinutes?: number; zoneName?: string } = {
    date: formatYmd(year, month, day),
  };
  if (secondOfDay !== undefined) result.secondOfDay = secondOfDay;
  if (offsetMinutes !== undefined) result.offsetMinutes = offsetMinutes;
  if (zoneName !== undefined) result.zoneName = zoneName;
  return result;
}

/**
 * Formats a calendar date as an OFX date value `YYYYMMDD` (the shortest form the
 * specification allows; no time, so no time zone can move it).
 *
 * @example formatOfxDate('2024-01-31') // '20240131'
 */
export function formatOfxDate(date: CalendarDate): string {
  return date.replace(/-/g, '');
}
