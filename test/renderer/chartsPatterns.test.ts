import { describe, expect, it } from 'vitest';
import type { CalendarMonthlyFit } from '../../engine/decompose/calendarSeasonality';
import type { SeriesDiagnostics } from '../../engine/stats/diagnostics';
import {
  dayOfMonthProfile,
  dayOfMonthTitle,
  differencingText,
  pClause,
  pValueText,
  specialistRows,
  weeklyBars,
  yearlyLeftOutNote,
} from '../../renderer/src/components/patterns/patternsFigures';

function fit(overrides: Partial<CalendarMonthlyFit> = {}): CalendarMonthlyFit {
  const dayEffects = new Float64Array(31);
  dayEffects[0] = 300; // rent on the 1st
  dayEffects[30] = 200; // month end
  const bucketCounts = new Int32Array(31).fill(36);
  bucketCounts[28] = 33; // day 29 is missing in most Februaries
  bucketCounts[29] = 24; // day 30 (not the month end) in 7 of 12 months
  return {
    dayEffects,
    lastBusinessDayEffect: 1773,
    lastBusinessDayEstimated: true,
    intercept: 0,
    shrinkage: 1,
    bucketCounts,
    lastBusinessDayCount: 36,
    component: new Float64Array(0),
    startDate: '2023-11-01',
    ...overrides,
  };
}

describe('day-of-month profile', () => {
  it('centres the day effects by how often each day occurs, and adds the last business day as its own bar', () => {
    const p = dayOfMonthProfile(fit());
    expect(p.labels.slice(0, 3)).toEqual(['1', '2', '3']);
    expect(p.labels.slice(-3)).toEqual(['30', 'End', 'LBD']);
    expect(p.values).toHaveLength(32);
    const counts = Array.from(fit().bucketCounts);
    const weighted = p.values.slice(0, 31).reduce((s, v, i) => s + v * (counts[i] as number), 0);
    expect(Math.abs(weighted)).toBeLessThan(1e-9);
    expect(p.values[0]! - p.values[1]!).toBeCloseTo(300, 12);
    expect(p.values[31]).toBe(1773);
  });

  it('leaves the LBD bar out when that effect was not estimated', () => {
    const p = dayOfMonthProfile(fit({ lastBusinessDayEstimated: false, lastBusinessDayEffect: 0 }));
    expect(p.labels).toHaveLength(31);
    expect(p.lastBusinessDay).toBe(false);
    expect(dayOfMonthTitle('End')).toBe('Last day of the month');
    expect(dayOfMonthTitle('7')).toBe('Day 7 of the month');
  });
});

describe('weekly bars and the yearly note', () => {
  it('reads the weekly profile Monday to Sunday', () => {
    expect(weeklyBars({ weeklyProfile: Float64Array.from([1, 2, 3, 4, 5, 6, 7]) })).toEqual([1, 2, 3, 4, 5, 6, 7]);
  });

  it('says why the yearly pattern was left out, in the decomposition’s words', () => {
    const estimated = { trend: true, weekly: true, monthly: true, yearly: false } as const;
    const note = 'The yearly pattern was left out: it needs two full years of history (731 days), there are 400.';
    expect(yearlyLeftOutNote({ estimated, notes: ['Other note.', note] })).toBe(note);
    expect(yearlyLeftOutNote({ estimated, notes: [] })).toMatch(/left out/);
    expect(yearlyLeftOutNote({ estimated: { ...estimated, yearly: true }, notes: [note] })).toBeNull();
  });
});

describe('figures for specialists', () => {
  it('writes p-values with their relation', () => {
    // Source: REFERENCES.md, Ljung–Box x = 1..5, lag 2: p = 0.4684465.
    expect(pValueText(0.4684465)).toBe('0.4684');
    expect(pClause(0.4684465)).toBe('p = 0.4684');
    expect(pClause(4.7e-7)).toBe('p < 0.0001');
    expect(pClause(0.1, 'atLeast')).toBe('p ≥ 0.1');
    expect(pClause(0.01, 'atMost')).toBe('p ≤ 0.01');
    expect(differencingText(1, 0, 7)).toBe('d = 1, D = 0 (period 7)');
    expect(differencingText(0, null, 7)).toBe('d = 0, D not computed (period 7)');
  });

  it('lists Ljung–Box, ADF, KPSS and differencing, and why a part was left out', () => {
    const d = {
      n: 1097,
      period: 7,
      maxLag: 35,
      level: 0.95,
      acf: null,
      pacf: null,
      whiteNoise: {
        isWhiteNoise: false,
        pValue: 4.67e-7,
        ljungBox: { statistic: 56.5568, df: 14, pValue: 4.67e-7, lag: 14, n: 1097 },
        lagsChecked: 14,
        lagsOutside: [7],
        shareOutside: 1 / 14,
        chanceOfThatManyOutside: 0.5,
        strongestLag: 7,
        sentence: '',
      },
      adf: null,
      kpss: {
        statistic: 0.0594,
        lag: 7,
        null: 'level',
        pValue: 0.1,
        pValueBound: 'atLeast',
        criticalValues: { p10: 0.347, p05: 0.463, p025: 0.574, p01: 0.739 },
      },
      ndiffs: 0,
      nsdiffs: 0,
      sentences: [],
      omitted: [{ component: 'adf', reason: 'The series is too short for a unit-root test.' }],
    } as unknown as SeriesDiagnostics;
    const rows = specialistRows(d);
    expect(rows.map((r) => r.name)).toEqual(['Ljung–Box Q', 'ADF', 'KPSS', 'Differencing suggested']);
    expect(rows[0]).toMatchObject({
      detail: '14 lags, df 14',
      value: 'Q = 56.557, p < 0.0001',
      reading: 'autocorrelation remains',
    });
    expect(rows[1]).toMatchObject({ value: '–', reading: 'The series is too short for a unit-root test.' });
    expect(rows[2]).toMatchObject({ value: 'η = 0.059, p ≥ 0.1', reading: 'stationarity not rejected at 5%' });
    expect(rows[3]?.value).toBe('d = 0, D = 0 (period 7)');
  });
});
