/**
 * The seasonal naive benchmark (and the naive one, its period-1 case): every future value
 * is the last observed value of the same season (Hyndman and Athanasopoulos, FPP3 section
 * 5.2), with the interval widths of FPP3 section 5.5 (table 5.2).
 */
import { EngineError } from '../core/errors';
import { checkFinite, checkHorizon, type Forecast, type ForecastOptions, type Series } from './forecastTypes';
import { gaussianIntervals } from './gaussianIntervals';

/** Configuration: the seasonal period m (1 gives the naive method). */
export interface SeasonalNaiveConfig {
  readonly period: number;
}

/** A fitted seasonal naive model (plain data). */
export interface FittedSeasonalNaive {
  readonly kind: 'seasonalNaive';
  readonly period: number;
  /** The last m observations, oldest first: the values that repeat. */
  readonly lastPeriod: Float64Array;
  /** In-sample errors y_t − y_{t−m} for t = m … n−1 (n − m values). */
  readonly residuals: Float64Array;
  /** σ² = mean of the squared residuals (as R forecast's `snaive`/`naive`). */
  readonly sigma2: number;
  readonly n: number;
}

/**
 * Fits the seasonal naive method: stores the last period and the residual variance.
 *
 * Complexity: O(n).
 *
 * @throws EngineError INVALID_ARGUMENT for a period that is not a positive integer or
 *   non-finite data; NOT_ENOUGH_DATA with n ≤ m (no seasonal difference to estimate σ from).
 * @example fitSeasonalNaive([1, 2, 3, 1.5, 2.5, 3.5], { period: 3 }).sigma2 // 0.25
 */
export function fitSeasonalNaive(y: Series, config: SeasonalNaiveConfig): FittedSeasonalNaive {
  const m = config.period;
  if (!Number.isInteger(m) || m < 1) {
    throw new EngineError('INVALID_ARGUMENT', `period must be a positive integer, got ${m}`);
  }
  checkFinite(y, 'y');
  const n = y.length;
  if (n <= m) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `the seasonal naive method with period ${m} needs more than ${m} values, got ${n}`,
    );
  }
  const residuals = new Float64Array(n - m);
  let sum = 0;
  for (let t = m; t < n; t++) {
    const e = (y[t] as number) - (y[t - m] as number);
    residuals[t - m] = e;
    sum += e * e;
  }
  const lastPeriod = new Float64Array(m);
  for (let j = 0; j < m; j++) lastPeriod[j] = y[n - m + j] as number;
  return { kind: 'seasonalNaive', period: m, lastPeriod, residuals, sigma2: sum / (n - m), n };
}

/**
 * Forecasts ŷ_{n+h} = y_{n+h−m(k+1)} with k = ⌊(h−1)/m⌋, and Gaussian intervals with
 * σ_h = σ·√(k+1) (FPP3 table 5.2; the naive method's σ·√h when m = 1). Matches R's
 * `snaive(y, h, level)` and `naive(y, h, level)`.
 *
 * Complexity: O(horizon · levels).
 *
 * @throws EngineError INVALID_ARGUMENT for a bad horizon or level.
 * @example forecastSeasonalNaive(fitSeasonalNaive(y, { period: 7 }), 14, { levels: [0.8] })
 */
export function forecastSeasonalNaive(
  fitted: FittedSeasonalNaive,
  horizon: number,
  options: ForecastOptions = {},
): Forecast {
  checkHorizon(horizon);
  const m = fitted.period;
  const point = new Float64Array(horizon);
  const sd = new Float64Array(horizon);
  const sigma = Math.sqrt(fitted.sigma2);
  for (let h = 1; h <= horizon; h++) {
    const k = Math.floor((h - 1) / m);
    point[h - 1] = fitted.lastPeriod[(h - 1) % m] as number;
    sd[h - 1] = sigma * Math.sqrt(k + 1);
  }
  return {
    point,
    intervals: gaussianIntervals(point, sd, options.levels),
    model: m === 1 ? 'naive' : `seasonal naive (m = ${m})`,
  };
}
