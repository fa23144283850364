import { describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import type { HistoryEntry } from '../../engine/forecast/history';
import { averageWeeklyBurn } from '../../engine/runway/averageWeeklyBurn';
import { naiveRunway } from '../../engine/runway/naiveRunway';

function entry(date: string, amount: number): HistoryEntry {
  return { id: `${date}:${amount}`, date, amount, description: 'x' };
}

describe('averageWeeklyBurn', () => {
  it('averages the net outflow over the 91 days ending on the as-of date', () => {
    const asOf = '2026-10-31';
    const from = addDays(asOf, -90); // 2026-08-02
    const entries = [
      entry('2026-08-01', -999_999), // the day before the window: left out
      entry(from, -130_000),
      entry('2026-09-15', 26_000),
      entry('2026-09-16', -26_000),
      entry(asOf, -65_000),
    ];
    const burn = averageWeeklyBurn({ start: '2025-01-01', asOf, entries });
    expect(burn).toEqual({
      weeks: 13,
      from,
      to: asOf,
      complete: true,
      inflow: 26_000,
      outflow: 221_000,
      netPerWeek: -15_000,
      burnPerWeek: 15_000,
    });
  });

  it('uses the whole weeks there are when the history is shorter, and says so', () => {
    const burn = averageWeeklyBurn({ start: '2026-10-01', asOf: '2026-10-31', entries: [entry('2026-10-30', 40_000)] });
    expect(burn.weeks).toBe(4);
    expect(burn.from).toBe('2026-10-04');
    expect(burn.complete).toBe(false);
    expect(burn.burnPerWeek).toBe(-10_000);
    expect(() => averageWeeklyBurn({ start: '2026-10-28', asOf: '2026-10-31', entries: [] })).toThrow(/one full week/);
  });
});

describe('naiveRunway', () => {
  it('divides what is above the line by the weekly burn', () => {
    expect(naiveRunway(1_000_000, 0, 50_000)).toEqual({ weeks: 20, status: 'burning' });
    expect(naiveRunway(1_000_000, 200_000, 50_000)).toEqual({ weeks: 16, status: 'burning' });
  });
  it('has no runway figure when the account is not burning or already below', () => {
    expect(naiveRunway(1_000, 0, 0)).toEqual({ weeks: null, status: 'not-burning' });
    expect(naiveRunway(1_000, 0, -5)).toEqual({ weeks: null, status: 'not-burning' });
    expect(naiveRunway(-1, 0, 100)).toEqual({ weeks: 0, status: 'below' });
  });
});
