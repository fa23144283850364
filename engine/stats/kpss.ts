/**
 * KPSS test of level or trend stationarity.
 */
import { EngineError } from '../core/errors';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** What the null hypothesis keeps fixed: a stable level, or a stable linear trend. */
export type KpssNull = 'level' | 'trend';

/**
 * Truncation lag ℓ of the Newey–West (Bartlett kernel) long-run variance:
 * - `'short'`: trunc(4 (n/100)^(1/4)), R's `tseries::kpss.test` default (lshort = TRUE);
 * - `'long'`: trunc(12 (n/100)^(1/4)), tseries with lshort = FALSE;
 * - `'auto'`: the data-dependent bandwidth of Hobijn, Franses and Ooms (1998), as statsmodels
 *   `kpss(nlags='auto')`;
 * - a number: that lag, 0 ≤ ℓ < n.
 */
export type KpssLags = 'short' | 'long' | 'auto' | number;

/** Options of {@link kpssTest}. */
export interface KpssOptions {
  /** Default `'level'`. */
  readonly null?: KpssNull;
  /** Default `'short'`. */
  readonly lags?: KpssLags;
}

/** KPSS (1992) Table 1 critical values (upper tail; reject stationarity above them). */
export interface KpssCriticalValues {
  readonly p10: number;
  readonly p05: number;
  readonly p025: number;
  readonly p01: number;
}

/** Result of {@link kpssTest}. */
export interface KpssResult {
  /** η = Σ S_t² / (n² s²(ℓ)), S_t the partial sums of the residuals. Large values reject stationarity. */
  readonly statistic: number;
  /** Truncation lag ℓ used. */
  readonly lag: number;
  readonly null: KpssNull;
  /**
   * p-value interpolated linearly in KPSS Table 1 and clipped to [0.01, 0.10], as tseries
   * and statsmodels report it; see `pValueBound` for the clipped cases.
   */
  readonly pValue: number;
  /**
   * `'atMost'` when the statistic is beyond the 1% point (the true p-value is smaller than
   * the 0.01 shown), `'atLeast'` when it is below the 10% point (the true p-value is larger
   * than 0.10), null inside the table.
   */
  readonly pValueBound: 'atMost' | 'atLeast' | null;
  readonly criticalValues: KpssCriticalValues;
}

// Kwiatkowski, Phillips, Schmidt and Shin (1992), Table 1, at 10%, 5%, 2.5%, 1%.
const CRITICAL: Record<KpssNull, readonly number[]> = {
  level: [0.347, 0.463, 0.574, 0.739],
  trend: [0.119, 0.146, 0.176, 0.216],
};
const TABLE_P = [0.1, 0.05, 0.025, 0.01];

/** Residuals of y on a constant (level) or on a constant and t = 1..n (trend, closed-form OLS with centred t). */
function kpssResiduals(y: SeriesInput, nullHypothesis: KpssNull): Float64Array {
  const n = y.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i] as number;
  mean /= n;
  const e = new Float64Array(n);
  if (nullHypothesis === 'level') {
    for (let i = 0; i < n; i++) e[i] = (y[i] as number) - mean;
    return e;
  }
  const tMean = (n + 1) / 2;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    const dt = i + 1 - tMean;
    sxy += dt * ((y[i] as number) - mean);
    sxx += dt * dt;
  }
  const slope = sxy / sxx;
  for (let i = 0; i < n; i++) e[i] = (y[i] as number) - mean - slope * (i + 1 - tMean);
  return e;
}

function lagProduct(e: Float64Array, k: number): number {
  let s = 0;
  for (let t = k; t < e.length; t++) s += (e[t] as number) * (e[t - k] as number);
  return s;
}

/** Hobijn, Franses and Ooms (1998) automatic bandwidth for the Bartlett kernel, as statsmodels `_kpss_autolag`. */
function hobijnBandwidth(e: Float64Array): number {
  const n = e.length;
  const covlags = Math.trunc(Math.pow(n, 2 / 9));
  let s0 = lagProduct(e, 0) / n;
  let s1 = 0;
  for (let i = 1; i <= covlags; i++) {
    const product = lagProduct(e, i) / (n / 2);
    s0 += product;
    s1 += i * product;
  }
  const ratio = s1 / s0;
  const gamma = 1.1447 * Math.pow(ratio * ratio, 1 / 3);
  const lag = Math.trunc(gamma * Math.pow(n, 1 / 3));
  return Math.min(Number.isFinite(lag) ? Math.max(lag, 0) : 0, n - 1);
}

function interpolatePValue(statistic: number, table: readonly number[]): number {
  const first = table[0] as number;
  const last = table[table.length - 1] as number;
  if (statistic <= first) return TABLE_P[0] as number;
  if (statistic >= last) return TABLE_P[TABLE_P.length - 1] as number;
  let i = 1;
  while (statistic > (table[i] as number)) i++;
  const x0 = table[i - 1] as number;
  const x1 = table[i] as number;
  const p0 = TABLE_P[i - 1] as number;
  const p1 = TABLE_P[i] as number;
  return p0 + ((statistic - x0) / (x1 - x0)) * (p1 - p0);
}

/**
 * KPSS test of the null hypothesis that `y` is stationary around a level or a linear trend
 * (Kwiatkowski, Phillips, Schmidt and Shin 1992, J. Econometrics 54, 159–178), the
 * complement of the Dickey–Fuller test. With e_t the residuals of y on a constant (level)
 * or a constant and t (trend) and S_t their partial sums,
 *   η = n⁻² Σ S_t² / s²(ℓ),  s²(ℓ) = n⁻¹ Σ e_t² + 2n⁻¹ Σ_{k=1}^{ℓ} (1 − k/(ℓ + 1)) Σ_t e_t e_{t−k},
 * the Newey and West (1987) long-run variance with Bartlett weights. Same statistic as R's
 * `tseries::kpss.test(y, null, lshort)` and `urca::ur.kpss(y, type, use.lag)`, and as
 * statsmodels `kpss(y, regression, nlags)`; the p-value is interpolated in KPSS Table 1 and
 * clipped to [0.01, 0.10] like theirs.
 *
 * O(n ℓ).
 *
 * @throws EngineError NOT_ENOUGH_DATA for fewer than 3 observations or when the residuals
 *   are zero to rounding (|e| below about 1e-14 of max |y|: a constant series, or an exact
 *   line under the trend null);
 *   INVALID_ARGUMENT for non-finite values or a fixed lag outside [0, n).
 * @example kpssTest(nile) // η = 0.96543, lag 4, p = 0.01 (tseries::kpss.test(Nile))
 */
export function kpssTest(y: SeriesInput, options: KpssOptions = {}): KpssResult {
  const nullHypothesis = options.null ?? 'level';
  const lags = options.lags ?? 'short';
  requireFiniteSeries(y, 3, 'kpssTest');
  const n = y.length;
  const e = kpssResiduals(y, nullHypothesis);
  // Residuals at rounding level (a constant series whose mean is inexact, or an exact line
  // under the trend null) would give a meaningless ratio of two rounding errors.
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(y[i] as number));
  if (lagProduct(e, 0) <= n * (1e-14 * scale) ** 2) {
    throw new EngineError('NOT_ENOUGH_DATA', `kpssTest: the series has no variation around its ${nullHypothesis}`);
  }
  let lag: number;
  if (lags === 'short') lag = Math.trunc(4 * Math.pow(n / 100, 0.25));
  else if (lags === 'long') lag = Math.trunc(12 * Math.pow(n / 100, 0.25));
  else if (lags === 'auto') lag = hobijnBandwidth(e);
  else {
    if (!Number.isInteger(lags) || lags < 0 || lags >= n) {
      throw new EngineError('INVALID_ARGUMENT', `kpssTest: lags must be an integer in [0, ${n}), got ${lags}`);
    }
    lag = lags;
  }
  lag = Math.min(lag, n - 1);

  let partial = 0;
  let eta = 0;
  for (let t = 0; t < n; t++) {
    partial += e[t] as number;
    eta += partial * partial;
  }
  eta /= n * n;
  let longRun = lagProduct(e, 0);
  for (let k = 1; k <= lag; k++) longRun += 2 * (1 - k / (lag + 1)) * lagProduct(e, k);
  longRun /= n;
  if (!(longRun > 0)) {
    throw new EngineError('NOT_ENOUGH_DATA', `kpssTest: the series has no variation around its ${nullHypothesis}`);
  }
  const statistic = eta / longRun;
  const table = CRITICAL[nullHypothesis];
  const pValueBound =
    statistic >= (table[table.length - 1] as number) ? 'atMost' : statistic <= (table[0] as number) ? 'atLeast' : null;
  return {
    statistic,
    lag,
    null: nullHypothesis,
    pValue: interpolatePValue(statistic, table),
    pValueBound,
    criticalValues: {
      p10: table[0] as number,
      p05: table[1] as number,
      p025: table[2] as number,
      p01: table[3] as number,
    },
  };
}
