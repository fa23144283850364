/**
 * Rolling-origin evaluation ("time series cross-validation", Hyndman and Athanasopoulos,
 * FPP3 section 5.10; Tashman 2000, IJF 16(4), 437–450): each candidate model is fitted to
 * the data up to an origin and scored on the next `horizon` values, for several origins;
 * the candidate with the lowest mean MASE wins.
 */
import { EngineError } from '../core/errors';
import { checkFinite, type Forecast, type Series } from '../models/forecastTypes';
import { normalQuantile } from '../stats/distributions';
import { intervalCoverage, mase, pinballLoss, seasonalNaiveScale, winklerScore } from './scores';

/** A model to compare: fit on `train` and forecast `horizon` steps with the given interval levels. */
export interface CandidateModel {
  readonly name: string;
  readonly fitForecast: (train: Float64Array, horizon: number, levels: readonly number[]) => Forecast;
}

/** Settings of {@link rollingOriginBacktest}. */
export interface RollingOriginConfig {
  /** Steps forecast from each origin. */
  readonly horizon: number;
  /** Distance between successive origins. Default: the horizon (non-overlapping test windows). */
  readonly step?: number;
  /** Shortest training window. */
  readonly minTrain: number;
  /** Seasonal period of the MASE scale (1: naive scaling). Default 1. */
  readonly period?: number;
  /** Fewest origins accepted. Default 4. */
  readonly minOrigins?: number;
  /** Most origins used (the latest ones). Default 8. */
  readonly maxOrigins?: number;
}

/** Scores of one candidate averaged over the origins. */
export interface CandidateReport {
  readonly name: string;
  /** Model name reported by the candidate's last forecast (e.g. the ETS model chosen). */
  readonly model: string | null;
  /** Origins at which the candidate produced a forecast. */
  readonly originsScored: number;
  readonly failures: readonly { readonly origin: number; readonly code: string; readonly message: string }[];
  /** Mean MASE over origins where the scale is positive; null when there is none or a fit failed. */
  readonly mase: number | null;
  /** FPP3 pinball scores of the 0.1, 0.5 and 0.9 quantiles and their mean. */
  readonly pinball: { readonly p10: number; readonly p50: number; readonly p90: number; readonly mean: number } | null;
  /** Share of test values inside the 80% and 90% intervals. */
  readonly coverage80: number | null;
  readonly coverage90: number | null;
  /** Mean Winkler scores of the 80% and 90% intervals. */
  readonly winkler80: number | null;
  readonly winkler90: number | null;
  /** MASE at each origin (null where undefined or failed). */
  readonly maseByOrigin: readonly (number | null)[];
}

/** The plain-data result of {@link rollingOriginBacktest}. */
export interface BacktestReport {
  readonly horizon: number;
  readonly step: number;
  readonly period: number;
  /** Training lengths (the test window starts at this index), oldest origin first. */
  readonly origins: readonly number[];
  readonly candidates: readonly CandidateReport[];
  /** Name of the winning candidate, or null when none could be scored at every origin. */
  readonly winner: string | null;
  /** Eligible candidates best first. */
  readonly ranking: readonly string[];
  readonly notes: readonly string[];
}

const LEVELS = [0.8, 0.9] as const;

/**
 * The p-quantile a forecast implies: the bound of a central interval with level
 * |2p − 1| when present, the median (or the point, for symmetric forecasts) at p = 0.5,
 * otherwise a Gaussian reading of the widest interval available (σ = half-width / z).
 */
function impliedQuantile(f: Forecast, p: number): Float64Array {
  if (p === 0.5) return f.median ?? f.point;
  const level = Math.abs(2 * p - 1);
  const exact = f.intervals.find((i) => Math.abs(i.level - level) < 1e-12);
  if (exact) return p < 0.5 ? exact.lower : exact.upper;
  const widest = f.intervals[f.intervals.length - 1];
  if (!widest) throw new EngineError('INVALID_ARGUMENT', `forecast of ${f.model} has no intervals`);
  const zWidest = normalQuantile(0.5 + widest.level / 2);
  const z = normalQuantile(p);
  return f.point.map((mu, h) => mu + (z * ((widest.upper[h] as number) - (widest.lower[h] as number))) / (2 * zWidest));
}

function intervalAt(f: Forecast, level: number): { lower: Float64Array; upper: Float64Array } {
  return { lower: impliedQuantile(f, (1 - level) / 2), upper: impliedQuantile(f, (1 + level) / 2) };
}

/**
 * Runs every candidate at each origin and scores its forecasts: MASE (Hyndman and Koehler
 * 2006, scaled by the training window's in-sample seasonal naive MAE with `period`),
 * pinball scores at 0.1/0.5/0.9 (FPP3 section 5.9; quantiles read from the 80% interval and
 * the median, or from a Gaussian reading of another interval), 80% and 90% coverage and
 * Winkler scores. Origins are the latest K = min(maxOrigins, ⌊(n − horizon − minTrain)/step⌋ + 1)
 * ones, spaced by `step`, the last one leaving exactly `horizon` test values.
 *
 * The winner has the lowest mean MASE among candidates that produced a forecast at every
 * origin; equal MASE (within 1e−12 relative) is decided by the mean pinball score, and when
 * MASE is undefined at every origin (training windows that repeat exactly) candidates are
 * ranked by pinball alone. A candidate that throws an EngineError is reported with its
 * failures and not ranked; other errors propagate.
 *
 * Complexity: K · (number of candidates) fits.
 *
 * @throws EngineError NOT_ENOUGH_DATA when fewer than `minOrigins` origins fit; INVALID_ARGUMENT
 *   for bad settings, non-finite data, no candidates, duplicate names or a forecast of the
 *   wrong length.
 * @example
 * const report = rollingOriginBacktest(y, [seasonalNaiveCandidate(7), etsCandidate(7)],
 *   { horizon: 14, minTrain: 56, period: 7 });
 * report.winner; // e.g. 'ETS (AICc)'
 */
export function rollingOriginBacktest(
  y: Series,
  candidates: readonly CandidateModel[],
  config: RollingOriginConfig,
): BacktestReport {
  checkFinite(y, 'y');
  const { horizon, minTrain } = config;
  const step = config.step ?? horizon;
  const period = config.period ?? 1;
  const minOrigins = config.minOrigins ?? 4;
  const maxOrigins = config.maxOrigins ?? 8;
  for (const [name, v, least] of [
    ['horizon', horizon, 1],
    ['step', step, 1],
    ['minTrain', minTrain, 1],
    ['period', period, 1],
    ['minOrigins', minOrigins, 1],
    ['maxOrigins', maxOrigins, minOrigins],
  ] as const) {
    if (!Number.isInteger(v) || v < least) {
      throw new EngineError('INVALID_ARGUMENT', `${name} must be an integer ≥ ${least}, got ${v}`);
    }
  }
  if (candidates.length === 0) throw new EngineError('INVALID_ARGUMENT', 'the backtest needs at least one candidate');
  if (new Set(candidates.map((c) => c.name)).size !== candidates.length) {
    throw new EngineError('INVALID_ARGUMENT', 'candidate names must be unique');
  }
  const n = y.length;
  const possible = n - horizon - minTrain >= 0 ? Math.floor((n - horizon - minTrain) / step) + 1 : 0;
  const count = Math.min(maxOrigins, possible);
  if (count < minOrigins) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `a rolling-origin backtest with horizon ${horizon}, step ${step} and ${minTrain} training values needs ` +
        `${minTrain + horizon + (minOrigins - 1) * step} values for ${minOrigins} origins, got ${n}`,
    );
  }
  const origins = Array.from({ length: count }, (_, k) => n - horizon - (count - 1 - k) * step);
  const series = Float64Array.from(y as ArrayLike<number>);
  const notes: string[] = [];
  const scaleDefined = origins.map((origin) => seasonalNaiveScale(series.subarray(0, origin), period) > 0);
  const undefinedScales = scaleDefined.filter((d) => !d).length;
  if (undefinedScales > 0) {
    notes.push(
      `MASE undefined at ${undefinedScales} of ${count} origins (training data repeat exactly); left out of the mean`,
    );
  }

  const reports: CandidateReport[] = candidates.map((candidate) => {
    const failures: { origin: number; code: string; message: string }[] = [];
    const maseByOrigin: (number | null)[] = [];
    const actualAll: number[] = [];
    const q: { p10: number[]; p50: number[]; p90: number[] } = { p10: [], p50: [], p90: [] };
    const bands: Record<'80' | '90', { lower: number[]; upper: number[] }> = {
      '80': { lower: [], upper: [] },
      '90': { lower: [], upper: [] },
    };
    let model: string | null = null;
    origins.forEach((origin, k) => {
      const train = series.slice(0, origin);
      const actual = series.subarray(origin, origin + horizon);
      let f: Forecast;
      try {
        f = candidate.fitForecast(train, horizon, LEVELS);
      } catch (error) {
        if (!(error instanceof EngineError)) throw error;
        failures.push({ origin, code: error.code, message: error.message });
        maseByOrigin.push(null);
        return;
      }
      if (f.point.length !== horizon) {
        throw new EngineError(
          'INVALID_ARGUMENT',
          `${candidate.name} returned ${f.point.length} values for horizon ${horizon}`,
        );
      }
      model = f.model;
      maseByOrigin.push(scaleDefined[k] ? mase(actual, f.point, train, period) : null);
      actualAll.push(...actual);
      q.p10.push(...impliedQuantile(f, 0.1));
      q.p50.push(...impliedQuantile(f, 0.5));
      q.p90.push(...impliedQuantile(f, 0.9));
      for (const level of LEVELS) {
        const band = intervalAt(f, level);
        const key = level === 0.8 ? '80' : '90';
        bands[key].lower.push(...band.lower);
        bands[key].upper.push(...band.upper);
      }
    });
    const scored = origins.length - failures.length;
    const defined = maseByOrigin.filter((v): v is number => v !== null);
    const complete = failures.length === 0;
    const pinball =
      scored > 0
        ? (() => {
            const p10 = pinballLoss(actualAll, q.p10, 0.1);
            const p50 = pinballLoss(actualAll, q.p50, 0.5);
            const p90 = pinballLoss(actualAll, q.p90, 0.9);
            return { p10, p50, p90, mean: (p10 + p50 + p90) / 3 };
          })()
        : null;
    return {
      name: candidate.name,
      model,
      originsScored: scored,
      failures,
      mase: complete && defined.length > 0 ? defined.reduce((a, b) => a + b, 0) / defined.length : null,
      pinball,
      coverage80: scored > 0 ? intervalCoverage(actualAll, bands['80'].lower, bands['80'].upper) : null,
      coverage90: scored > 0 ? intervalCoverage(actualAll, bands['90'].lower, bands['90'].upper) : null,
      winkler80: scored > 0 ? winklerScore(actualAll, bands['80'].lower, bands['80'].upper, 0.8) : null,
      winkler90: scored > 0 ? winklerScore(actualAll, bands['90'].lower, bands['90'].upper, 0.9) : null,
      maseByOrigin,
    };
  });

  const eligible = reports.filter((r) => r.failures.length === 0 && r.pinball !== null);
  const byMase = undefinedScales < count;
  if (!byMase) notes.push('MASE undefined at every origin: candidates ranked by mean pinball score');
  for (const r of reports) {
    if (r.failures.length > 0) notes.push(`${r.name} failed at ${r.failures.length} of ${count} origins: not ranked`);
  }
  const ranked = [...eligible].sort((a, b) => {
    if (byMase) {
      const ma = a.mase as number;
      const mb = b.mase as number;
      if (Math.abs(ma - mb) > 1e-12 * Math.max(1, Math.abs(ma), Math.abs(mb))) return ma - mb;
    }
    return (a.pinball?.mean ?? Infinity) - (b.pinball?.mean ?? Infinity);
  });
  return {
    horizon,
    step,
    period,
    origins,
    candidates: reports,
    winner: ranked[0]?.name ?? null,
    ranking: ranked.map((r) => r.name),
    notes,
  };
}
