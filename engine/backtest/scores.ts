/**
 * Accuracy scores for point, quantile, interval and distribution forecasts, as used by the
 * rolling-origin backtest. Every function reads its inputs without changing them.
 */
import { EngineError } from '../core/errors';
import { normalCdf } from '../stats/distributions';

/** Standard normal density φ(z). */
function normalDensity(z: number): number {
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
}

type Values = ArrayLike<number>;

function checkPair(actual: Values, other: Values, name: string): void {
  if (actual.length === 0) throw new EngineError('INVALID_ARGUMENT', 'a score needs at least one actual value');
  if (other.length !== actual.length) {
    throw new EngineError('INVALID_ARGUMENT', `${name} has ${other.length} values for ${actual.length} actual values`);
  }
  for (let i = 0; i < actual.length; i++) {
    if (!Number.isFinite(actual[i]) || !Number.isFinite(other[i])) {
      throw new EngineError('INVALID_ARGUMENT', `value ${i} of the actual values or ${name} is not finite`);
    }
  }
}

/**
 * In-sample mean absolute error of the seasonal naive method, mean |y_t − y_{t−m}|: the
 * scale of MASE (Hyndman and Koehler 2006, section 3.4; m = 1 gives the naive method).
 *
 * @throws EngineError NOT_ENOUGH_DATA with n ≤ m; INVALID_ARGUMENT for a bad period.
 * @example seasonalNaiveScale([1, 2, 4, 7], 1) // (1 + 2 + 3)/3 = 2
 */
export function seasonalNaiveScale(train: Values, period: number): number {
  if (!Number.isInteger(period) || period < 1) {
    throw new EngineError('INVALID_ARGUMENT', `period must be a positive integer, got ${period}`);
  }
  if (train.length <= period) {
    throw new EngineError('NOT_ENOUGH_DATA', `the MASE scale needs more than ${period} training values`);
  }
  let sum = 0;
  for (let t = period; t < train.length; t++) sum += Math.abs((train[t] as number) - (train[t - period] as number));
  return sum / (train.length - period);
}

/**
 * Mean absolute scaled error (Hyndman and Koehler 2006, "Another look at measures of
 * forecast accuracy", IJF 22(4), 679–688): mean |y − ŷ| over the test values divided by the
 * in-sample seasonal naive MAE of the training data with period m. Below 1 means better
 * than the one-step seasonal naive forecast in sample. Same as R forecast's `accuracy()`
 * MASE for a seasonal series (m = frequency) or a non-seasonal one (m = 1).
 *
 * @throws EngineError INVALID_ARGUMENT for mismatched or non-finite inputs, or when the scale
 *   is 0 (a training series that repeats exactly: MASE is undefined); NOT_ENOUGH_DATA with
 *   n ≤ m training values.
 * @example mase([3, 5], [4, 4], [1, 2, 4, 7], 1) // 1/2 = 0.5
 */
export function mase(actual: Values, forecast: Values, train: Values, period: number): number {
  checkPair(actual, forecast, 'forecast');
  const scale = seasonalNaiveScale(train, period);
  if (!(scale > 0)) {
    throw new EngineError('INVALID_ARGUMENT', 'MASE is undefined: the training series has no seasonal naive error');
  }
  let sum = 0;
  for (let i = 0; i < actual.length; i++) sum += Math.abs((actual[i] as number) - (forecast[i] as number));
  return sum / actual.length / scale;
}

/**
 * Mean pinball (quantile) score of forecasts of the p-quantile, in the scaling of
 * Hyndman and Athanasopoulos, FPP3 section 5.9: 2(1 − p)(f − y) when y < f, 2p(y − f)
 * otherwise — twice the usual pinball loss, so that p = 0.5 gives the absolute error.
 *
 * @throws EngineError INVALID_ARGUMENT for mismatched or non-finite inputs or p outside (0, 1).
 * @example pinballLoss([10], [8], 0.9) // 2·0.9·2 = 3.6
 */
export function pinballLoss(actual: Values, quantile: Values, p: number): number {
  if (!(p > 0 && p < 1)) throw new EngineError('INVALID_ARGUMENT', `quantile level must be in (0, 1), got ${p}`);
  checkPair(actual, quantile, 'quantile forecast');
  let sum = 0;
  for (let i = 0; i < actual.length; i++) {
    const y = actual[i] as number;
    const f = quantile[i] as number;
    sum += y < f ? 2 * (1 - p) * (f - y) : 2 * p * (y - f);
  }
  return sum / actual.length;
}

/**
 * Share of actual values inside [lower, upper] (bounds included).
 *
 * @throws EngineError INVALID_ARGUMENT for mismatched or non-finite inputs.
 * @example intervalCoverage([1, 5, 9], [0, 0, 0], [4, 6, 8]) // 2/3
 */
export function intervalCoverage(actual: Values, lower: Values, upper: Values): number {
  checkPair(actual, lower, 'lower');
  checkPair(actual, upper, 'upper');
  let inside = 0;
  for (let i = 0; i < actual.length; i++) {
    const y = actual[i] as number;
    if (y >= (lower[i] as number) && y <= (upper[i] as number)) inside++;
  }
  return inside / actual.length;
}

/**
 * Mean Winkler interval score (Winkler 1972, "A decision-theoretic approach to interval
 * estimation", JASA 67(337), 187–191; FPP3 section 5.9) of central (level) intervals:
 * (u − l) + (2/α)(l − y) if y < l, (u − l) + (2/α)(y − u) if y > u, u − l otherwise,
 * α = 1 − level. Lower is better; it rewards narrow intervals and penalises misses.
 *
 * @throws EngineError INVALID_ARGUMENT for mismatched or non-finite inputs or a level outside (0, 1).
 * @example winklerScore([12], [0], [10], 0.8) // 10 + (2/0.2)·2 = 30
 */
export function winklerScore(actual: Values, lower: Values, upper: Values, level: number): number {
  if (!(level > 0 && level < 1)) throw new EngineError('INVALID_ARGUMENT', `level must be in (0, 1), got ${level}`);
  checkPair(actual, lower, 'lower');
  checkPair(actual, upper, 'upper');
  const alpha = 1 - level;
  let sum = 0;
  for (let i = 0; i < actual.length; i++) {
    const y = actual[i] as number;
    const l = lower[i] as number;
    const u = upper[i] as number;
    let score = u - l;
    if (y < l) score += (2 / alpha) * (l - y);
    else if (y > u) score += (2 / alpha) * (y - u);
    sum += score;
  }
  return sum / actual.length;
}

/**
 * Continuous ranked probability score of a N(μ, σ²) forecast at y (Gneiting and Raftery
 * 2007, "Strictly proper scoring rules, prediction, and estimation", JASA 102(477),
 * 359–378, equation 21): σ[z(2Φ(z) − 1) + 2φ(z) − 1/√π], z = (y − μ)/σ. With σ = 0 it is
 * |y − μ|.
 *
 * @throws EngineError INVALID_ARGUMENT for non-finite inputs or σ < 0.
 * @example crpsGaussian(0, 0, 1) // 0.2336949772…
 */
export function crpsGaussian(y: number, mean: number, sd: number): number {
  if (!Number.isFinite(y) || !Number.isFinite(mean) || !Number.isFinite(sd) || sd < 0) {
    throw new EngineError('INVALID_ARGUMENT', 'crpsGaussian needs finite y and mean and a standard deviation ≥ 0');
  }
  if (sd === 0) return Math.abs(y - mean);
  const z = (y - mean) / sd;
  return sd * (z * (2 * normalCdf(z) - 1) + 2 * normalDensity(z) - 1 / Math.sqrt(Math.PI));
}

/**
 * CRPS of the empirical distribution of `samples` at y (Gneiting and Raftery 2007,
 * equation 20 with the sample distribution): mean |X − y| − ½·mean |X − X'| over all pairs,
 * computed from the sorted sample as (1/k)Σ|x_i − y| − (1/k²)Σ(2i − k − 1)x_(i).
 *
 * Complexity: O(k log k) (a sorted copy; `samples` is not changed).
 *
 * @throws EngineError INVALID_ARGUMENT for an empty sample or non-finite values.
 * @example crpsSample(2, [1, 2, 3]) // 2/3 − 4/9 = 2/9
 */
export function crpsSample(y: number, samples: Values): number {
  const k = samples.length;
  if (k === 0) throw new EngineError('INVALID_ARGUMENT', 'crpsSample needs at least one sample');
  if (!Number.isFinite(y)) throw new EngineError('INVALID_ARGUMENT', 'crpsSample needs a finite y');
  const sorted = Float64Array.from(samples as ArrayLike<number>);
  for (const v of sorted) if (!Number.isFinite(v)) throw new EngineError('INVALID_ARGUMENT', 'samples must be finite');
  sorted.sort();
  let absolute = 0;
  let spread = 0;
  for (let i = 0; i < k; i++) {
    const x = sorted[i] as number;
    absolute += Math.abs(x - y);
    spread += (2 * (i + 1) - k - 1) * x;
  }
  return absolute / k - spread / (k * k);
}
