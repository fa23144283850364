import { describe, expect, it } from 'vitest';
import {
  addDays,
  addMonths,
  civilFromDays,
  daysBetween,
  daysFromCivil,
  daysInMonth,
  formatYmd,
  fromDayNumber,
  isCalendarDate,
  isLeapYear,
  isValidYmd,
  isWeekend,
  isoWeekday,
  parseIsoDate,
  toDayNumber,
} from '../../engine/core/dates';
import { EngineError } from '../../engine/core/errors';
import { errorCode } from './errorCode';

describe('isLeapYear', () => {
  it('follows the Gregorian rule: every 4th year, not centuries, but every 400th', () => {
    // Common practice, no source: the Gregorian leap-year rule (1900 no, 2000 yes, 2100 no).
    expect([1900, 2000, 2023, 2024, 2100, 2400].map(isLeapYear)).toEqual([false, true, false, true, false, true]);
  });
});

describe('daysInMonth', () => {
  it('gives month ends, February by leap year', () => {
    const lengths = Array.from({ length: 12 }, (_, i) => daysInMonth(2025, i + 1));
    expect(lengths).toEqual([31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]);
    expect(daysInMonth(2024, 2)).toBe(29);
    expect(daysInMonth(1900, 2)).toBe(28);
    expect(daysInMonth(2000, 2)).toBe(29);
  });
  it('sums to 365 or 366 days a year', () => {
    for (const year of [1999, 2000, 2024, 2100]) {
      let total = 0;
      for (let m = 1; m <= 12; m++) total += daysInMonth(year, m);
      expect(total).toBe(isLeapYear(year) ? 366 : 365);
    }
  });
});

describe('Hinnant day numbers', () => {
  it('counts from 1970-01-01 and uses the shift constant 719468 for 0000-03-01', () => {
    // Source: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms", days_from_civil:
    // 1970-01-01 is day 0 and 0000-03-01 is day -719468 (the constant in the algorithm).
    expect(daysFromCivil(1970, 1, 1)).toBe(0);
    expect(daysFromCivil(0, 3, 1)).toBe(-719468);
    expect(civilFromDays(-719468)).toEqual({ year: 0, month: 3, day: 1 });
  });

  it('gives the known day numbers of dates either side of the epoch', () => {
    // Source: Python 3.11 datetime.date(y, m, d) - datetime.date(1970, 1, 1), proleptic Gregorian.
    const known: [string, number][] = [
      ['2000-01-01', 10957],
      ['2000-02-29', 11016],
      ['2024-02-29', 19782],
      ['2026-10-31', 20757],
      ['1900-03-01', -25508],
      ['1601-01-01', -134774],
      ['0001-01-01', -719162],
      ['9999-12-31', 2932896],
    ];
    for (const [date, days] of known) {
      expect(toDayNumber(date), date).toBe(days);
      expect(fromDayNumber(days), String(days)).toBe(date);
    }
  });

  it('round-trips every day from 0001-01-01 to 9999-12-31 and steps one civil day at a time', () => {
    // Source: Hinnant's paper tests civil_from_days(days_from_civil(x)) == x over a range of
    // years and that consecutive day numbers are consecutive civil days; the same check here.
    let { year, month, day } = { year: 1, month: 1, day: 1 };
    const first = daysFromCivil(1, 1, 1);
    const last = daysFromCivil(9999, 12, 31);
    let mismatches = 0;
    for (let n = first; n <= last; n++) {
      const c = civilFromDays(n);
      if (c.year !== year || c.month !== month || c.day !== day || daysFromCivil(year, month, day) !== n) mismatches++;
      day++;
      if (day > daysInMonth(year, month)) {
        day = 1;
        month++;
        if (month > 12) {
          month = 1;
          year++;
        }
      }
    }
    expect(mismatches).toBe(0);
  });

  it('handles negative years (eras before year 0) without a gap', () => {
    expect(daysFromCivil(-1, 12, 31) + 1).toBe(daysFromCivil(0, 1, 1));
    expect(civilFromDays(daysFromCivil(-400, 2, 29))).toEqual({ year: -400, month: 2, day: 29 });
  });
});

describe('isoWeekday', () => {
  it('gives the ISO weekday (1 = Monday … 7 = Sunday) of known dates', () => {
    // Source: 2006 ISDA Definitions example in REFERENCES.md: 31 May 2025 is a Saturday.
    expect(isoWeekday(toDayNumber('2025-05-31'))).toBe(6);
    // Source: Python 3.11 datetime.date.isoweekday().
    expect(isoWeekday(toDayNumber('1970-01-01'))).toBe(4);
    expect(isoWeekday(toDayNumber('2000-01-01'))).toBe(6);
    expect(isoWeekday(toDayNumber('2024-02-29'))).toBe(4);
    expect(isoWeekday(toDayNumber('1601-01-01'))).toBe(1);
    expect(isoWeekday(toDayNumber('0001-01-01'))).toBe(1);
    expect(isoWeekday(toDayNumber('9999-12-31'))).toBe(5);
  });
  it('cycles through 1..7 for negative day numbers too', () => {
    const week = Array.from({ length: 14 }, (_, i) => isoWeekday(-10 + i));
    expect(week.slice(0, 7).sort()).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(week.slice(7)).toEqual(week.slice(0, 7));
    expect(isoWeekday(-1)).toBe(3); // 1969-12-31, the Wednesday before the epoch
  });
  it('marks Saturday and Sunday as the weekend', () => {
    expect(isWeekend(toDayNumber('2025-05-31'))).toBe(true);
    expect(isWeekend(toDayNumber('2025-06-01'))).toBe(true);
    expect(isWeekend(toDayNumber('2025-06-02'))).toBe(false);
  });
});

describe('parsing and validation', () => {
  it('accepts only strict, real YYYY-MM-DD dates', () => {
    expect(parseIsoDate('2024-02-29')).toEqual({ year: 2024, month: 2, day: 29 });
    for (const bad of [
      '2023-02-29',
      '2025-04-31',
      '2025-13-01',
      '2025-00-10',
      '2025-1-01',
      '25-01-01',
      ' 2025-01-01',
      '2025-01-01T00:00',
      '0000-01-01',
    ]) {
      expect(parseIsoDate(bad), bad).toBeUndefined();
      expect(isCalendarDate(bad), bad).toBe(false);
    }
  });
  it('validates year/month/day including non-integers', () => {
    expect(isValidYmd(2024, 2, 29)).toBe(true);
    expect(isValidYmd(2024, 2, 30)).toBe(false);
    expect(isValidYmd(2024, 1.5, 3)).toBe(false);
    expect(isValidYmd(10000, 1, 1)).toBe(false);
  });
  it('throws INVALID_DATE for bad text', () => {
    expect(() => toDayNumber('2025-02-30')).toThrow(EngineError);
    expect(errorCode(() => toDayNumber('nope'))).toBe('INVALID_DATE');
    expect(() => addMonths('2025-02-30', 1)).toThrow(EngineError);
  });
  it('pads years, months and days', () => {
    expect(formatYmd(987, 3, 4)).toBe('0987-03-04');
  });
});

describe('arithmetic', () => {
  it('adds days across month ends, leap days and year ends', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2024-02-28', 2)).toBe('2024-03-01');
    expect(addDays('2023-02-28', 1)).toBe('2023-03-01');
    expect(addDays('2025-12-31', 1)).toBe('2026-01-01');
    expect(addDays('2026-01-01', -1)).toBe('2025-12-31');
    expect(addDays('2026-03-15', 0)).toBe('2026-03-15');
  });
  it('counts days between dates', () => {
    expect(daysBetween('2024-01-01', '2024-03-01')).toBe(60);
    expect(daysBetween('2023-01-01', '2023-03-01')).toBe(59);
    expect(daysBetween('2025-03-01', '2024-03-01')).toBe(-365);
  });
  it('adds months, clamping to the month end', () => {
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29');
    expect(addMonths('2025-01-31', 1)).toBe('2025-02-28');
    expect(addMonths('2025-03-31', -1)).toBe('2025-02-28');
    expect(addMonths('2025-11-30', 3)).toBe('2026-02-28');
    expect(addMonths('2025-01-15', -13)).toBe('2023-12-15');
    expect(addMonths('2024-02-29', 12)).toBe('2025-02-28');
    expect(addMonths('2024-02-29', 48)).toBe('2028-02-29');
  });
});
