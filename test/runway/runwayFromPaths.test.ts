import { describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import { runwayFromCrossedShares } from '../../engine/runway/runwayFromCrossedShares';
import { runwayFromPaths } from '../../engine/runway/runwayFromPaths';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import { summariseBalances } from '../../engine/simulate/summariseBalances';
import type { FlowComponent } from '../../engine/simulate/types';

describe('runwayFromPaths', () => {
  it('reads the quantiles of the first-crossing time counted over all paths', () => {
    // 10 paths; crossing offsets 0 (1 path), 6 (4 paths), 13 (1 path), never (4 paths).
    // Shares crossed: 0.1 by offset 0, 0.5 by offset 6, 0.6 by offset 13, never 0.9.
    const first = Int32Array.from([6, -1, 0, 6, -1, 13, 6, -1, 6, -1]);
    const r = runwayFromPaths(first, '2026-10-31', 28, 0);
    expect(r.shareCrossing).toBeCloseTo(0.6, 12);
    expect(r.p10).toEqual({ level: 0.1, days: 1, weeks: 1 / 7, date: '2026-11-01', beyondHorizon: false });
    expect(r.p50).toEqual({ level: 0.5, days: 7, weeks: 1, date: '2026-11-07', beyondHorizon: false });
    expect(r.p90).toEqual({ level: 0.9, days: null, weeks: null, date: null, beyondHorizon: true });
    expect(r.horizonWeeks).toBe(4);
    expect(r.standardError).toBeCloseTo(Math.sqrt((0.6 * 0.4) / 10), 12);
  });

  it('reports every quantile beyond the horizon when no path crosses', () => {
    const r = runwayFromPaths(new Int32Array(50).fill(-1), '2026-01-31', 91);
    expect([r.p10.beyondHorizon, r.p50.beyondHorizon, r.p90.beyondHorizon]).toEqual([true, true, true]);
    expect(r.shareCrossing).toBe(0);
    expect(r.standardError).toBe(0);
  });

  it('gives the same dates as the simulation summary’s first-crossing range', () => {
    const burn: FlowComponent = {
      kind: 'residual',
      key: 'out',
      label: 'Other outflows',
      sign: -1,
      errors: { kind: 'gaussian' },
      model: { alpha: 0.02, beta: 0, gamma: 0, phi: 1, level: 1_000, trend: 0, season: [], sigma: 3_000 },
      offset: [],
    };
    const input = { startBalance: 40_000, horizon: 80, paths: 2000, seed: 9, threshold: 0, components: [burn] };
    const sim = simulateBalances(input);
    const summary = summariseBalances(sim, 0, input.components);
    const r = runwayFromPaths(sim.firstCrossing, '2026-03-31', 80, 0);
    const asDate = (d: number | null) => (d === null ? null : addDays('2026-03-31', d + 1));
    expect(r.p10.date).toBe(asDate(summary.firstCrossing.p10));
    expect(r.p50.date).toBe(asDate(summary.firstCrossing.p50));
    expect(r.p90.date).toBe(asDate(summary.firstCrossing.p90));
    expect(r.shareCrossing).toBe(summary.pCrossed[79]);
    // At least one quantile is inside the horizon, or the test would not test the dates.
    expect(r.p10.beyondHorizon).toBe(false);
  });

  it('refuses crossing days outside the horizon and decreasing shares', () => {
    expect(() => runwayFromPaths(Int32Array.from([3]), '2026-01-01', 3)).toThrow(/outside the horizon/);
    expect(() => runwayFromPaths(new Int32Array(0), '2026-01-01', 3)).toThrow(/at least one/);
    expect(() => runwayFromCrossedShares([0.2, 0.1], '2026-01-01', 0, 10)).toThrow(/non-decreasing/);
    expect(() => runwayFromCrossedShares([0.2], '2026-02-30', 0, 10)).toThrow(/calendar date/);
  });
});
