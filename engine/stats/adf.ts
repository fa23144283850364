/**
 * Augmented Dickey–Fuller unit-root test.
 */
import { EngineError } from '../core/errors';
import { leastSquares, type LeastSquaresFit } from './leastSquares';
import {
  mackinnonCriticalValues,
  mackinnonPValue,
  type DickeyFullerCriticalValues,
  type DickeyFullerDeterministic,
} from './mackinnon';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/**
 * How the number of lagged differences is chosen:
 * - a number: that many, fixed;
 * - `'cubeRoot'`: trunc((n − 1)^(1/3)), the default of R's `tseries::adf.test` (computed with
 *   floating-point pow as R does, so n − 1 = 64 gives 3);
 * - `'aic'`: the lag in a range that minimises Akaike's information criterion, all candidates
 *   fitted on the same observations (see {@link AdfOptions.aicConvention}).
 */
export type AdfLags = number | 'cubeRoot' | 'aic';

/** Options of {@link adfTest}. */
export interface AdfOptions {
  /** Deterministic terms in the test regression. Default `'constant'`. */
  readonly deterministic?: DickeyFullerDeterministic;
  /** Lagged differences; default `'aic'`. */
  readonly lags?: AdfLags;
  /**
   * Largest lag the AIC search considers. Default: statsmodels' ceil(12 (n/100)^(1/4)),
   * capped at ⌊n/2⌋ − k − 1 with k = 1 deterministic term for `'constant'`, 2 for `'constantTrend'`.
   */
  readonly maxLag?: number;
  /**
   * Which reference the AIC search follows (both fit every candidate on the observations
   * left after maxLag lags):
   * - `'statsmodels'` (default): candidates 0..maxLag; the winner is refitted on all the
   *   observations its own lag leaves, as `statsmodels.tsa.stattools.adfuller(autolag='AIC')`;
   * - `'urca'`: candidates 1..maxLag (lag 0 is never chosen); the winner keeps the common
   *   sample, as R's `urca::ur.df(selectlags = "AIC")`.
   */
  readonly aicConvention?: 'statsmodels' | 'urca';
}

/** Result of {@link adfTest}. */
export interface AdfResult {
  /** τ = γ̂/se(γ̂), the t-ratio of the lagged level; strongly negative values reject a unit root. */
  readonly statistic: number;
  /** Lagged differences in the final regression. */
  readonly lag: number;
  /** Observations in the final regression. */
  readonly nobs: number;
  readonly deterministic: DickeyFullerDeterministic;
  /** How `lag` was found, and the search bound when by AIC. */
  readonly lagSelection: { readonly method: 'fixed' } | { readonly method: 'aic'; readonly maxLag: number };
  /**
   * MacKinnon (1994, 1996) approximate p-value for the null of a unit root (the series
   * drifts); small values mean the series returns to a stable level (or trend).
   */
  readonly pValue: number;
  /** MacKinnon (2010) critical values for `nobs` observations. */
  readonly criticalValues: DickeyFullerCriticalValues;
}

/** Δy_t regressed on y_{t−1}, the deterministic terms and Δy_{t−1..t−lag}, for t from `start` (index into Δy). */
function dickeyFullerRegression(
  y: SeriesInput,
  dy: Float64Array,
  lag: number,
  start: number,
  deterministic: DickeyFullerDeterministic,
): LeastSquaresFit {
  const m = dy.length - start;
  const columns: Float64Array[] = [];
  const level = new Float64Array(m);
  const response = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    level[i] = y[start + i] as number; // the level before the change Δy[start + i] = y[start + i + 1] − y[start + i]
    response[i] = dy[start + i] as number;
  }
  columns.push(level, new Float64Array(m).fill(1));
  if (deterministic === 'constantTrend') {
    // t counted from 1 at Δy's first element, as tseries and urca do (the origin only moves the intercept).
    columns.push(Float64Array.from({ length: m }, (_, i) => start + i + 1));
  }
  for (let j = 1; j <= lag; j++) {
    columns.push(Float64Array.from({ length: m }, (_, i) => dy[start + i - j] as number));
  }
  return leastSquares(columns, response);
}

function informationCriterion(fit: LeastSquaresFit): number {
  // Akaike (1974): n ln(RSS/n) + 2p; the constants common to all candidates are dropped.
  return fit.n * Math.log(fit.rss / fit.n) + 2 * fit.p;
}

/** τ of the fit; `scale` is max |Δy|, below whose rounding level residuals count as an exact fit. */
function tau(fit: LeastSquaresFit, scale: number): number {
  const se = fit.standardErrors[0] as number;
  const t = (fit.coefficients[0] as number) / se;
  if (!(se > 0) || !Number.isFinite(t) || fit.rss <= fit.n * (1e-14 * scale) ** 2) {
    throw new EngineError('NOT_ENOUGH_DATA', 'adfTest: the test regression fits the series exactly, so τ is undefined');
  }
  return t;
}

/**
 * Augmented Dickey–Fuller test of the null hypothesis that `y` has a unit root (Dickey and
 * Fuller 1979, JASA 74(366), 427–431; Said and Dickey 1984, Biometrika 71(3), 599–607).
 *
 * Regression run (ordinary least squares, t indexing the changes Δy_t = y_{t+1} − y_t):
 *   Δy_t = γ y_t + α [+ β t] + Σ_{j=1}^{k} δ_j Δy_{t−j} + ε_t,
 * the statistic is τ = γ̂/se(γ̂). The variants of the references:
 * - `{ deterministic: 'constantTrend', lags: 'cubeRoot' }` is R's `tseries::adf.test(y)`;
 *   a fixed number gives `adf.test(y, k)`;
 * - `{ deterministic: 'constant', lags: 'aic' }` (the default) is statsmodels
 *   `adfuller(y, regression='c', autolag='AIC')`, and with `aicConvention: 'urca'` and
 *   `maxLag: L` it is `urca::ur.df(y, type = "drift", lags = L, selectlags = "AIC")`;
 *   `'constantTrend'` is regression 'ct' / type "trend";
 * - a fixed lag with `'constant'` is `ur.df(type = "drift", lags = k)` and
 *   `adfuller(y, maxlag=k, autolag=None)`.
 * The p-value follows MacKinnon (1994, 1996) and the critical values MacKinnon (2010), as
 * statsmodels reports them; tseries' own interpolated table p-value is not reproduced.
 *
 * O(n k² · K) for K candidate lags (one QR per candidate).
 *
 * @throws EngineError NOT_ENOUGH_DATA when the series is constant, too short for the lags
 *   (no residual degree of freedom, or a negative default maxLag), or fitted exactly;
 *   INVALID_ARGUMENT for non-finite values or a lag / maxLag that is not a non-negative integer.
 * @example adfTest(nile, { deterministic: 'constantTrend', lags: 'cubeRoot' }) // τ = −3.3657, lag 4 (tseries::adf.test(Nile))
 */
export function adfTest(y: SeriesInput, options: AdfOptions = {}): AdfResult {
  const deterministic = options.deterministic ?? 'constant';
  const lags = options.lags ?? 'aic';
  const convention = options.aicConvention ?? 'statsmodels';
  requireFiniteSeries(y, 3, 'adfTest');
  const n = y.length;
  let constant = true;
  for (let i = 1; i < n && constant; i++) constant = y[i] === y[0];
  if (constant) throw new EngineError('NOT_ENOUGH_DATA', 'adfTest: the series is constant');
  const dy = new Float64Array(n - 1);
  let scale = 0;
  for (let t = 0; t < n - 1; t++) {
    dy[t] = (y[t + 1] as number) - (y[t] as number);
    scale = Math.max(scale, Math.abs(dy[t] as number));
  }

  if (lags !== 'aic') {
    const lag = lags === 'cubeRoot' ? Math.trunc(Math.pow(n - 1, 1 / 3)) : lags;
    if (!Number.isInteger(lag) || lag < 0) {
      throw new EngineError('INVALID_ARGUMENT', `adfTest: lags must be a non-negative integer, got ${lag}`);
    }
    if (lag > n - 2)
      throw new EngineError('NOT_ENOUGH_DATA', `adfTest: ${lag} lags need more than ${lag + 2} observations`);
    const fit = dickeyFullerRegression(y, dy, lag, lag, deterministic);
    return result(tau(fit, scale), lag, fit.n, deterministic, { method: 'fixed' });
  }

  const trendTerms = deterministic === 'constant' ? 1 : 2;
  let maxLag = options.maxLag;
  if (maxLag === undefined) {
    maxLag = Math.min(Math.floor(n / 2) - trendTerms - 1, Math.ceil(12 * Math.pow(n / 100, 1 / 4)));
    if (maxLag < 0) {
      throw new EngineError('NOT_ENOUGH_DATA', `adfTest: ${n} observations are too few to choose a lag`);
    }
  } else if (!Number.isInteger(maxLag) || maxLag < 0) {
    throw new EngineError('INVALID_ARGUMENT', `adfTest: maxLag must be a non-negative integer, got ${maxLag}`);
  }
  if (maxLag > n - 2)
    throw new EngineError('NOT_ENOUGH_DATA', `adfTest: maxLag ${maxLag} needs more than ${maxLag + 2} observations`);
  const firstCandidate = convention === 'urca' && maxLag >= 1 ? 1 : 0;
  let bestLag = firstCandidate;
  let bestFit: LeastSquaresFit | undefined;
  let bestCriterion = Infinity;
  for (let lag = firstCandidate; lag <= maxLag; lag++) {
    const fit = dickeyFullerRegression(y, dy, lag, maxLag, deterministic);
    const criterion = informationCriterion(fit);
    if (bestFit === undefined || criterion < bestCriterion) {
      bestCriterion = criterion;
      bestLag = lag;
      bestFit = fit;
    }
  }
  const finalFit =
    convention === 'urca'
      ? (bestFit as LeastSquaresFit)
      : dickeyFullerRegression(y, dy, bestLag, bestLag, deterministic);
  return result(tau(finalFit, scale), bestLag, finalFit.n, deterministic, { method: 'aic', maxLag });
}

function result(
  statistic: number,
  lag: number,
  nobs: number,
  deterministic: DickeyFullerDeterministic,
  lagSelection: AdfResult['lagSelection'],
): AdfResult {
  return {
    statistic,
    lag,
    nobs,
    deterministic,
    lagSelection,
    pValue: mackinnonPValue(statistic, deterministic),
    criticalValues: mackinnonCriticalValues(nobs, deterministic),
  };
}
