/**
 * Classical additive decomposition by moving averages, as R's `stats::decompose`: the
 * starting point forecast::ets uses for the initial seasonal states. (Ebbline's own
 * decomposition for forecasting is STL/MSTL in engine/decompose; this one exists so the
 * ETS initial states match forecast's.)
 */
import { EngineError } from '../core/errors';
import type { Series } from './forecastTypes';

/** Result of {@link classicalDecomposition}. */
export interface ClassicalDecomposition {
  /** Centred moving average; NaN where the window does not fit (the first and last ⌊m/2⌋ values). */
  readonly trend: Float64Array;
  /** Seasonal figure by position in the series: figure[k] is the effect at t ≡ k (mod m), summing to 0. */
  readonly figure: Float64Array;
  /** figure repeated over the series. */
  readonly seasonal: Float64Array;
}

/**
 * Mean of values[from..to) as R's `mean()` computes it: the plain mean corrected by the
 * mean of the deviations (a second pass that removes most rounding error).
 *
 * @throws EngineError INVALID_ARGUMENT for an empty range.
 * @example accurateMean([1, 2, 3, 4], 1, 3) // 2.5
 */
export function accurateMean(values: ArrayLike<number>, from = 0, to = values.length): number {
  const count = to - from;
  if (count <= 0) throw new EngineError('INVALID_ARGUMENT', 'mean of no values');
  let sum = 0;
  for (let i = from; i < to; i++) sum += values[i] as number;
  const first = sum / count;
  let correction = 0;
  for (let i = from; i < to; i++) correction += (values[i] as number) - first;
  return first + correction / count;
}

/**
 * Classical additive decomposition (Kendall and Stuart; R's `decompose(x, "additive")`):
 * trend = centred moving average of order m (weights ½,1,…,1,½ over m+1 points when m is
 * even), detrended = y − trend, figure[k] = mean of the detrended values at positions
 * ≡ k (mod m) counted from the start of the series, centred to sum to zero.
 *
 * Complexity: O(n·m).
 *
 * @param y the series (at least two full periods).
 * @param period the seasonal period m ≥ 2.
 * @throws EngineError INVALID_ARGUMENT for a period below 2; NOT_ENOUGH_DATA for fewer than 2·m values.
 * @example classicalDecomposition([1, 3, 1, 3, 1, 3], 2).figure // [-1, 1]
 */
export function classicalDecomposition(y: Series, period: number): ClassicalDecomposition {
  const n = y.length;
  const m = period;
  if (!Number.isInteger(m) || m < 2) {
    throw new EngineError('INVALID_ARGUMENT', `decomposition needs an integer period ≥ 2, got ${period}`);
  }
  if (n < 2 * m) {
    throw new EngineError('NOT_ENOUGH_DATA', `decomposition needs at least two periods (${2 * m} values), got ${n}`);
  }
  const weights: number[] =
    m % 2 === 0 ? [0.5 / m, ...new Array<number>(m - 1).fill(1 / m), 0.5 / m] : new Array<number>(m).fill(1 / m);
  const width = weights.length;
  const offset = Math.floor(width / 2);
  const trend = new Float64Array(n).fill(NaN);
  for (let i = offset; i + width - offset - 1 < n; i++) {
    let z = 0;
    // Same order of summation as R's convolution filter: x[i + o], x[i + o − 1], …
    for (let j = 0; j < width; j++) z += (weights[j] as number) * (y[i + offset - j] as number);
    trend[i] = z;
  }
  const figure = new Float64Array(m);
  const bucket: number[] = [];
  for (let k = 0; k < m; k++) {
    bucket.length = 0;
    for (let t = k; t < n; t += m) {
      const tr = trend[t] as number;
      if (!Number.isNaN(tr)) bucket.push((y[t] as number) - tr);
    }
    figure[k] = accurateMean(bucket);
  }
  const centre = accurateMean(figure);
  for (let k = 0; k < m; k++) figure[k] = (figure[k] as number) - centre;
  const seasonal = new Float64Array(n);
  for (let t = 0; t < n; t++) seasonal[t] = figure[t % m] as number;
  return { trend, figure, seasonal };
}
