/**
 * Sample partial autocorrelation by the Durbin–Levinson recursion, as R's `pacf`.
 */
import { EngineError } from '../core/errors';
import { acf } from './acf';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/**
 * Partial autocorrelations φ_11..φ_mm of `y` for lags 1..maxLag: the sample autocorrelations
 * of {@link acf} (mean removed, denominator n) run through the Durbin–Levinson recursion
 * (Durbin 1960, Revue de l'Institut International de Statistique 28(3), 233–244):
 * φ_kk = (r_k − Σ_{j<k} φ_{k−1,j} r_{k−j}) / (1 − Σ_{j<k} φ_{k−1,j} r_j),
 * φ_kj = φ_{k−1,j} − φ_kk φ_{k−1,k−j}. Same definition as R's `pacf(y, lag.max)`.
 *
 * O(n · maxLag + maxLag²).
 *
 * @param y the series (not mutated)
 * @param maxLag the largest lag, 1 ≤ maxLag ≤ n − 1
 * @returns a Float64Array of length maxLag; element k − 1 is the partial autocorrelation
 *   at lag k (there is none at lag 0, as in R)
 * @throws EngineError NOT_ENOUGH_DATA for maxLag ≥ n or a constant series;
 *   INVALID_ARGUMENT for non-finite values, maxLag < 1, or when the recursion meets an
 *   exactly singular autocorrelation matrix (|φ_kk| = 1 before the last lag, e.g. a perfect
 *   alternating series).
 * @example pacf([1, 2, 3, 4, 5], 2) // Float64Array [0.4, -0.3095238]
 */
export function pacf(y: SeriesInput, maxLag: number): Float64Array {
  requireFiniteSeries(y, 1, 'pacf');
  if (!Number.isInteger(maxLag) || maxLag < 1) {
    throw new EngineError('INVALID_ARGUMENT', `pacf: maxLag must be an integer ≥ 1, got ${maxLag}`);
  }
  return durbinLevinson(acf(y, maxLag));
}

/**
 * Partial autocorrelations from autocorrelations r[0..m] (r[0] = 1) by Durbin–Levinson.
 * O(m²).
 */
function durbinLevinson(r: Float64Array): Float64Array {
  const m = r.length - 1;
  const out = new Float64Array(m);
  let phi = new Float64Array(m);
  let next = new Float64Array(m);
  let variance = 1; // prediction-error variance relative to r_0
  for (let k = 1; k <= m; k++) {
    let numerator = r[k] as number;
    for (let j = 1; j < k; j++) numerator -= (phi[j - 1] as number) * (r[k - j] as number);
    if (!(variance > 0)) {
      throw new EngineError('INVALID_ARGUMENT', `pacf: the autocorrelations are singular at lag ${k}`);
    }
    const phiKK = numerator / variance;
    next[k - 1] = phiKK;
    for (let j = 1; j < k; j++) next[j - 1] = (phi[j - 1] as number) - phiKK * (phi[k - j - 1] as number);
    variance *= 1 - phiKK * phiKK;
    out[k - 1] = phiKK;
    const swap = phi;
    phi = next;
    next = swap;
  }
  return out;
}
