import { describe, expect, it } from 'vitest';
import { decomposeDaily, projectDailySeasonality } from '../../engine/decompose/dailyDecomposition';
import { EngineError } from '../../engine/core/errors';
import { addDays } from '../../engine/core/dates';
import { maxAbsDiff, rmse, syntheticDaily } from './syntheticDaily';

const calendar = (d: number): number => (d === 1 ? 300 : d === 15 ? -100 : 0);

function codeOf(f: () => unknown): string | undefined {
  try {
    f();
  } catch (e) {
    return e instanceof EngineError ? e.code : 'not an EngineError';
  }
  return undefined;
}

describe('decomposeDaily on five invented years', () => {
  // Invented: trend 100 + 0.02·t, weekly effects, +300 on the 1st, −100 on the 15th, +200
  // on the month end, yearly sine (amplitude 30) plus its second harmonic, noise sd 5.
  // Five years from 2021-01-01 cover the leap day 2024-02-29.
  const days = 1826;
  const s = syntheticDaily({
    start: '2021-01-01',
    days: days + 60,
    seed: 11,
    noiseSd: 5,
    dayEffect: calendar,
    monthEndEffect: 200,
    yearlyAmplitude: 30,
  });
  const y = s.y.subarray(0, days);
  const d = decomposeDaily(y, '2021-01-01');

  it('estimates every component and leaves no notes', () => {
    expect(d.estimated).toEqual({ trend: true, weekly: true, monthly: true, yearly: true });
    expect(d.notes).toEqual([]);
  });

  it('recovers trend, weekly, calendar-monthly and yearly parts', () => {
    expect(rmse(d.weekly, s.weekly, 0, days)).toBeLessThan(1.2);
    expect(rmse(d.monthly as Float64Array, s.monthlyCentred, 0, days)).toBeLessThan(1.2);
    expect(rmse(d.yearly as Float64Array, s.yearly, 0, days)).toBeLessThan(0.8);
    expect(rmse(d.trend, s.trend, 0, days)).toBeLessThan(1.2);
    expect(rmse(d.remainder, new Float64Array(days))).toBeLessThan(5.2); // noise sd 5
  });

  it('adds back to the data', () => {
    const sum = d.trend.map((t, i) => t + d.weekly[i]! + d.monthly![i]! + d.yearly![i]! + d.remainder[i]!);
    expect(maxAbsDiff(sum, y)).toBeLessThan(1e-9);
    expect(
      maxAbsDiff(
        d.seasonallyAdjusted.map((v, i) => v - d.trend[i]!),
        d.remainder,
      ),
    ).toBeLessThan(1e-9);
  });

  it('projects the seasonal parts of the next 60 days', () => {
    const next = projectDailySeasonality(d, addDays('2021-01-01', days), 60);
    expect(rmse(next.weekly, s.weekly.subarray(days))).toBeLessThan(1.5);
    expect(rmse(next.monthly, s.monthlyCentred.subarray(days))).toBeLessThan(1.5);
    expect(rmse(next.yearly, s.yearly.subarray(days))).toBeLessThan(1.5);
    expect(
      maxAbsDiff(
        next.total,
        next.weekly.map((w, i) => w + next.monthly[i]! + next.yearly[i]!),
      ),
    ).toBe(0);
  });

  it('projects exactly its own monthly and yearly components over the history', () => {
    const past = projectDailySeasonality(d, '2021-01-01', days);
    expect(maxAbsDiff(past.monthly, d.monthly as Float64Array)).toBe(0);
    expect(maxAbsDiff(past.yearly, d.yearly as Float64Array)).toBe(0);
  });

  it('does not mutate its input', () => {
    const copy = y.slice();
    decomposeDaily(y, '2021-01-01', { iterations: 1 });
    expect(y).toEqual(copy);
  });
});

describe('decomposeDaily with short histories', () => {
  it('leaves yearly out under two full years and says so', () => {
    const s = syntheticDaily({
      start: '2023-03-10',
      days: 730,
      seed: 5,
      noiseSd: 5,
      dayEffect: calendar,
      monthEndEffect: 200,
    });
    const d = decomposeDaily(s.y, '2023-03-10');
    expect(d.estimated.yearly).toBe(false);
    expect(d.yearly).toBeNull();
    expect(d.yearlyFit).toBeNull();
    expect(d.notes).toEqual([
      'Yearly seasonality was left out: it needs at least two full years (731 days) of history and this series has 730.',
    ]);
    expect(rmse(d.weekly, s.weekly)).toBeLessThan(1.2);
    expect(rmse(d.monthly as Float64Array, s.monthlyCentred)).toBeLessThan(1.5);
    expect(rmse(d.trend, s.trend)).toBeLessThan(1.5);
    // One more day is enough for R's two-full-periods rule, and the yearly part appears.
    const longer = syntheticDaily({ start: '2023-03-10', days: 731, seed: 5, noiseSd: 5 });
    expect(decomposeDaily(longer.y, '2023-03-10').estimated.yearly).toBe(true);
  });

  it('leaves monthly out under 56 days and still gives trend and weekly', () => {
    const s = syntheticDaily({ start: '2024-02-01', days: 42, seed: 9, noiseSd: 1 });
    const d = decomposeDaily(s.y, '2024-02-01');
    expect(d.estimated).toEqual({ trend: true, weekly: true, monthly: false, yearly: false });
    expect(d.monthly).toBeNull();
    expect(d.notes).toHaveLength(2);
    expect(d.notes[0]).toMatch(/^Monthly \(day-of-month\) seasonality was left out/);
    expect(rmse(d.weekly, s.weekly)).toBeLessThan(2);
    const next = projectDailySeasonality(d, '2024-03-14', 7);
    expect(next.monthly.every((v) => v === 0)).toBe(true);
    expect(next.yearly.every((v) => v === 0)).toBe(true);
  });

  it('keeps one-off spikes out of the weekly pattern when robust', () => {
    const s = syntheticDaily({ start: '2024-01-01', days: 365, seed: 21, noiseSd: 2, weekly: true });
    const y = s.y.slice();
    for (const day of [40, 41, 150, 220, 300]) y[day] = (y[day] as number) + 4000; // invented one-off receipts
    const plain = decomposeDaily(y, '2024-01-01');
    const robust = decomposeDaily(y, '2024-01-01', { robust: true });
    expect(rmse(robust.weekly, s.weekly)).toBeLessThan(rmse(plain.weekly, s.weekly) / 2);
  });

  it('throws stable codes for bad input', () => {
    expect(codeOf(() => decomposeDaily(new Float64Array(14), '2024-01-01'))).toBe('NOT_ENOUGH_DATA');
    expect(codeOf(() => decomposeDaily([...new Array(20).fill(1), Number.NaN], '2024-01-01'))).toBe('INVALID_ARGUMENT');
    expect(codeOf(() => decomposeDaily(new Float64Array(30), '2024-13-01'))).toBe('INVALID_DATE');
    expect(codeOf(() => decomposeDaily(new Float64Array(30), '2024-01-01', { yearlyHarmonics: 0 }))).toBe(
      'INVALID_ARGUMENT',
    );
    expect(codeOf(() => decomposeDaily(new Float64Array(30), '2024-01-01', { iterations: 0 }))).toBe(
      'INVALID_ARGUMENT',
    );
    expect(
      codeOf(() => projectDailySeasonality(decomposeDaily(new Float64Array(30), '2024-01-01'), '2024-02-01', 1.5)),
    ).toBe('INVALID_ARGUMENT');
  });

  it('decomposes an all-zero series into zeros, never NaN', () => {
    const d = decomposeDaily(new Float64Array(800), '2022-01-01');
    for (const part of [d.trend, d.weekly, d.monthly, d.yearly, d.remainder]) {
      expect((part as Float64Array).every((v) => Math.abs(v) < 1e-9)).toBe(true);
    }
  });
});
