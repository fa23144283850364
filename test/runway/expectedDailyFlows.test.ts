import { describe, expect, it } from 'vitest';
import { expectedDailyFlows } from '../../engine/runway/expectedDailyFlows';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import type { FlowComponent } from '../../engine/simulate/types';

const rent: FlowComponent = {
  kind: 'recurring',
  key: 'rent',
  label: 'Rent',
  days: [2, 32],
  amount: { kind: 'empirical', values: [-90_000, -93_000] },
  timing: { offsets: [0, 1, 3], weights: [2, 1, 1] },
  probability: 0.8,
};
const invoice: FlowComponent = {
  kind: 'planned',
  key: 'invoice',
  label: 'Invoice',
  days: [10],
  amount: { kind: 'fixed', value: 200_000 },
  delayMin: 5,
  delayMax: 9,
  probability: 0.5,
};
const market: FlowComponent = {
  kind: 'intermittent',
  key: 'market',
  label: 'Market',
  sign: 1,
  probability: [0, 0, 0, 0, 0, 0.9, 0],
  phase: 3,
  sizes: [30_000, 50_000],
};
const other: FlowComponent = {
  kind: 'residual',
  key: 'other',
  label: 'Other outflows',
  sign: -1,
  errors: { kind: 'bootstrap', residuals: [-400, 100, 700, 200], meanBlock: 7 },
  model: { alpha: 0.2, beta: 0.05, gamma: 0.1, phi: 0.9, level: 1_000, trend: 50, season: [100, -50, -50], sigma: 300 },
  offset: [10, 20, 30],
};

describe('expectedDailyFlows', () => {
  it('spreads a recurring flow over its timing offsets, weighted by its chance', () => {
    const e = expectedDailyFlows([rent], 40);
    const each = 0.8 * -91_500; // chance × mean amount
    expect(e.outflow[2]).toBeCloseTo((-each * 2) / 4, 9);
    expect(e.outflow[3]).toBeCloseTo(-each / 4, 9);
    expect(e.outflow[5]).toBeCloseTo(-each / 4, 9);
    expect(e.outflow[4]).toBe(0);
    // The second occurrence's day-35 share is inside the horizon; nothing leaks past it.
    expect(e.outflow[35]).toBeCloseTo(-each / 4, 9);
    expect(Array.from(e.inflow).every((v) => v === 0)).toBe(true);
  });

  it('spreads a planned item evenly over its whole-day delays', () => {
    const e = expectedDailyFlows([invoice], 30);
    for (let d = 15; d <= 19; d++) expect(e.inflow[d]).toBeCloseTo((0.5 * 200_000) / 5, 9);
    expect(e.inflow[14]).toBe(0);
    expect(e.inflow[20]).toBe(0);
  });

  it('gives intermittent flows their weekday chance times the mean size', () => {
    const e = expectedDailyFlows([market], 14);
    // Day d uses probability[(phase + d) % 7]: the 0.9 day is d = 2 and d = 9.
    expect(e.inflow[2]).toBeCloseTo(0.9 * 40_000, 9);
    expect(e.inflow[9]).toBeCloseTo(0.9 * 40_000, 9);
    expect(e.inflow[3]).toBe(0);
  });

  it('runs the residual state recursion with the mean error', () => {
    // Hand recursion: e = mean(residuals) = 150; value_d = level + φ·trend + s + e + offset_d.
    const e = expectedDailyFlows([other], 3);
    let level = 1_000;
    let trend = 50;
    const season = [100, -50, -50];
    const expected: number[] = [];
    for (let d = 0; d < 3; d++) {
      const s = season[d] as number;
      expected.push(level + 0.9 * trend + s + 150 + [10, 20, 30][d]!);
      const nl = level + 0.9 * trend + 0.2 * 150;
      trend = 0.9 * trend + 0.05 * 150;
      level = nl;
      season[d] = s + 0.1 * 150;
    }
    for (let d = 0; d < 3; d++) expect(e.outflow[d]).toBeCloseTo(expected[d]!, 9);
  });

  it('agrees with the simulated mean balance within Monte Carlo error', () => {
    const components = [rent, invoice, market, other];
    const paths = 4000;
    const horizon = 40;
    const sim = simulateBalances({ startBalance: 0, horizon, paths, seed: 21, threshold: 0, components });
    const e = expectedDailyFlows(components, horizon);
    let cumulative = 0;
    for (let d = 0; d < horizon; d++) {
      cumulative += (e.inflow[d] as number) - (e.outflow[d] as number);
      let sum = 0;
      let sq = 0;
      for (let p = 0; p < paths; p++) {
        const b = sim.balances[d * paths + p] as number;
        sum += b;
        sq += b * b;
      }
      const mean = sum / paths;
      const se = Math.sqrt(Math.max(0, sq / paths - mean * mean) / paths);
      // 4.5 standard errors: 40 correlated days stay inside with overwhelming probability.
      expect(Math.abs(mean - cumulative), `day ${d}`).toBeLessThanOrEqual(4.5 * se + 1e-6);
    }
  });
});
