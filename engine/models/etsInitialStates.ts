/**
 * Starting values for the ETS initial state, by the heuristic of Hyndman, Koehler, Snyder
 * and Grose (2002), "A state space framework for automatic forecasting using exponential
 * smoothing methods", IJF 18(3), section 2.6 — in the form R forecast 8.20's `initstate`
 * implements it. These values only start the optimiser: forecast::ets (and Ebbline)
 * then estimate the initial state jointly with the smoothing parameters.
 */
import { EngineError } from '../core/errors';
import type { Series } from './forecastTypes';
import { accurateMean, classicalDecomposition } from './classicalDecomposition';
import { leastSquares } from '../stats/leastSquares';
import type { EtsSeason, EtsTrend } from './etsModel';

/** Intercept and slope of y[0..count) on 1..count. */
function lineFit(y: ArrayLike<number>, count: number): [number, number] {
  const t = new Float64Array(count);
  const one = new Float64Array(count).fill(1);
  for (let i = 0; i < count; i++) t[i] = i + 1;
  const coef = leastSquares([one, t], Array.prototype.slice.call(y, 0, count) as number[]).coefficients;
  return [coef[0] as number, coef[1] as number];
}

/**
 * forecast's starting state for the optimiser: [ℓ0, b0 (trend), s_0 … s_{m−2} (season)].
 * The last seasonal state is not returned: it is implied by the seasonal states summing to
 * zero.
 *
 * Season: with n ≥ 3m, the classical decomposition's seasonal figure; with fewer values,
 * y − (a + b·t) from a regression on t and one Fourier pair. The seasonal starting states
 * are the seasonal component at t = m, m−1, …, 2 (most recent first). Level and trend: from
 * the first max(10, 2m) seasonally adjusted values, their mean (no trend) or the intercept
 * and slope of a straight line (additive trend).
 *
 * Complexity: O(n·m).
 *
 * @throws EngineError NOT_ENOUGH_DATA for a seasonal model with fewer than 4 values (or a
 *   singular regression), or a trend with fewer than 3.
 * @example etsInitialStates([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], 'A', 'N', 1) // [0, 1] (up to rounding)
 */
export function etsInitialStates(y: Series, trend: EtsTrend, season: EtsSeason, period: number): Float64Array {
  const n = y.length;
  let adjusted: ArrayLike<number> = y;
  let seasonStates: number[] = [];
  const m = season === 'A' ? period : 1;
  if (season === 'A') {
    if (n < 4) throw new EngineError('NOT_ENOUGH_DATA', `a seasonal ETS model needs at least 4 values, got ${n}`);
    let seasonal: Float64Array;
    if (n < 3 * m) {
      const one = new Float64Array(n).fill(1);
      const t = new Float64Array(n);
      const cos = new Float64Array(n);
      const sin = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        t[i] = i + 1;
        sin[i] = Math.sin((2 * Math.PI * (i + 1)) / m);
        cos[i] = Math.cos((2 * Math.PI * (i + 1)) / m);
      }
      // With m = 2 the sine column vanishes (forecast's `fourier` drops it).
      const columns = m === 2 ? [one, t, cos] : [one, t, sin, cos];
      const coef = leastSquares(columns, y).coefficients;
      seasonal = new Float64Array(n);
      for (let i = 0; i < n; i++) seasonal[i] = (y[i] as number) - (coef[0] as number) - (coef[1] as number) * (i + 1);
    } else {
      seasonal = classicalDecomposition(y, m).seasonal;
    }
    for (let k = m - 1; k >= 1; k--) seasonStates.push(seasonal[k] as number);
    const sa = new Float64Array(n);
    for (let i = 0; i < n; i++) sa[i] = (y[i] as number) - (seasonal[i] as number);
    adjusted = sa;
  } else {
    seasonStates = [];
  }
  const maxn = Math.min(Math.max(10, 2 * m), n);
  const out: number[] = [];
  if (trend === 'N') {
    if (maxn < 1) throw new EngineError('NOT_ENOUGH_DATA', 'no values to start the level');
    out.push(accurateMean(adjusted, 0, maxn));
  } else {
    if (maxn < 3) throw new EngineError('NOT_ENOUGH_DATA', 'a trend needs at least three values');
    let [l0, b0] = lineFit(adjusted, maxn);
    if (Math.abs(l0 + b0) < 1e-8) {
      l0 *= 1 + 0.001;
      b0 *= 1 - 0.001;
    }
    out.push(l0, b0);
  }
  out.push(...seasonStates);
  return Float64Array.from(out);
}
