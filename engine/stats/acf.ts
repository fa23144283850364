/**
 * Sample autocorrelation and its significance bands, with R's `acf` definitions.
 */
import { EngineError } from '../core/errors';
import { normalQuantile } from './distributions';
import { requireFiniteSeries, requireInteger, type SeriesInput } from './requireFiniteSeries';

/**
 * Sample autocorrelations r_0..r_maxLag of `y`, as R's `acf(y, lag.max, plot = FALSE)`: the
 * mean is removed and every autocovariance is divided by n (not n − k), so the sequence is
 * positive semi-definite (Box, Jenkins, Reinsel and Ljung, Time Series Analysis, 5th ed.
 * 2015, §2.1.6): r_k = Σ_{t=k}^{n−1} (y_t − ȳ)(y_{t−k} − ȳ) / Σ (y_t − ȳ)².
 *
 * O(n · maxLag).
 *
 * @param y the series (not mutated)
 * @param maxLag the largest lag, 0 ≤ maxLag ≤ n − 1
 * @returns a Float64Array of length maxLag + 1 indexed by lag; element 0 is 1
 * @throws EngineError NOT_ENOUGH_DATA for an empty series, for maxLag ≥ n, and for a
 *   constant series (all values equal: the autocorrelation is 0/0, undefined);
 *   INVALID_ARGUMENT for non-finite values or a maxLag that is not a non-negative integer.
 * @example acf([1, 2, 3, 4, 5], 2) // Float64Array [1, 0.4, -0.1]
 */
export function acf(y: SeriesInput, maxLag: number): Float64Array {
  requireFiniteSeries(y, 1, 'acf');
  const n = y.length;
  requireInteger(maxLag, 0, Number.MAX_SAFE_INTEGER, 'acf: maxLag');
  if (maxLag >= n) {
    throw new EngineError('NOT_ENOUGH_DATA', `acf: lag ${maxLag} needs at least ${maxLag + 1} observations, got ${n}`);
  }
  const first = y[0] as number;
  let constant = true;
  for (let i = 1; i < n && constant; i++) constant = y[i] === first;
  if (constant) {
    throw new EngineError('NOT_ENOUGH_DATA', 'acf: the series is constant, so its autocorrelation is undefined');
  }
  const centred = centre(y);
  const out = new Float64Array(maxLag + 1);
  let c0 = 0;
  for (let t = 0; t < n; t++) c0 += (centred[t] as number) * (centred[t] as number);
  out[0] = 1;
  for (let k = 1; k <= maxLag; k++) {
    let ck = 0;
    for (let t = k; t < n; t++) ck += (centred[t] as number) * (centred[t - k] as number);
    out[k] = ck / c0;
  }
  return out;
}

/** y − ȳ with the mean summed by Neumaier's compensated summation. */
function centre(y: SeriesInput): Float64Array {
  const n = y.length;
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < n; i++) {
    const v = y[i] as number;
    const t = sum + v;
    compensation += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
  }
  const mean = (sum + compensation) / n;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = (y[i] as number) - mean;
  return out;
}

function checkLevel(level: number, what: string): void {
  if (!(level > 0 && level < 1)) {
    throw new EngineError('INVALID_ARGUMENT', `${what}: level must be in (0, 1), got ${level}`);
  }
}

/**
 * Half-width of the band inside which a white-noise series' autocorrelations fall with
 * probability `level` at each lag: Φ⁻¹((1 + level)/2)/√n, the dashed lines of R's
 * `plot(acf(y))` (ci.type = "white"). Valid for the ACF and the PACF alike (Quenouille 1949).
 *
 * @param n the number of observations the correlations were computed from
 * @param level coverage, default 0.95
 * @throws EngineError INVALID_ARGUMENT unless n is a positive integer and 0 < level < 1.
 * @example whiteNoiseBand(144) // 0.1633303 (AirPassengers)
 */
export function whiteNoiseBand(n: number, level = 0.95): number {
  requireInteger(n, 1, Number.MAX_SAFE_INTEGER, 'whiteNoiseBand: n');
  checkLevel(level, 'whiteNoiseBand');
  return normalQuantile((1 + level) / 2) / Math.sqrt(n);
}

/**
 * Bartlett's (1946) band for the autocorrelation at lag k under the hypothesis that the
 * series is a moving average of order k − 1: Φ⁻¹((1 + level)/2) · √((1 + 2 Σ_{j<k} r_j²)/n),
 * what R draws with `plot(acf(y), ci.type = "ma")` (Bartlett 1946, J. Royal Statistical
 * Society Supplement 8(1), 27–41). The band widens with the lag and is the right yardstick
 * for deciding how far a correlation structure reaches.
 *
 * @param r autocorrelations indexed by lag, r[0] = 1, as returned by {@link acf}
 * @param n the number of observations behind `r`
 * @param level coverage, default 0.95
 * @returns a Float64Array of length r.length − 1; element k − 1 is the band at lag k
 * @throws EngineError INVALID_ARGUMENT when r has no lag beyond 0, r[0] is not 1, or n or
 *   level are out of range.
 * @example bartlettBands(acf(y, 20), y.length) // bands for lags 1..20
 */
export function bartlettBands(r: SeriesInput, n: number, level = 0.95): Float64Array {
  if (r.length < 2 || r[0] !== 1) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      'bartlettBands: expected autocorrelations from lag 0 (r[0] = 1) to at least lag 1',
    );
  }
  requireFiniteSeries(r, 2, 'bartlettBands');
  const z = whiteNoiseBand(n, level);
  const out = new Float64Array(r.length - 1);
  let sum = 1;
  for (let k = 1; k < r.length; k++) {
    out[k - 1] = z * Math.sqrt(sum);
    const rk = r[k] as number;
    sum += 2 * rk * rk;
  }
  return out;
}
