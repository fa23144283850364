import { describe, expect, it } from 'vitest';
import {
  CALENDAR_DAY_BUCKETS,
  MONTH_END_BUCKET,
  fitCalendarMonthly,
  projectCalendarMonthly,
} from '../../engine/decompose/calendarSeasonality';
import { EngineError } from '../../engine/core/errors';
import fc from 'fast-check';
import { addDays, civilFromDays, daysBetween, daysInMonth, fromDayNumber } from '../../engine/core/dates';
import { maxAbsDiff, syntheticDaily } from './syntheticDaily';

function detrended(series: { y: Float64Array; trend: Float64Array }): Float64Array {
  return series.y.map((v, i) => v - (series.trend[i] as number));
}

function codeOf(f: () => unknown): string | undefined {
  try {
    f();
  } catch (e) {
    return e instanceof EngineError ? e.code : 'not an EngineError';
  }
  return undefined;
}

/** A hand-made fit: only the effects matter for projection. */
function profile(effects: Record<number, number>, lastBusinessDay = 0) {
  const dayEffects = new Float64Array(CALENDAR_DAY_BUCKETS);
  for (const [k, v] of Object.entries(effects)) dayEffects[Number(k)] = v;
  return { dayEffects, lastBusinessDayEffect: lastBusinessDay };
}

describe('fitCalendarMonthly recovers known calendar effects', () => {
  // Invented series: rent-like +300 on the 1st, −100 on the 15th, +200 on the month end,
  // noise sd 5, four years including the leap day 2024-02-29.
  const series = syntheticDaily({
    start: '2021-01-01',
    days: 1461,
    seed: 101,
    noiseSd: 5,
    weekly: false,
    dayEffect: (d) => (d === 1 ? 300 : d === 15 ? -100 : 0),
    monthEndEffect: 200,
  });
  const r = detrended(series);

  it('gives the centred component within 3 (noise sd 5, 48 months)', () => {
    const fit = fitCalendarMonthly(r, '2021-01-01');
    // Per-bucket standard error is about 5/√48 ≈ 0.7.
    expect(maxAbsDiff(fit.component, series.monthlyCentred)).toBeLessThan(3);
    // With effects this clear the estimated penalty is tiny.
    expect(fit.shrinkage).toBeLessThan(0.1);
    expect(fit.bucketCounts[MONTH_END_BUCKET]).toBe(48);
    expect(fit.bucketCounts[30 - 1]).toBe(28); // day 30 not last: 7 months of 31 days × 4 years
    expect(fit.bucketCounts[29 - 1]).toBe(44); // day 29 not last: the 11 months other than February × 4 years
  });

  it('separates a last-business-day payment from the month end', () => {
    const lbd = syntheticDaily({
      start: '2021-01-01',
      days: 1461,
      seed: 7,
      noiseSd: 5,
      weekly: false,
      lastBusinessDayEffect: 500,
    });
    const fit = fitCalendarMonthly(detrended(lbd), '2021-01-01');
    expect(fit.lastBusinessDayEffect - fit.dayEffects[MONTH_END_BUCKET]!).toBeGreaterThan(400);
    expect(maxAbsDiff(fit.component, lbd.monthlyCentred)).toBeLessThan(4);
    // Without the indicator the weekend month ends cannot be told apart: the fit is worse.
    const without = fitCalendarMonthly(detrended(lbd), '2021-01-01', { lastBusinessDay: false });
    expect(without.lastBusinessDayEstimated).toBe(false);
    expect(maxAbsDiff(without.component, lbd.monthlyCentred)).toBeGreaterThan(100);
  });

  it('shrinks to about zero when there is no calendar pattern', () => {
    const noise = syntheticDaily({ start: '2022-03-05', days: 700, seed: 3, noiseSd: 10, weekly: false });
    const fit = fitCalendarMonthly(detrended(noise), '2022-03-05');
    expect(Math.max(...fit.component.map(Math.abs))).toBeLessThan(0.5);
    const unpenalised = fitCalendarMonthly(detrended(noise), '2022-03-05', { shrinkage: 1e-3 });
    expect(Math.max(...unpenalised.component.map(Math.abs))).toBeGreaterThan(Math.max(...fit.component.map(Math.abs)));
  });

  it('does not mutate its input and matches its own projection over the fitted dates', () => {
    const copy = r.slice();
    const fit = fitCalendarMonthly(r, '2021-01-01', { shrinkage: 2 });
    expect(r).toEqual(copy);
    expect(fit.shrinkage).toBe(2);
    expect(projectCalendarMonthly(fit, '2021-01-01', r.length)).toEqual(fit.component);
  });

  it('starts and ends mid-month without changing the centring rule', () => {
    const fit = fitCalendarMonthly(r.subarray(16, 16 + 400), '2021-01-17');
    // The fitted profile projected over a whole month sums to zero even if that month was partial.
    const jan = projectCalendarMonthly(fit, '2021-01-01', 31);
    expect(Math.abs(jan.reduce((a, b) => a + b, 0))).toBeLessThan(1e-9);
    expect(maxAbsDiff(fit.component, series.monthlyCentred.subarray(16, 416))).toBeLessThan(4);
  });
});

describe('projectCalendarMonthly on the calendar', () => {
  it('sums to zero over every calendar month, whatever its length', () => {
    const fit = profile({ 0: 50, 9: -20, 28: 7, 29: 11, [MONTH_END_BUCKET]: 30 }, 15);
    const from = '2023-01-01';
    const values = projectCalendarMonthly(fit, from, daysBetween(from, '2025-01-01'));
    // Months of 31, 28 (Feb 2023), 29 (Feb 2024) and 30 days.
    for (const [month, length] of [
      ['2023-01-01', 31],
      ['2023-02-01', 28],
      ['2024-02-01', 29],
      ['2024-04-01', 30],
    ] as const) {
      const offset = daysBetween(from, month);
      const sum = values.subarray(offset, offset + length).reduce((a, b) => a + b, 0);
      expect(Math.abs(sum)).toBeLessThan(1e-9);
    }
  });

  it('puts the month-end effect on 28 Feb in common years, 29 Feb in leap years, and the 31st', () => {
    const fit = profile({ [MONTH_END_BUCKET]: 10 });
    const feb2023 = projectCalendarMonthly(fit, '2023-02-27', 2); // 27th, 28th (last)
    expect(feb2023[0]).toBeCloseTo(-10 / 28, 12);
    expect(feb2023[1]).toBeCloseTo(10 - 10 / 28, 12);
    const feb2024 = projectCalendarMonthly(fit, '2024-02-28', 2); // 28th (not last), 29th (last)
    expect(feb2024[0]).toBeCloseTo(-10 / 29, 12);
    expect(feb2024[1]).toBeCloseTo(10 - 10 / 29, 12);
    const jan = projectCalendarMonthly(fit, '2024-01-30', 3); // 30th, 31st, 1 Feb
    expect(jan[0]).toBeCloseTo(-10 / 31, 12);
    expect(jan[1]).toBeCloseTo(10 - 10 / 31, 12);
    expect(jan[2]).toBeCloseTo(-10 / 29, 12);
    const apr = projectCalendarMonthly(fit, '2024-04-30', 1);
    expect(apr[0]).toBeCloseTo(10 - 10 / 30, 12);
  });

  it('uses day 29 and 30 effects only where those days are not the month end', () => {
    const fit = profile({ 28: 6, 29: 9 }); // day 29, day 30
    const values = projectCalendarMonthly(fit, '2024-01-29', 3); // Jan 29, 30 (not last), 31
    expect(values[0]).toBeCloseTo(6 - 15 / 31, 12);
    expect(values[1]).toBeCloseTo(9 - 15 / 31, 12);
    expect(values[2]).toBeCloseTo(-15 / 31, 12);
    // April: the 29th is "day 29", the 30th is the month end, so day 30's effect is absent.
    const april = projectCalendarMonthly(fit, '2024-04-29', 2);
    expect(april[0]).toBeCloseTo(6 - 6 / 30, 12);
    expect(april[1]).toBeCloseTo(-6 / 30, 12);
    // Leap February: the 29th is the month end, so neither effect applies.
    const feb = projectCalendarMonthly(fit, '2024-02-29', 1);
    expect(feb[0]).toBeCloseTo(0, 12);
  });

  it('places the last business day on the Friday before a weekend month end', () => {
    const fit = profile({}, 12);
    // Calendar facts (checked with GNU date): 2024-08-31 is a Saturday, 2024-03-31 a Sunday,
    // 2024-01-31 a Wednesday.
    const aug = projectCalendarMonthly(fit, '2024-08-29', 3);
    expect([aug[0], aug[1], aug[2]].map((v) => Math.round((v as number) * 1e9) / 1e9)).toEqual([
      Math.round((-12 / 31) * 1e9) / 1e9,
      Math.round((12 - 12 / 31) * 1e9) / 1e9,
      Math.round((-12 / 31) * 1e9) / 1e9,
    ]);
    const mar = projectCalendarMonthly(fit, '2024-03-29', 3);
    expect(mar[0]).toBeCloseTo(12 - 12 / 31, 12);
    expect(mar[2]).toBeCloseTo(-12 / 31, 12);
    const jan = projectCalendarMonthly(fit, '2024-01-31', 1);
    expect(jan[0]).toBeCloseTo(12 - 12 / 31, 12);
  });

  it('projects across year ends and returns an empty array for zero days', () => {
    const fit = profile({ 0: 5 });
    const values = projectCalendarMonthly(fit, addDays('2024-12-31', 0), 2);
    expect(values[1]).toBeCloseTo(5 - 5 / 31, 12); // 1 January 2025
    expect(projectCalendarMonthly(fit, '2025-01-01', 0)).toHaveLength(0);
  });
});

describe('calendar-monthly preconditions', () => {
  const r = new Float64Array(60);
  it('throws stable codes', () => {
    expect(codeOf(() => fitCalendarMonthly(r.subarray(0, 27), '2024-01-01'))).toBe('NOT_ENOUGH_DATA');
    expect(codeOf(() => fitCalendarMonthly([...r.subarray(0, 40), Number.NaN], '2024-01-01'))).toBe('INVALID_ARGUMENT');
    expect(codeOf(() => fitCalendarMonthly(r, '2024-02-30'))).toBe('INVALID_DATE');
    expect(codeOf(() => fitCalendarMonthly(r, '2024-01-01', { shrinkage: 0 }))).toBe('INVALID_ARGUMENT');
    expect(codeOf(() => projectCalendarMonthly(profile({}), '2024-01-01', -1))).toBe('INVALID_ARGUMENT');
    expect(
      codeOf(() =>
        projectCalendarMonthly({ dayEffects: new Float64Array(5), lastBusinessDayEffect: 0 }, '2024-01-01', 3),
      ),
    ).toBe('INVALID_ARGUMENT');
  });
  it('returns a zero component for an all-zero input, never NaN', () => {
    const fit = fitCalendarMonthly(r, '2024-01-01');
    expect(fit.component.every((v) => v === 0 || Math.abs(v) < 1e-12)).toBe(true);
  });
});

describe('projectCalendarMonthly properties', () => {
  it('sums to zero over every whole calendar month for any profile and start date', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1000, max: 1000, noNaN: true }), {
          minLength: CALENDAR_DAY_BUCKETS,
          maxLength: CALENDAR_DAY_BUCKETS,
        }),
        fc.double({ min: -1000, max: 1000, noNaN: true }),
        fc.integer({ min: daysBetween('1970-01-01', '1899-01-01'), max: daysBetween('1970-01-01', '2100-01-01') }),
        (effects, gamma, startDay) => {
          const start = fromDayNumber(startDay);
          const fit = { dayEffects: Float64Array.from(effects), lastBusinessDayEffect: gamma };
          const values = projectCalendarMonthly(fit, start, 400);
          let i = 0;
          while (i < values.length) {
            const { year, month, day } = civilFromDays(startDay + i);
            const length = daysInMonth(year, month);
            const inMonth = Math.min(length - day + 1, values.length - i);
            if (day === 1 && inMonth === length) {
              const sum = values.subarray(i, i + length).reduce((a, b) => a + b, 0);
              if (Math.abs(sum) > 1e-9 * 1000 * length) return false;
            }
            i += inMonth;
          }
          return true;
        },
      ),
      { numRuns: 200, seed: 20240229 },
    );
  });
});
