/**
 * Date cells: the formats banks write (ISO `2025-03-01`, `01.03.2025`, `01/03/2025`,
 * `03/01/2025`, `20250301`, two-digit years), the format of a whole file inferred from all
 * of its rows, and the conversion to `YYYY-MM-DD`. A time after the date (`01.03.2025
 * 14:02`) is ignored: statement dates are calendar days.
 *
 * Two-digit years: 00–69 are 2000–2069 and 70–99 are 1970–1999 (the pivot POSIX
 * `strptime` uses for `%y`; From memory: POSIX.1-2008 strptime, "%y … values in the range
 * [69,99] shall refer to years 1969 to 1999 … [00,68] … 2000 to 2068"; Ebbline moves 69 to
 * 2069 because statements from 1969 do not occur).
 */
import { formatYmd, isValidYmd, type CalendarDate } from '../../core/dates';

/** Order of year, month and day in a date cell. */
export type CsvDateOrder = 'YMD' | 'DMY' | 'MDY';

/** A file's date format. */
export interface CsvDateFormat {
  readonly order: CsvDateOrder;
  /** Separator between the parts; '' for the compact `YYYYMMDD`. */
  readonly separator: '-' | '.' | '/' | '';
  readonly twoDigitYear: boolean;
}

/** Years 00–69 are read as 20xx, 70–99 as 19xx. */
export const TWO_DIGIT_YEAR_PIVOT = 70;

/** Canonical `dateFormat` names a mapping may give (D and DD, M and MM, Y and YYYY are the same). */
export const CSV_DATE_FORMAT_NAMES = [
  'YYYY-MM-DD',
  'YYYY/MM/DD',
  'YYYY.MM.DD',
  'YYYYMMDD',
  'DD.MM.YYYY',
  'DD/MM/YYYY',
  'DD-MM-YYYY',
  'MM/DD/YYYY',
  'MM-DD-YYYY',
  'DD.MM.YY',
  'DD/MM/YY',
  'DD-MM-YY',
  'MM/DD/YY',
  'MM-DD-YY',
] as const;

/**
 * The short label used in messages: `D.M.Y`, `M/D/Y`, `Y-M-D`, `D.M.YY`, `YYYYMMDD`.
 *
 * @example dateFormatLabel({ order: 'DMY', separator: '.', twoDigitYear: false }) // 'D.M.Y'
 */
export function dateFormatLabel(format: CsvDateFormat): string {
  if (format.separator === '') return 'YYYYMMDD';
  const y = format.twoDigitYear ? 'YY' : 'Y';
  const parts = format.order === 'YMD' ? [y, 'M', 'D'] : format.order === 'DMY' ? ['D', 'M', y] : ['M', 'D', y];
  return parts.join(format.separator);
}

/**
 * The canonical name (`DD.MM.YYYY`, `MM/DD/YY`, `YYYY-MM-DD` …), as a mapping gives it.
 *
 * @example dateFormatName({ order: 'MDY', separator: '/', twoDigitYear: true }) // 'MM/DD/YY'
 */
export function dateFormatName(format: CsvDateFormat): string {
  if (format.separator === '') return 'YYYYMMDD';
  const y = format.twoDigitYear ? 'YY' : 'YYYY';
  const parts = format.order === 'YMD' ? [y, 'MM', 'DD'] : format.order === 'DMY' ? ['DD', 'MM', y] : ['MM', 'DD', y];
  return parts.join(format.separator);
}

/**
 * Reads a format name such as `DD.MM.YYYY`, `D/M/Y`, `MM-DD-YY`, `YYYYMMDD` or `ISO`.
 * One or four Y mean a four-digit year, two Y a two-digit year.
 *
 * @returns undefined when the name is not a supported format.
 * @example parseDateFormatName('D.M.Y') // { order: 'DMY', separator: '.', twoDigitYear: false }
 */
export function parseDateFormatName(name: string): CsvDateFormat | undefined {
  const text = name.trim().toUpperCase();
  if (text === 'ISO') return { order: 'YMD', separator: '-', twoDigitYear: false };
  if (text === 'YYYYMMDD') return { order: 'YMD', separator: '', twoDigitYear: false };
  const m = /^(Y+|M+|D+)([./-])(Y+|M+|D+)\2(Y+|M+|D+)$/.exec(text);
  if (!m) return undefined;
  const tokens = [m[1], m[3], m[4]] as string[];
  const order = tokens.map((t) => t[0]).join('');
  if (order !== 'YMD' && order !== 'DMY' && order !== 'MDY') return undefined;
  const year = tokens.find((t) => t[0] === 'Y') as string;
  const month = tokens.find((t) => t[0] === 'M') as string;
  const day = tokens.find((t) => t[0] === 'D') as string;
  if (![1, 2, 4].includes(year.length) || month.length > 2 || day.length > 2) return undefined;
  if (order === 'YMD' && year.length === 2) return undefined;
  return { order, separator: m[2] as '-' | '.' | '/', twoDigitYear: year.length === 2 };
}

/** The parts of a date cell, before the order is known. Reused between calls (no allocation). */
interface DateParts {
  first: number;
  second: number;
  third: number;
  firstDigits: number;
  thirdDigits: number;
  /** Char code of the separator, 0 for compact YYYYMMDD. */
  separator: number;
}

const parts: DateParts = { first: 0, second: 0, third: 0, firstDigits: 0, thirdDigits: 0, separator: 0 };

function isBlank(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0xa0;
}

let cursor = 0;
let digitsRead = 0;

/** Reads up to `max + 1` digits at `cursor` (one more than allowed, so overlong runs show). */
function readDigits(text: string, end: number, max: number): number {
  let value = 0;
  let count = 0;
  while (cursor < end && count <= max) {
    const c = text.charCodeAt(cursor);
    if (c < 0x30 || c > 0x39) break;
    value = value * 10 + (c - 0x30);
    count++;
    cursor++;
  }
  digitsRead = count;
  return value;
}

/** Splits text[from, to) into three digit runs; false when it is not shaped like a date. */
function splitDate(text: string, from = 0, to = text.length): boolean {
  let end = to;
  cursor = from;
  while (cursor < end && isBlank(text.charCodeAt(cursor))) cursor++;
  while (end > cursor && isBlank(text.charCodeAt(end - 1))) end--;
  const a = readDigits(text, end, 8);
  const aDigits = digitsRead;
  if (aDigits === 8) {
    if (cursor < end && text.charCodeAt(cursor) !== 0x20 && text.charCodeAt(cursor) !== 0x54) return false;
    parts.first = Math.floor(a / 10000);
    parts.second = Math.floor(a / 100) % 100;
    parts.third = a % 100;
    parts.firstDigits = 4;
    parts.thirdDigits = 2;
    parts.separator = 0;
    return true;
  }
  if (aDigits === 0 || aDigits === 3 || aDigits > 4 || cursor >= end) return false;
  const sep = text.charCodeAt(cursor);
  if (sep !== 0x2e && sep !== 0x2f && sep !== 0x2d) return false;
  cursor++;
  const b = readDigits(text, end, 2);
  if (digitsRead === 0 || digitsRead > 2 || cursor >= end || text.charCodeAt(cursor) !== sep) return false;
  cursor++;
  const c = readDigits(text, end, 4);
  const cDigits = digitsRead;
  if (cDigits === 0 || cDigits === 3 || cDigits > 4) return false;
  if (aDigits === 4 ? cDigits > 2 : cDigits === 1) return false;
  // After the date: the end, or a time part after a blank or `T`.
  if (cursor < end) {
    const t = text.charCodeAt(cursor);
    if (t !== 0x20 && t !== 0x54 && t !== 0x09) return false;
  }
  parts.first = a;
  parts.second = b;
  parts.third = c;
  parts.firstDigits = aDigits;
  parts.thirdDigits = cDigits;
  parts.separator = sep;
  return true;
}

function separatorOf(code: number): CsvDateFormat['separator'] {
  return code === 0x2e ? '.' : code === 0x2f ? '/' : code === 0x2d ? '-' : '';
}

/** Result of looking at every date cell of a file. */
export interface DateInference {
  /** The format, when the cells settle it. */
  readonly format?: CsvDateFormat;
  /** Set when the cells do not settle the format: a line and a message for the problem. */
  readonly problem?: { readonly line: number; readonly message: string };
  /** True when day and month could not be told apart. */
  readonly ambiguous: boolean;
}

/**
 * Infers the date format from all date cells (booking and value dates) of a file. The first
 * cell shaped like a date sets the separator and year length. Day-first versus month-first
 * is decided by all rows: a first number above 12 means D/M/Y, a second number above 12
 * means M/D/Y; both in one file is a conflict; neither is ambiguous unless every cell reads
 * the same both ways (day = month). Dotted dates are day-first (Common practice, no source:
 * no bank writes month-first dates with dots). Cells that are no date at all are left to
 * the conversion, which reports them with their line. O(n).
 *
 * @example inferDateFormat(['03/04/2025', '13/04/2025'], [2, 3]).format?.order // 'DMY'
 * @example inferDateFormat(['03/04/2025'], [2]).ambiguous // true
 */
export function inferDateFormat(cells: readonly string[], lines: readonly number[]): DateInference {
  const inference = createDateFormatInference();
  for (let k = 0; k < cells.length; k++) inference.add(cells[k] as string, lines[k] as number);
  return inference.result();
}

/** `inferDateFormat` one cell at a time, without collecting the cells. */
export interface DateFormatInference {
  /** Looks at one date cell (or the span `start`–`end` of it) found on `line`; cheap once the format is settled. */
  add(cell: string, line: number, start?: number, end?: number): void;
  result(): DateInference;
}

/**
 * Creates an incremental `inferDateFormat`: `add` every date cell, then read `result()`.
 * Year-first and dotted files are settled by their first date, so the rest is skipped.
 *
 * @example
 * const i = createDateFormatInference();
 * i.add('03/04/2025', 2);
 * i.add('13/04/2025', 3);
 * i.result().format?.order // 'DMY'
 */
export function createDateFormatInference(): DateFormatInference {
  let reference = false;
  let settled = false;
  let separator = 0;
  let yearFirst = false;
  let thirdDigits = 0;
  let dayFirstLine = 0;
  let dayFirstCell = '';
  let monthFirstLine = 0;
  let monthFirstCell = '';
  let differLine = 0;
  let differCell = '';
  return {
    add(cell, line, start = 0, end = cell.length) {
      if (settled || start >= end || !splitDate(cell, start, end)) return;
      const isYearFirst = parts.firstDigits === 4;
      if (!reference) {
        reference = true;
        separator = parts.separator;
        yearFirst = isYearFirst;
        thirdDigits = parts.thirdDigits;
        if (yearFirst || separator === 0x2e) {
          settled = true;
          return;
        }
      } else if (parts.separator !== separator || isYearFirst !== yearFirst || parts.thirdDigits !== thirdDigits) {
        return; // a different shape: the conversion names it
      }
      if (parts.first > 12 && dayFirstLine === 0) {
        dayFirstLine = line;
        dayFirstCell = cell.slice(start, end).trim();
      }
      if (parts.second > 12 && monthFirstLine === 0) {
        monthFirstLine = line;
        monthFirstCell = cell.slice(start, end).trim();
      }
      if (parts.first !== parts.second && differLine === 0) {
        differLine = line;
        differCell = cell.slice(start, end).trim();
      }
      if (dayFirstLine > 0 && monthFirstLine > 0) settled = true;
    },
    result() {
      if (!reference) return { ambiguous: false };
      const sep = separatorOf(separator);
      if (yearFirst) return { format: { order: 'YMD', separator: sep, twoDigitYear: false }, ambiguous: false };
      const twoDigitYear = thirdDigits === 2;
      const dmy: CsvDateFormat = { order: 'DMY', separator: sep, twoDigitYear };
      const mdy: CsvDateFormat = { order: 'MDY', separator: sep, twoDigitYear };
      if (sep === '.') return { format: dmy, ambiguous: false };
      if (dayFirstLine > 0 && monthFirstLine > 0) {
        return {
          ambiguous: false,
          problem: {
            line: monthFirstLine,
            message:
              `date "${monthFirstCell}" puts the month first, but line ${dayFirstLine} ("${dayFirstCell}") ` +
              `puts the day first, expected one date format in the file`,
          },
        };
      }
      if (dayFirstLine > 0) return { format: dmy, ambiguous: false };
      if (monthFirstLine > 0) return { format: mdy, ambiguous: false };
      if (differLine === 0) return { format: dmy, ambiguous: false };
      return {
        ambiguous: true,
        problem: {
          line: differLine,
          message:
            `date "${differCell}" can be read as ${dateFormatLabel(dmy)} or ${dateFormatLabel(mdy)} and no date in the ` +
            `file has a number above 12 to settle it, expected an explicit csvMapping.dateFormat ` +
            `("${dateFormatName(dmy)}" or "${dateFormatName(mdy)}")`,
        },
      };
    },
  };
}

/**
 * Converts a date cell in `format` to `YYYY-MM-DD`. `start`/`end` read a span of `text`.
 * The last result is remembered, so a run of rows on one day makes one string.
 *
 * @returns the calendar date, or undefined (then `describeDateError` says why).
 * @example parseDateCell('29.02.2024', { order: 'DMY', separator: '.', twoDigitYear: false }) // '2024-02-29'
 * @example parseDateCell('31.04.2025', { order: 'DMY', separator: '.', twoDigitYear: false }) // undefined
 */
export function parseDateCell(
  text: string,
  format: CsvDateFormat,
  start = 0,
  end = text.length,
): CalendarDate | undefined {
  if (!splitDate(text, start, end) || separatorOf(parts.separator) !== format.separator) return undefined;
  let year: number;
  let month: number;
  let day: number;
  if (format.order === 'YMD') {
    if (parts.firstDigits !== 4) return undefined;
    year = parts.first;
    month = parts.second;
    day = parts.third;
  } else {
    if (parts.firstDigits > 2 || parts.thirdDigits !== (format.twoDigitYear ? 2 : 4)) return undefined;
    year = format.twoDigitYear ? parts.third + (parts.third < TWO_DIGIT_YEAR_PIVOT ? 2000 : 1900) : parts.third;
    month = format.order === 'DMY' ? parts.second : parts.first;
    day = format.order === 'DMY' ? parts.first : parts.second;
  }
  if (year === lastYear && month === lastMonth && day === lastDay) return lastIso;
  if (!isValidYmd(year, month, day)) return undefined;
  lastYear = year;
  lastMonth = month;
  lastDay = day;
  lastIso = year >= 1000 ? `${year}-${TWO_DIGITS[month]}-${TWO_DIGITS[day]}` : formatYmd(year, month, day);
  return lastIso;
}

let lastYear = 0;
let lastMonth = 0;
let lastDay = 0;
let lastIso = '';

/** '00' … '31', so formatting a date makes one string, not three padded ones. */
const TWO_DIGITS: readonly string[] = Array.from({ length: 32 }, (_, k) => String(k).padStart(2, '0'));

/**
 * Says why `parseDateCell(text, format)` failed, as "what was found, what was expected".
 *
 * @example describeDateError('31.04.2025', dmyDots) // 'date "31.04.2025" is not a calendar day, expected D.M.Y'
 */
export function describeDateError(text: string, format: CsvDateFormat, label = 'date'): string {
  const expected = dateFormatLabel(format);
  if (text.trim() === '') return `${label} is empty, expected a date like ${exampleDate(format)} (${expected})`;
  if (!splitDate(text)) return `${label} "${text}" is not a date, expected ${expected}`;
  const shapeMatches =
    separatorOf(parts.separator) === format.separator &&
    (format.order === 'YMD'
      ? parts.firstDigits === 4
      : parts.firstDigits <= 2 && parts.thirdDigits === (format.twoDigitYear ? 2 : 4));
  if (!shapeMatches) return `${label} "${text}" does not match the file's date format, expected ${expected}`;
  return `${label} "${text}" is not a calendar day, expected ${expected}`;
}

function exampleDate(format: CsvDateFormat): string {
  if (format.separator === '') return '20250131';
  const y = format.twoDigitYear ? '25' : '2025';
  const order = format.order === 'YMD' ? [y, '01', '31'] : format.order === 'DMY' ? ['31', '01', y] : ['01', '31', y];
  return order.join(format.separator);
}

/** True when the cell is shaped like a date in any supported format (for sniffing). */
export function looksLikeDate(text: string): boolean {
  if (!splitDate(text)) return false;
  if (parts.firstDigits === 4) return parts.second >= 1 && parts.second <= 12 && parts.third >= 1 && parts.third <= 31;
  return parts.first >= 1 && parts.first <= 31 && parts.second >= 1 && parts.second <= 31;
}
