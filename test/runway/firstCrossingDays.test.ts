import { describe, expect, it } from 'vitest';
import { firstCrossingDays } from '../../engine/runway/firstCrossingDays';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import type { FlowComponent } from '../../engine/simulate/types';

describe('firstCrossingDays', () => {
  it('finds the first end-of-day balance strictly below the line, −1 when never', () => {
    // 3 paths × 4 days, day-major: balances[d * 3 + p].
    const balances = Float64Array.from([
      // day 0: p0, p1, p2
      100, 50, 10,
      // day 1
      80, 40, -5,
      // day 2
      60, 50, 20,
      // day 3
      40, 30, 0,
    ]);
    const sim = { paths: 3, horizon: 4, balances };
    expect(Array.from(firstCrossingDays(sim, 0))).toEqual([-1, -1, 1]);
    expect(Array.from(firstCrossingDays(sim, 50))).toEqual([3, 1, 0]);
    // A balance equal to the line is not below it.
    expect(Array.from(firstCrossingDays(sim, 40))).toEqual([-1, 3, 0]);
  });

  it('agrees with the crossings the simulation records for its own threshold', () => {
    const noise: FlowComponent = {
      kind: 'residual',
      key: 'out',
      label: 'Other outflows',
      sign: -1,
      errors: { kind: 'gaussian' },
      model: { alpha: 0.05, beta: 0, gamma: 0, phi: 1, level: 900, trend: 0, season: [], sigma: 2500 },
      offset: [],
    };
    const sim = simulateBalances({
      startBalance: 30_000,
      horizon: 45,
      paths: 500,
      seed: 5,
      threshold: 2_000,
      components: [noise],
    });
    expect(Array.from(firstCrossingDays(sim, 2_000))).toEqual(Array.from(sim.firstCrossing));
    // A higher line is crossed no later on any path.
    const higher = firstCrossingDays(sim, 10_000);
    for (let p = 0; p < sim.paths; p++) {
      const own = sim.firstCrossing[p] as number;
      if (own >= 0) expect(higher[p]).toBeGreaterThanOrEqual(0);
      if (own >= 0) expect(higher[p]).toBeLessThanOrEqual(own);
    }
  });

  it('refuses balances of the wrong length and a non-finite line', () => {
    expect(() => firstCrossingDays({ paths: 2, horizon: 3, balances: new Float64Array(5) }, 0)).toThrow(
      /paths × horizon/,
    );
    expect(() => firstCrossingDays({ paths: 1, horizon: 1, balances: new Float64Array(1) }, NaN)).toThrow(/finite/);
  });
});
