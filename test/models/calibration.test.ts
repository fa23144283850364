/**
 * Calibration on synthetic processes whose true distribution is known: data are drawn from
 * ETS(A,N,N) and ETS(A,A,A) with fixed parameters (written out below, independent of the
 * engine's simulator), the model is estimated on the first part and its 90% intervals are
 * checked on the held-out part, over many seeded replications.
 */
import { describe, expect, it } from 'vitest';
import { fitEts } from '../../engine/models/ets';
import { forecastEts } from '../../engine/models/etsForecast';
import { createRng } from '../../engine/core/random';

/** Standard normals from a seeded engine generator. */
function normalSource(seed: number): () => number {
  const rng = createRng(seed);
  return () => rng.normal();
}

function coverage(
  replications: number,
  generate: (normal: () => number) => number[],
  train: number,
  fit: (y: number[]) => ReturnType<typeof fitEts>,
): number {
  let inside = 0;
  let total = 0;
  for (let r = 0; r < replications; r++) {
    const y = generate(normalSource(1000 + r));
    const model = fit(y.slice(0, train));
    const f = forecastEts(model, y.length - train, { levels: [0.9] });
    const band = f.intervals[0];
    if (!band) throw new Error('no interval');
    for (let h = 0; h < y.length - train; h++) {
      const v = y[train + h] as number;
      if (v >= (band.lower[h] as number) && v <= (band.upper[h] as number)) inside++;
      total++;
    }
  }
  return inside / total;
}

describe('90% prediction intervals cover about 90% of future values', () => {
  it('ETS(A,N,N): α = 0.3, σ = 2', () => {
    const cover = coverage(
      200,
      (normal) => {
        let level = 50;
        const y: number[] = [];
        for (let t = 0; t < 110; t++) {
          const e = 2 * normal();
          y.push(level + e);
          level += 0.3 * e;
        }
        return y;
      },
      100,
      (y) => fitEts(y, { trend: 'N', season: 'N' }),
    );
    expect(cover, `coverage ${cover}`).toBeGreaterThan(0.85);
    expect(cover, `coverage ${cover}`).toBeLessThan(0.95);
  });

  it('ETS(A,A,A) with m = 7: α = 0.2, β = 0.02, γ = 0.1, σ = 1.5', () => {
    const cover = coverage(
      80,
      (normal) => {
        let level = 100;
        let slope = 0.2;
        const season = [6, -2, -3, -1, 0, 4, -4]; // oldest first, sums to 0
        const y: number[] = [];
        for (let t = 0; t < 168; t++) {
          const e = 1.5 * normal();
          const s = season[t % 7] as number;
          y.push(level + slope + s + e);
          level = level + slope + 0.2 * e;
          slope += 0.02 * e;
          season[t % 7] = s + 0.1 * e;
        }
        return y;
      },
      154,
      (y) => fitEts(y, { trend: 'A', season: 'A', period: 7 }),
    );
    expect(cover, `coverage ${cover}`).toBeGreaterThan(0.85);
    expect(cover, `coverage ${cover}`).toBeLessThan(0.95);
  });
});
