/**
 * Intermittent flows — series with many zero days, such as irregular supplier payments:
 * Croston's method (Croston 1972, Operational Research Quarterly 23(3)) with the
 * Syntetos–Boylan approximation (SBA; Syntetos and Boylan 2005, "The accuracy of
 * intermittent demand estimates", International Journal of Forecasting 21(2), 303–314),
 * the demand classification of Syntetos, Boylan and Croston (2005), Journal of the
 * Operational Research Society 56(5), 495–503, and a way to simulate future days.
 *
 * Values are magnitudes (an outflow series is passed as positive amounts).
 *
 * Simulation model (Ebbline's choice, documented here): each future day independently has
 * a flow with probability π and then a size from a size distribution whose mean is the
 * smoothed size ẑ, so the expected flow per day is π·ẑ, the point forecast:
 * - π = 1/p̂ for Croston and (1 − α/2)/p̂ for SBA — the SBA correction is the bias
 *   correction of 1/p̂, so it belongs to the occurrence probability;
 * - sizes: by default the past non-zero sizes resampled with equal weight, rescaled by
 *   ẑ / (their mean) so that recent levels carry over while the shape (skew, heavy tail) of
 *   real payments is kept; or a log-normal with the log-sizes' standard deviation and mean
 *   ẑ, smoother when there are few past flows.
 * Days are independent given the fitted model: clustering of flows is not modelled.
 */
import { EngineError } from '../core/errors';
import type { Rng } from '../core/random';
import {
  checkFinite,
  checkHorizon,
  checkLevels,
  type Forecast,
  type ForecastOptions,
  type Series,
} from './forecastTypes';
import { normalQuantile } from '../stats/distributions';

/** How {@link fitIntermittent} estimates. */
export interface IntermittentConfig {
  /** Smoothing parameter for both sizes and intervals. Default 0.1 (Croston's and R's default). */
  readonly alpha?: number;
  /** 'sba' (default) or the original 'croston'. */
  readonly variant?: 'sba' | 'croston';
  /** Size distribution for intervals and simulation. Default 'empirical'. */
  readonly sizeModel?: 'empirical' | 'lognormal';
}

/** A fitted intermittent-flow model (plain data). */
export interface FittedIntermittent {
  readonly kind: 'intermittent';
  readonly variant: 'sba' | 'croston';
  readonly alpha: number;
  readonly sizeModel: 'empirical' | 'lognormal';
  /** Smoothed non-zero size ẑ. */
  readonly demandLevel: number;
  /** Smoothed interval between non-zero values p̂ (in periods). */
  readonly intervalLevel: number;
  /** Forecast mean per period: ẑ/p̂ (Croston) or (1 − α/2)·ẑ/p̂ (SBA); 0 with no flows. */
  readonly rate: number;
  /** Probability of a flow on a given future period, π. */
  readonly probability: number;
  /** Past non-zero sizes rescaled to mean ẑ, ascending (the empirical size distribution). */
  readonly sizes: Float64Array;
  /** Log-normal size model: mean and standard deviation of log size (mean set so E[size] = ẑ). */
  readonly logMean: number;
  readonly logSd: number;
  readonly n: number;
  readonly nonZero: number;
}

/** Demand classes of Syntetos, Boylan and Croston (2005). */
export type DemandPattern = 'smooth' | 'erratic' | 'intermittent' | 'lumpy' | 'none';

/** Output of {@link classifyDemand}. */
export interface DemandClassification {
  /** Average inter-demand interval: mean gap between successive non-zero values, the first counted from the start. */
  readonly adi: number;
  /** Squared coefficient of variation of the non-zero sizes (sample variance / mean²); 0 with one value. */
  readonly cv2: number;
  readonly pattern: DemandPattern;
}

function checkMagnitudes(y: Series): void {
  checkFinite(y, 'y');
  for (let i = 0; i < y.length; i++) {
    if ((y[i] as number) < 0) {
      throw new EngineError('INVALID_ARGUMENT', `intermittent series must be magnitudes (≥ 0); y[${i}] = ${y[i]}`);
    }
  }
}

/** Non-zero sizes and the intervals before each (the first from time 0), as R's croston. */
function demandsAndIntervals(y: Series): { sizes: number[]; intervals: number[] } {
  const sizes: number[] = [];
  const intervals: number[] = [];
  let previous = 0;
  for (let t = 0; t < y.length; t++) {
    const v = y[t] as number;
    if (v > 0) {
      sizes.push(v);
      intervals.push(t + 1 - previous);
      previous = t + 1;
    }
  }
  return { sizes, intervals };
}

/**
 * ADI and CV² with the cut-offs ADI = 1.32 and CV² = 0.49 of Syntetos, Boylan and Croston
 * (2005): smooth (both low), erratic (CV² high), intermittent (ADI high), lumpy (both high);
 * 'none' for an all-zero series.
 *
 * @throws EngineError INVALID_ARGUMENT for negative or non-finite values.
 * @example classifyDemand([0, 0, 5, 0, 0, 0, 4, 0, 6]).pattern // 'intermittent'
 */
export function classifyDemand(y: Series): DemandClassification {
  checkMagnitudes(y);
  const { sizes, intervals } = demandsAndIntervals(y);
  if (sizes.length === 0) return { adi: Infinity, cv2: 0, pattern: 'none' };
  const adi = intervals.reduce((a, b) => a + b, 0) / intervals.length;
  const mean = sizes.reduce((a, b) => a + b, 0) / sizes.length;
  let cv2 = 0;
  if (sizes.length > 1) {
    const variance = sizes.reduce((a, b) => a + (b - mean) ** 2, 0) / (sizes.length - 1);
    cv2 = variance / (mean * mean);
  }
  const highAdi = adi > 1.32;
  const highCv = cv2 > 0.49;
  const pattern: DemandPattern = highAdi ? (highCv ? 'lumpy' : 'intermittent') : highCv ? 'erratic' : 'smooth';
  return { adi, cv2, pattern };
}

/**
 * The rule for treating a flow as intermittent: average inter-demand interval above 1.32
 * periods (Syntetos, Boylan and Croston 2005), i.e. the 'intermittent' and 'lumpy' classes,
 * where Croston/SBA outperform exponential smoothing of the raw series. An all-zero series is
 * not intermittent (there is nothing to forecast).
 *
 * @throws EngineError INVALID_ARGUMENT for negative or non-finite values.
 * @example isIntermittent([0, 0, 12, 0, 0, 0, 9, 0, 0, 15]) // true
 */
export function isIntermittent(y: Series): boolean {
  const c = classifyDemand(y);
  return c.pattern === 'intermittent' || c.pattern === 'lumpy';
}

function simpleSmoothing(values: readonly number[], alpha: number): number {
  let level = values[0] as number;
  for (let i = 1; i < values.length; i++) level += alpha * ((values[i] as number) - level);
  return level;
}

/**
 * Fits Croston's method or SBA: simple exponential smoothing (started at the first value)
 * of the non-zero sizes and, separately, of the intervals between them; forecast =
 * ẑ/p̂, times (1 − α/2) for SBA. With a single non-zero value, ẑ and p̂ are that value and
 * its interval (as R's `croston`); with none, everything is zero.
 *
 * Complexity: O(n log n) (sorting the sizes).
 *
 * @throws EngineError INVALID_ARGUMENT for negative or non-finite values or α outside (0, 1];
 *   NOT_ENOUGH_DATA for an empty series.
 * @example fitIntermittent(dailySupplierPayments, { variant: 'sba' }).rate
 */
export function fitIntermittent(y: Series, config: IntermittentConfig = {}): FittedIntermittent {
  checkMagnitudes(y);
  if (y.length === 0) throw new EngineError('NOT_ENOUGH_DATA', 'an intermittent model needs data');
  const alpha = config.alpha ?? 0.1;
  if (!(alpha > 0 && alpha <= 1)) throw new EngineError('INVALID_ARGUMENT', `alpha must be in (0, 1], got ${alpha}`);
  const variant = config.variant ?? 'sba';
  const sizeModel = config.sizeModel ?? 'empirical';
  const { sizes, intervals } = demandsAndIntervals(y);
  const base = { kind: 'intermittent' as const, variant, alpha, sizeModel, n: y.length, nonZero: sizes.length };
  if (sizes.length === 0) {
    return {
      ...base,
      demandLevel: 0,
      intervalLevel: Infinity,
      rate: 0,
      probability: 0,
      sizes: new Float64Array(0),
      logMean: 0,
      logSd: 0,
    };
  }
  const demandLevel = simpleSmoothing(sizes, alpha);
  const intervalLevel = simpleSmoothing(intervals, alpha);
  const correction = variant === 'sba' ? 1 - alpha / 2 : 1;
  const rate = (correction * demandLevel) / intervalLevel;
  const probability = Math.min(1, correction / intervalLevel);
  const meanSize = sizes.reduce((a, b) => a + b, 0) / sizes.length;
  const scale = demandLevel / meanSize;
  const scaled = Float64Array.from(sizes, (s) => s * scale).sort();
  const logs = sizes.map(Math.log);
  const logAverage = logs.reduce((a, b) => a + b, 0) / logs.length;
  const logSd =
    logs.length > 1 ? Math.sqrt(logs.reduce((a, b) => a + (b - logAverage) ** 2, 0) / (logs.length - 1)) : 0;
  return {
    ...base,
    demandLevel,
    intervalLevel,
    rate,
    probability,
    sizes: scaled,
    logMean: Math.log(demandLevel) - (logSd * logSd) / 2,
    logSd,
  };
}

/** Quantile u of the size distribution (type 7 on the empirical sizes). */
function sizeQuantile(f: FittedIntermittent, u: number): number {
  if (f.sizeModel === 'lognormal') {
    if (u <= 0) return 0;
    if (u >= 1) return Infinity;
    return Math.exp(f.logMean + f.logSd * normalQuantile(u));
  }
  const k = f.sizes.length;
  const h = (k - 1) * Math.min(1, Math.max(0, u));
  const lo = Math.floor(h);
  const hi = Math.min(k - 1, lo + 1);
  return (f.sizes[lo] as number) + (h - lo) * ((f.sizes[hi] as number) - (f.sizes[lo] as number));
}

/** Quantile q of one period's flow: 0 with probability 1 − π, else a size. */
function flowQuantile(f: FittedIntermittent, q: number): number {
  if (f.probability === 0 || q <= 1 - f.probability) return 0;
  return sizeQuantile(f, (q - (1 - f.probability)) / f.probability);
}

/**
 * Forecast of an intermittent flow: the point is the rate (Croston/SBA mean per period,
 * flat over the horizon); intervals and the median are quantiles of one period's flow
 * under the simulation model (0 with probability 1 − π, else a size), so the lower bound
 * is usually 0.
 *
 * Complexity: O(horizon · levels).
 *
 * @throws EngineError INVALID_ARGUMENT for a bad horizon or level.
 * @example forecastIntermittent(fitIntermittent(y), 30, { levels: [0.8] }).point[0] // the SBA rate
 */
export function forecastIntermittent(
  fitted: FittedIntermittent,
  horizon: number,
  options: ForecastOptions = {},
): Forecast {
  checkHorizon(horizon);
  const levels = checkLevels(options.levels);
  const point = new Float64Array(horizon).fill(fitted.rate);
  const median = new Float64Array(horizon).fill(flowQuantile(fitted, 0.5));
  const intervals = levels.map((level) => ({
    level,
    lower: new Float64Array(horizon).fill(flowQuantile(fitted, (1 - level) / 2)),
    upper: new Float64Array(horizon).fill(flowQuantile(fitted, (1 + level) / 2)),
  }));
  const name = fitted.variant === 'sba' ? 'SBA' : 'Croston';
  return { point, intervals, median, model: `${name} (α = ${fitted.alpha})` };
}

/**
 * Simulates future periods: a Bernoulli(π) occurrence each period and, when it occurs, a
 * size drawn from the fitted size distribution (see the module comment). Path p, step h is
 * written to out[p·horizon + h].
 *
 * Complexity: O(nPaths · horizon).
 *
 * @param rng the engine's seeded generator (engine/core/random.ts) or anything with
 *   `nextFloat()` uniform in [0, 1) and `normal()`.
 * @throws EngineError INVALID_ARGUMENT for a bad horizon, path count or `out` length.
 * @example simulateIntermittent(fit, 90, 5000, createRng(7), new Float64Array(90 * 5000))
 */
export function simulateIntermittent(
  fitted: FittedIntermittent,
  horizon: number,
  nPaths: number,
  rng: Pick<Rng, 'nextFloat' | 'normal'>,
  out: Float64Array,
): void {
  checkHorizon(horizon);
  if (!Number.isInteger(nPaths) || nPaths < 1) {
    throw new EngineError('INVALID_ARGUMENT', `path count must be a positive integer, got ${nPaths}`);
  }
  if (out.length !== nPaths * horizon) {
    throw new EngineError('INVALID_ARGUMENT', `out needs ${nPaths * horizon} values, got ${out.length}`);
  }
  const pi = fitted.probability;
  const k = fitted.sizes.length;
  for (let i = 0; i < out.length; i++) {
    if (pi === 0 || rng.nextFloat() >= pi) {
      out[i] = 0;
    } else if (fitted.sizeModel === 'lognormal') {
      out[i] = Math.exp(fitted.logMean + fitted.logSd * rng.normal());
    } else {
      out[i] = fitted.sizes[Math.min(k - 1, Math.floor(rng.nextFloat() * k))] as number;
    }
  }
}
