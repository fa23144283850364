import { describe, expect, it } from 'vitest';
import { rollingOriginBacktest, type CandidateModel } from '../../engine/backtest/rollingOrigin';
import {
  decompositionEtsCandidate,
  etsCandidate,
  intermittentCandidate,
  seasonalNaiveCandidate,
} from '../../engine/backtest/candidates';
import { EngineError } from '../../engine/core/errors';
import { createRng } from '../../engine/core/random';
import { classicalDecomposition } from '../../engine/models/classicalDecomposition';
import { expectClose } from '../helpers/expectAllClose';
import { normalQuantile } from '../../engine/stats/distributions';

/** A constant forecast with symmetric intervals of half-width `half` at every level. */
function flatCandidate(name: string, value: (train: Float64Array) => number, half: number): CandidateModel {
  return {
    name,
    fitForecast: (train, horizon, levels) => {
      const point = new Float64Array(horizon).fill(value(train));
      return {
        point,
        model: name,
        intervals: levels.map((level) => ({
          level,
          lower: point.map((v) => v - half),
          upper: point.map((v) => v + half),
        })),
      };
    },
  };
}

const weekly = [30, -10, -12, -8, 0, 18, -18];
function seasonalSeries(n: number, seed: number): Float64Array {
  const rng = createRng(seed);
  let level = 200;
  return Float64Array.from({ length: n }, (_, t) => {
    level += 0.5 * rng.normal();
    return level + (weekly[t % 7] as number) + 2 * rng.normal();
  });
}

describe('rollingOriginBacktest', () => {
  it('places the latest origins step apart, the last leaving exactly one horizon', () => {
    const y = Float64Array.from({ length: 100 }, (_, t) => t);
    const r = rollingOriginBacktest(y, [flatCandidate('last', (tr) => tr[tr.length - 1] as number, 1)], {
      horizon: 10,
      step: 5,
      minTrain: 30,
      maxOrigins: 6,
    });
    expect(r.origins).toEqual([65, 70, 75, 80, 85, 90]);
    expect(r.step).toBe(5);
  });

  it('computes MASE, coverage and pinball exactly on a hand-checkable case', () => {
    // y = t: the naive in-sample MAE is 1; a "last value" forecast misses by 1..h.
    const y = Float64Array.from({ length: 40 }, (_, t) => t);
    const r = rollingOriginBacktest(y, [flatCandidate('last', (tr) => tr[tr.length - 1] as number, 2.5)], {
      horizon: 4,
      minTrain: 20,
    });
    const c = r.candidates[0];
    expectClose(c?.mase as number, (1 + 2 + 3 + 4) / 4, 1e-12);
    // Errors 1,2,3,4 against half-width 2.5: two of four inside.
    expect(c?.coverage80).toBe(0.5);
    // 0.5-quantile score = mean absolute error.
    expectClose(c?.pinball?.p50 as number, 2.5, 1e-12);
    expect(r.winner).toBe('last');
  });

  it('breaks a MASE tie by the pinball score', () => {
    const y = seasonalSeries(120, 4);
    const mean = (tr: Float64Array) => tr.reduce((a, b) => a + b, 0) / tr.length;
    const r = rollingOriginBacktest(y, [flatCandidate('wide', mean, 200), flatCandidate('sharp', mean, 20)], {
      horizon: 7,
      minTrain: 56,
      period: 7,
    });
    expect(r.candidates[0]?.mase).toBe(r.candidates[1]?.mase);
    expect(r.winner).toBe('sharp');
    expect(r.ranking).toEqual(['sharp', 'wide']);
  });

  it('picks a seasonal model on strongly seasonal data', () => {
    const y = seasonalSeries(182, 1);
    const decomposer = (train: Float64Array, horizon: number) => {
      const d = classicalDecomposition(train, 7);
      return {
        seasonal: d.seasonal,
        futureSeasonal: Array.from({ length: horizon }, (_, h) => d.figure[(train.length + h) % 7] as number),
      };
    };
    const r = rollingOriginBacktest(
      y,
      [
        seasonalNaiveCandidate(1),
        etsCandidate(1, {}, 'non-seasonal ETS'),
        seasonalNaiveCandidate(7),
        etsCandidate(7),
        decompositionEtsCandidate(decomposer),
      ],
      { horizon: 14, minTrain: 84, period: 7, maxOrigins: 5 },
    );
    expect(r.origins).toHaveLength(5);
    expect(['seasonal naive', 'ETS (AICc)', 'decomposition + ETS']).toContain(r.winner);
    const byName = new Map(r.candidates.map((c) => [c.name, c]));
    expect(byName.get('ETS (AICc)')?.model).toMatch(/,A\)$/);
    // The non-seasonal models are clearly worse.
    expect(byName.get('naive')?.mase as number).toBeGreaterThan(1.5 * (byName.get(r.winner as string)?.mase as number));
    for (const c of r.candidates) {
      expect(c.coverage90 as number).toBeGreaterThanOrEqual(c.coverage80 as number);
    }
  });

  it('reads 80% and 90% bands from another interval assuming a Gaussian forecast', () => {
    // Only a 95% interval of half-width 1.96·σ with σ = 2: the 80% band is ±1.2816·σ.
    const onlyWide: CandidateModel = {
      name: 'only 95%',
      fitForecast: (train, horizon) => {
        const point = new Float64Array(horizon).fill(train[train.length - 1] as number);
        const half = normalQuantile(0.975) * 2;
        return {
          point,
          model: 'x',
          intervals: [{ level: 0.95, lower: point.map((v) => v - half), upper: point.map((v) => v + half) }],
        };
      },
    };
    const y = Float64Array.from({ length: 40 }, (_, t) => t);
    const r = rollingOriginBacktest(
      y,
      [onlyWide, flatCandidate('exact', (tr) => tr[tr.length - 1] as number, normalQuantile(0.9) * 2)],
      {
        horizon: 4,
        minTrain: 20,
      },
    );
    // Same point forecasts and the same implied 80% band give the same scores.
    expect(r.candidates[0]?.coverage80).toBe(r.candidates[1]?.coverage80);
    expectClose(r.candidates[0]?.pinball?.p90 as number, r.candidates[1]?.pinball?.p90 as number, 1e-12);
    expectClose(r.candidates[0]?.winkler80 as number, r.candidates[1]?.winkler80 as number, 1e-12);
  });

  it('reports a failing candidate and does not rank it', () => {
    const failing: CandidateModel = {
      name: 'fragile',
      fitForecast: (train) => {
        if (train.length < 70) throw new EngineError('NOT_ENOUGH_DATA', 'needs 70 values');
        return flatCandidate('x', () => 0, 1).fitForecast(train, 7, [0.8, 0.9]);
      },
    };
    const r = rollingOriginBacktest(seasonalSeries(100, 2), [failing, seasonalNaiveCandidate(7)], {
      horizon: 7,
      minTrain: 40,
      period: 7,
    });
    const fragile = r.candidates[0];
    expect(fragile?.failures.length).toBeGreaterThan(0);
    expect(fragile?.failures[0]?.code).toBe('NOT_ENOUGH_DATA');
    expect(fragile?.mase).toBeNull();
    expect(r.winner).toBe('seasonal naive');
    expect(r.notes.some((n) => n.startsWith('fragile failed'))).toBe(true);
  });

  it('ranks by pinball when MASE is undefined everywhere (all-zero training windows)', () => {
    const y = new Float64Array(60);
    y[59] = 5;
    const r = rollingOriginBacktest(y, [intermittentCandidate(), seasonalNaiveCandidate(1)], {
      horizon: 5,
      minTrain: 20,
    });
    expect(r.candidates.every((c) => c.mase === null)).toBe(true);
    expect(r.winner).not.toBeNull();
    expect(r.notes.some((n) => n.includes('ranked by mean pinball'))).toBe(true);
  });

  it('refuses too little data and bad settings', () => {
    const y = seasonalSeries(50, 3);
    const c = [seasonalNaiveCandidate(7)];
    try {
      rollingOriginBacktest(y, c, { horizon: 14, minTrain: 28 });
      expect.fail('should throw');
    } catch (e) {
      expect((e as EngineError).code).toBe('NOT_ENOUGH_DATA');
    }
    expect(() => rollingOriginBacktest(y, [], { horizon: 2, minTrain: 10 })).toThrow(EngineError);
    expect(() => rollingOriginBacktest(y, [...c, ...c], { horizon: 2, minTrain: 10 })).toThrow(EngineError);
    expect(() => rollingOriginBacktest(y, c, { horizon: 0, minTrain: 10 })).toThrow(EngineError);
  });
});
