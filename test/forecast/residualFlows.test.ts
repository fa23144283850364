import { describe, expect, it } from 'vitest';
import type { BacktestReport, CandidateReport } from '../../engine/backtest/rollingOrigin';
import { createRng } from '../../engine/core/random';
import {
  bootstrapBlock,
  CANDIDATE_NAMES,
  MAX_TRAINING_DAYS,
  MIN_BACKTEST_DAYS,
  modelResidualFlow,
  pickByPinball,
} from '../../engine/forecast/residualFlows';

const START = '2025-01-01';

function noisy(n: number, seed: number): Float64Array {
  const rng = createRng(seed);
  const weekly = [0, 200, -300, 100, 900, 2_400, -2_000];
  return Float64Array.from({ length: n }, (_, t) =>
    Math.max(0, Math.round(6_000 + (weekly[t % 7] as number) + 1_500 * rng.normal())),
  );
}

function candidate(name: string, pinball: number | null, mase: number | null, failures = 0): CandidateReport {
  return {
    name,
    model: name,
    originsScored: 4 - failures,
    failures: Array.from({ length: failures }, () => ({ origin: 0, code: 'NOT_ENOUGH_DATA', message: 'x' })),
    mase,
    pinball: pinball === null ? null : { p10: pinball, p50: pinball, p90: pinball, mean: pinball },
    coverage80: null,
    coverage90: null,
    winkler80: null,
    winkler90: null,
    maseByOrigin: [],
  };
}

function report(candidates: CandidateReport[]): BacktestReport {
  return { horizon: 28, step: 28, period: 7, origins: [1, 2, 3, 4], candidates, winner: null, ranking: [], notes: [] };
}

describe('pickByPinball', () => {
  it('picks the lowest mean pinball loss, lets MASE break exact ties and skips candidates that failed anywhere', () => {
    expect(pickByPinball(report([candidate('a', 10, 0.5), candidate('b', 8, 0.9), candidate('c', 9, 0.1)]))).toBe('b');
    expect(pickByPinball(report([candidate('a', 8, 0.7), candidate('b', 8, 0.6)]))).toBe('b');
    expect(pickByPinball(report([candidate('a', 1, 0.1, 1), candidate('b', 8, 0.6)]))).toBe('b');
    expect(pickByPinball(report([candidate('a', null, null)]))).toBeNull();
  });
});

describe('bootstrapBlock', () => {
  it('draws single days when the residuals look random and weekly blocks otherwise', () => {
    expect(bootstrapBlock(true)).toBe(1);
    expect(bootstrapBlock(false)).toBe(7);
    expect(bootstrapBlock(null)).toBe(7);
  });
});

describe('modelResidualFlow', () => {
  it('never lets a backtest origin see its test window or anything after it', () => {
    const n = MIN_BACKTEST_DAYS + 60;
    const y = noisy(n, 4);
    const base = modelResidualFlow(y, START, 'inflow', '2026-01-01', 30).report.backtest as BacktestReport;
    const origins = base.origins;
    expect(origins).toHaveLength(4);
    // Change everything from the second origin on: the first origin's scores must not move.
    const changed = Float64Array.from(y, (v, t) => (t >= (origins[1] as number) ? v * 3 + 5_000 : v));
    const other = modelResidualFlow(changed, START, 'inflow', '2026-01-01', 30).report.backtest as BacktestReport;
    for (const c of base.candidates) {
      const o = other.candidates.find((x) => x.name === c.name) as CandidateReport;
      expect(o.maseByOrigin[0]).toBeCloseTo(c.maseByOrigin[0] as number, 10);
      expect(o.maseByOrigin[3]).not.toBeCloseTo(c.maseByOrigin[3] as number, 3);
    }
  });

  it('uses ETS without a backtest when the history is too short for one, and says so', () => {
    const y = noisy(MIN_BACKTEST_DAYS - 1, 5);
    const { report: r } = modelResidualFlow(y, START, 'outflow', '2026-01-01', 30);
    expect(r.backtest).toBeNull();
    expect(r.method).toBe(CANDIDATE_NAMES.ets);
    expect(r.notes.some((n) => n.includes('too short for a backtest'))).toBe(true);
  });

  it('fits on the last three years at most and says so', () => {
    const y = noisy(MAX_TRAINING_DAYS + 40, 6);
    const { report: r } = modelResidualFlow(y, START, 'outflow', '2026-01-01', 30);
    expect(r.trainingDays).toBe(MAX_TRAINING_DAYS);
    expect(r.notes).toContain(`Models were fitted on the last ${MAX_TRAINING_DAYS} days of history.`);
  });

  it('reports the chosen method as the backtest winner by pinball, with every candidate scored', () => {
    const { report: r } = modelResidualFlow(noisy(MIN_BACKTEST_DAYS + 10, 7), START, 'inflow', '2026-01-01', 30);
    const b = r.backtest as BacktestReport;
    expect(b.candidates.map((c) => c.name)).toEqual([
      CANDIDATE_NAMES.seasonalNaive,
      CANDIDATE_NAMES.ets,
      CANDIDATE_NAMES.decomposition,
    ]);
    expect(r.method).toBe(pickByPinball(b));
    for (const c of b.candidates) expect(c.failures).toEqual([]);
  });
});
