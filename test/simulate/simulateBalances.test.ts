import { describe, expect, it } from 'vitest';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import { summariseBalances } from '../../engine/simulate/summariseBalances';
import { QUANTILE_LEVELS, type FlowComponent, type SimulationInput } from '../../engine/simulate/types';
import { normalQuantile } from '../../engine/stats/distributions';

function run(input: SimulationInput) {
  const sim = simulateBalances(input);
  return { sim, summary: summariseBalances(sim, input.threshold, input.components) };
}

const base = { startBalance: 100_000, horizon: 60, paths: 4000, seed: 11, threshold: 0 };

describe('simulateBalances', () => {
  it('keeps the start balance when there are no flows', () => {
    const { summary } = run({ ...base, components: [] });
    for (const q of summary.quantiles) expect(Array.from(q).every((v) => v === 100_000)).toBe(true);
    expect(summary.pCrossed[59]).toBe(0);
  });

  it('a certain one-off shifts every quantile by its amount from its day on', () => {
    const noise: FlowComponent = {
      kind: 'residual',
      key: 'other',
      label: 'Other outflows',
      sign: -1,
      errors: { kind: 'gaussian' },
      model: { alpha: 0.1, beta: 0, gamma: 0, phi: 1, level: 500, trend: 0, season: [], sigma: 200 },
      offset: [],
    };
    const item: FlowComponent = {
      kind: 'planned',
      key: 'kiln',
      label: 'Kiln deposit',
      days: [20],
      amount: { kind: 'fixed', value: -30_000 },
      delayMin: 0,
      delayMax: 0,
      probability: 1,
    };
    const without = run({ ...base, components: [noise] }).summary;
    const withItem = run({ ...base, components: [noise, item] }).summary;
    for (let k = 0; k < QUANTILE_LEVELS.length; k++) {
      for (let d = 0; d < 60; d++) {
        const shift = d >= 20 ? -30_000 : 0;
        expect((withItem.quantiles[k] as Float64Array)[d]).toBeCloseTo(
          (without.quantiles[k] as Float64Array)[d]! + shift,
          6,
        );
      }
    }
  });

  it('pCrossed matches the exact crossing probability of independent uncertain items', () => {
    // Each item alone takes the balance below zero, so P(crossed by day d) = 1 − Π(1 − p_i)
    // over items due by d: an exact answer to compare within Monte Carlo error √(p(1−p)/N).
    const items: FlowComponent[] = [
      {
        kind: 'planned',
        key: 'a',
        label: 'A',
        days: [10],
        amount: { kind: 'fixed', value: -150_000 },
        delayMin: 0,
        delayMax: 0,
        probability: 0.2,
      },
      {
        kind: 'planned',
        key: 'b',
        label: 'B',
        days: [30],
        amount: { kind: 'fixed', value: -150_000 },
        delayMin: 0,
        delayMax: 0,
        probability: 0.35,
      },
    ];
    const { summary } = run({ ...base, paths: 20_000, components: items });
    const check = (day: number, p: number) => {
      const se = Math.sqrt((p * (1 - p)) / 20_000);
      expect(Math.abs((summary.pCrossed[day] as number) - p)).toBeLessThan(4 * se + 1e-12);
    };
    check(9, 0);
    check(10, 0.2);
    check(29, 0.2);
    check(30, 1 - 0.8 * 0.65);
    expect(summary.standardError).toBeCloseTo(
      Math.sqrt((summary.pCrossed[59]! * (1 - summary.pCrossed[59]!)) / 20_000),
      12,
    );
    // pCrossed never decreases and is never below pBelow.
    for (let d = 1; d < 60; d++) expect(summary.pCrossed[d]).toBeGreaterThanOrEqual(summary.pCrossed[d - 1] as number);
    for (let d = 0; d < 60; d++) expect(summary.pCrossed[d]).toBeGreaterThanOrEqual(summary.pBelow[d] as number);
    // Item B drives the shortfall more than item A (it is likelier).
    expect(summary.drivers.map((d) => d.key)).toEqual(['b', 'a']);
  });

  it('reproduces the N(μd, σ²d) balance of i.i.d. Gaussian daily outflows', () => {
    // ETS(A,N,N) with alpha = 0 is i.i.d. N(level, σ²) per day; the day-d balance is then
    // start − d·level − N(0, dσ²): the 5% … 95% quantiles are known in closed form.
    const level = 1000;
    const sigma = 300;
    const comp: FlowComponent = {
      kind: 'residual',
      key: 'out',
      label: 'Other outflows',
      sign: -1,
      errors: { kind: 'gaussian' },
      model: { alpha: 0, beta: 0, gamma: 0, phi: 1, level, trend: 0, season: [], sigma },
      offset: [],
    };
    const { summary } = run({ ...base, paths: 20_000, components: [comp] });
    for (const d of [0, 29, 59]) {
      const n = d + 1;
      QUANTILE_LEVELS.forEach((p, k) => {
        const exact = 100_000 - n * level + normalQuantile(p) * sigma * Math.sqrt(n);
        // Quantile standard error ≈ √(p(1−p)/N) / density; a 4-SE band.
        const density = Math.exp(-0.5 * normalQuantile(p) ** 2) / Math.sqrt(2 * Math.PI) / (sigma * Math.sqrt(n));
        const se = Math.sqrt((p * (1 - p)) / 20_000) / density;
        expect(Math.abs((summary.quantiles[k] as Float64Array)[d]! - exact)).toBeLessThan(4 * se);
      });
      expect(Math.abs(summary.mean[d]! - (100_000 - n * level))).toBeLessThan(
        (4 * sigma * Math.sqrt(n)) / Math.sqrt(20_000),
      );
    }
  });

  it('spreads a recurring flow over its timing offsets with their weights', () => {
    const rent: FlowComponent = {
      kind: 'recurring',
      key: 'rent',
      label: 'Studio rent',
      days: [5],
      amount: { kind: 'fixed', value: -1000 },
      timing: { offsets: [0, 1, 3], weights: [6, 3, 1] },
      probability: 1,
    };
    const { summary } = run({ ...base, threshold: 99_500, paths: 10_000, components: [rent] });
    // Crossing day is the day the rent lands: 60% on day 5, 30% on 6, 10% on 8.
    const se = (p: number) => 4 * Math.sqrt((p * (1 - p)) / 10_000);
    expect(Math.abs(summary.pCrossed[5]! - 0.6)).toBeLessThan(se(0.6));
    expect(Math.abs(summary.pCrossed[6]! - 0.9)).toBeLessThan(se(0.9));
    expect(summary.pCrossed[7]).toBeCloseTo(summary.pCrossed[6]!, 12);
    expect(summary.pCrossed[8]).toBe(1);
    expect(summary.firstCrossing.p50).toBe(5);
    expect(summary.firstCrossing.p90).toBe(6);
  });

  it('uses common random numbers: removing one component leaves the others untouched', () => {
    const a: FlowComponent = {
      kind: 'residual',
      key: 'in',
      label: 'Other inflows',
      sign: 1,
      errors: { kind: 'bootstrap', residuals: [-50, 10, 40, -5, 5], meanBlock: 3 },
      model: {
        alpha: 0.2,
        beta: 0.01,
        gamma: 0.1,
        phi: 0.98,
        level: 300,
        trend: 1,
        season: [10, -5, 0, 20, -10, -15, 0],
        sigma: 30,
      },
      offset: [],
    };
    const b: FlowComponent = {
      kind: 'intermittent',
      key: 'repairs',
      label: 'Repairs',
      sign: -1,
      probability: [0.05],
      phase: 0,
      sizes: [400, 900],
    };
    const both = simulateBalances({ ...base, components: [a, b] });
    const onlyA = simulateBalances({ ...base, components: [a] });
    const onlyB = simulateBalances({ ...base, components: [b] });
    for (let i = 0; i < both.balances.length; i += 997) {
      expect(both.balances[i]).toBeCloseTo(onlyA.balances[i]! + onlyB.balances[i]! - 100_000, 6);
    }
  });

  it('gives byte-identical results for the same seed and different ones for another seed', () => {
    const comp: FlowComponent = {
      kind: 'residual',
      key: 'out',
      label: 'Other outflows',
      sign: -1,
      errors: { kind: 'gaussian' },
      model: { alpha: 0.3, beta: 0, gamma: 0, phi: 1, level: 800, trend: 0, season: [], sigma: 250 },
      offset: [],
    };
    const x = simulateBalances({ ...base, components: [comp] }).balances;
    const y = simulateBalances({ ...base, components: [comp] }).balances;
    const z = simulateBalances({ ...base, seed: 12, components: [comp] }).balances;
    expect(Buffer.from(x.buffer).equals(Buffer.from(y.buffer))).toBe(true);
    expect(Buffer.from(x.buffer).equals(Buffer.from(z.buffer))).toBe(false);
  });

  it('refuses absurd sizes and duplicate keys with a typed error', () => {
    expect(() => simulateBalances({ ...base, paths: 5, components: [] })).toThrow(/paths must be/);
    expect(() => simulateBalances({ ...base, horizon: -3, components: [] })).toThrow(/horizon must be/);
    const c: FlowComponent = {
      kind: 'intermittent',
      key: 'x',
      label: 'X',
      sign: 1,
      probability: [0.1],
      phase: 0,
      sizes: [1],
    };
    expect(() => simulateBalances({ ...base, components: [c, c] })).toThrow(/share the key/);
  });
});
