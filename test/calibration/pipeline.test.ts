// Calibration of the whole forecast pipeline (recurring detection, residual models chosen by
// backtest, Monte Carlo) against a synthetic process whose future distribution is known.
// Several independent two-year histories are drawn from the true process; each is forecast
// as of its last day, and the forecast is compared with futures drawn from the same process.
//
// Monte Carlo tolerances (stated here because the checks are statistical):
// - Coverage: the P5–P95 band is a 90% band; it must cover the realised balance on 85–95%
//   of days, pooled over R histories × K futures × H days. A fitted model cannot know the
//   true mean exactly (two years of data leave an error of about √(H/n) ≈ 0.29 outcome
//   standard deviations at the horizon), which by itself lowers the coverage of a 90% band
//   to about 88%; the 85–95% window allows for that and for the replication noise (its
//   standard error, the spread of per-history coverage over √R, is printed on failure).
// - Shortfall probability: each forecast's pCrossed at the horizon differs from the truth by
//   its Monte Carlo error and by what its history taught it; averaged over R histories it
//   must match the true crossing frequency within 3 standard errors, the standard error being
//   √(s²/R + p(1 − p)/N): s the spread of the R forecasts (Monte Carlo and estimation error
//   together), N the paths of the truth (Monte Carlo error of a probability √(p(1−p)/N),
//   Koehler, Brown and Haneuse 2009, The American Statistician 63(2)).
// - Spread: the width of the P5–P95 band at the horizon, averaged over the R histories, must
//   be within 10% of the true width (from 40,000 true futures); the replication standard
//   error of that average is about 4% here, the estimated ETS level adaptation being the
//   largest source of spread between histories.
import { describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import { runForecast, type ForecastResult } from '../../engine/forecast/runForecast';
import { QUANTILE_LEVELS } from '../../engine/simulate/types';
import { rentDays, STUDIO_PROCESS, trueCrossingFrequency, trueFuture, trueHistory } from './trueProcess';

const R = 6; // histories
const K = 200; // realised futures per history
const H = 60; // forecast days
const DAYS = 730; // two years of history
const START = '2024-01-01';
const AS_OF = addDays(START, DAYS - 1);
const FIRST = addDays(AS_OF, 1);
const START_BALANCE = 120_000;
const THRESHOLD = 0;
const P05 = QUANTILE_LEVELS.indexOf(0.05);
const P95 = QUANTILE_LEVELS.indexOf(0.95);

function mean(xs: readonly number[]): number {
  return xs.reduce((a, b) => a + b, 0) / xs.length;
}

function sd(xs: readonly number[]): number {
  const m = mean(xs);
  return Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1));
}

describe('forecast pipeline calibration on a process with a known future', () => {
  const forecasts: ForecastResult[] = [];
  for (let r = 0; r < R; r++) {
    const history = trueHistory(STUDIO_PROCESS, 100 + r, START, DAYS, START_BALANCE);
    forecasts.push(runForecast(history, { horizon: H, paths: 4000, seed: r + 1, threshold: THRESHOLD }));
  }

  it('finds the rent as the one recurring flow and models the daily flows as continuous', () => {
    for (const f of forecasts) {
      expect(f.recurring.map((x) => x.label)).toEqual(['Landlord Ltd']);
      expect(f.model.inflow.treatment).toBe('continuous');
      expect(f.model.outflow.treatment).toBe('continuous');
    }
  });

  it('covers the realised balance with its P5–P95 band on 85–95% of days', () => {
    const path = new Float64Array(H);
    const rent = rentDays(FIRST, H);
    const perHistory = forecasts.map((f, r) => {
      const rng = createRng(5000 + r);
      let covered = 0;
      for (let k = 0; k < K; k++) {
        trueFuture(STUDIO_PROCESS, rng, rent, START_BALANCE, path);
        for (let d = 0; d < H; d++) {
          const q = (f.daily[d] as ForecastResult['daily'][number]).quantiles;
          if ((path[d] as number) >= (q[P05] as number) && (path[d] as number) <= (q[P95] as number)) covered++;
        }
      }
      return covered / (K * H);
    });
    const coverage = mean(perHistory);
    const standardError = sd(perHistory) / Math.sqrt(R);
    const report = `coverage ${coverage.toFixed(4)} ± ${standardError.toFixed(4)} (per history ${perHistory.map((c) => c.toFixed(3)).join(', ')})`;
    console.log(report);
    expect(coverage, report).toBeGreaterThanOrEqual(0.85);
    expect(coverage, report).toBeLessThanOrEqual(0.95);
  });

  it('has a P5–P95 band at the horizon as wide as the true one, within 10% on average', () => {
    const rng = createRng(77);
    const rent = rentDays(FIRST, H);
    const path = new Float64Array(H);
    const ends = new Float64Array(40_000);
    for (let i = 0; i < ends.length; i++) {
      trueFuture(STUDIO_PROCESS, rng, rent, START_BALANCE, path);
      ends[i] = path[H - 1] as number;
    }
    ends.sort();
    const trueWidth =
      (ends[Math.floor(0.95 * ends.length)] as number) - (ends[Math.floor(0.05 * ends.length)] as number);
    const ratios = forecasts.map((f) => {
      const q = (f.daily[H - 1] as ForecastResult['daily'][number]).quantiles;
      return ((q[P95] as number) - (q[P05] as number)) / trueWidth;
    });
    const report = `width ratio ${mean(ratios).toFixed(3)} ± ${(sd(ratios) / Math.sqrt(R)).toFixed(3)} (per history ${ratios.map((x) => x.toFixed(3)).join(', ')})`;
    console.log(report);
    expect(Math.abs(mean(ratios) - 1), report).toBeLessThanOrEqual(0.1);
  });

  it('matches the true chance of going below the threshold by the horizon within 3 standard errors', () => {
    const truthPaths = 40_000;
    const truth = trueCrossingFrequency(STUDIO_PROCESS, 999, FIRST, H, START_BALANCE, THRESHOLD, truthPaths);
    const estimates = forecasts.map((f) => f.shortfall.probability);
    const estimate = mean(estimates);
    const standardError = Math.sqrt(sd(estimates) ** 2 / R + (truth * (1 - truth)) / truthPaths);
    const report = `pCrossed ${estimate.toFixed(4)} vs truth ${truth.toFixed(4)}, standard error ${standardError.toFixed(4)} (forecasts ${estimates.map((p) => p.toFixed(3)).join(', ')})`;
    console.log(report);
    // The case is informative: neither almost certain nor almost impossible.
    expect(truth).toBeGreaterThan(0.15);
    expect(truth).toBeLessThan(0.85);
    expect(Math.abs(estimate - truth), report).toBeLessThanOrEqual(3 * standardError);
  });
});
