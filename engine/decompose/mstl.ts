/**
 * MSTL: decomposition with several seasonal periods by iterated STL.
 *
 * Method: K. Bandara, R. J. Hyndman and C. Bergmeir (2021), "MSTL: A Seasonal-Trend
 * Decomposition Algorithm for Time Series with Multiple Seasonal Patterns",
 * arXiv:2107.13462. The procedure and its defaults are those of R's `forecast::mstl`
 * (forecast 8.20) for an `msts` series, reproduced step by step:
 *
 * 1. periods with fewer than two full cycles (period ≥ n/2) are dropped (R warns
 *    "Dropping seasonal components with fewer than two full periods."; here they are
 *    listed in `droppedPeriods`), the rest sorted ascending;
 * 2. `iterate` times (default 2), for each period in turn: add its current seasonal back
 *    to the deseasonalised series, fit STL with that period and its `s.window`
 *    (default 7 + 4·i for the i-th kept period: 11, 15, 19, …), take the new seasonal out;
 * 3. the trend is the trend of the last STL fit; remainder = deseasonalised − trend.
 *
 * Not reproduced: R's Box–Cox option (`lambda`; Ebbline works on untransformed amounts),
 * interpolation of missing values (`na.interp`; Ebbline's daily series are zero-filled, and
 * non-finite input is refused), and the `supsmu` trend-only path R takes when no seasonal
 * period is left (R fails in that case for an `msts` input; Ebbline throws NOT_ENOUGH_DATA).
 */
import { EngineError } from '../core/errors';
import { stl, type StlConfig } from './stl';

/** STL arguments that {@link mstl} passes to every STL fit (R's `...` of `mstl`). */
export type MstlStlOptions = Omit<StlConfig, 'period' | 'sWindow'>;

/** Configuration of {@link mstl}. */
export interface MstlConfig {
  /** Seasonal periods (R's `seasonal.periods`), each at least 2, e.g. [7, 365.25]. */
  readonly periods: readonly number[];
  /**
   * Seasonal spans, one per kept period in ascending order, or one value for all;
   * default 7 + 4·i (i = 1, 2, …) as in `forecast::mstl`.
   */
  readonly sWindow?: number | 'periodic' | readonly number[];
  /** Number of passes over the periods (R default 2; values below 1 count as 1, as in R). */
  readonly iterate?: number;
  /** Further STL arguments for every fit, e.g. `{ robust: true }`. */
  readonly stl?: MstlStlOptions;
}

/** One seasonal component of an MSTL fit. */
export interface MstlSeasonal {
  readonly period: number;
  /** R's column name, e.g. `Seasonal7`, `Seasonal365.25`. */
  readonly label: string;
  readonly values: Float64Array;
}

/** Result of {@link mstl}. Plain data. */
export interface MstlResult {
  readonly trend: Float64Array;
  /** One component per kept period, ascending by period. */
  readonly seasonal: readonly MstlSeasonal[];
  readonly remainder: Float64Array;
  /** Periods left out because the series has fewer than two full cycles of them (period ≥ n/2). */
  readonly droppedPeriods: readonly number[];
}

/**
 * Decomposes y into trend, one seasonal component per period, and remainder, as R's
 * `forecast::mstl(msts(y, seasonal.periods = periods))` does.
 *
 * Source: Bandara, Hyndman and Bergmeir (2021), arXiv:2107.13462; R forecast 8.20 `mstl`.
 *
 * Complexity: iterate · (number of periods) STL fits, each O(n) with default jumps (see
 * {@link stl}); O(n · periods) memory.
 *
 * @param y finite values; never mutated.
 * @param config periods and options.
 * @returns trend, seasonal components (ascending period) and remainder as new arrays,
 *   with the periods that were dropped.
 * @throws EngineError INVALID_ARGUMENT for no periods, a period below 2 or not finite, an
 *   `sWindow` array shorter than the kept periods, non-finite input, or bad STL options.
 * @throws EngineError NOT_ENOUGH_DATA when every period is dropped (n ≤ 2 · period for all).
 *
 * @example
 * // R: mstl(msts(y, seasonal.periods = c(7, 365.25)))
 * const fit = mstl(daily, { periods: [7, 365.25] });
 * fit.seasonal.map((s) => s.label); // ['Seasonal7', 'Seasonal365.25'] with ≥ 731 days
 */
export function mstl(y: ArrayLike<number>, config: MstlConfig): MstlResult {
  const n = y.length;
  if (config.periods.length === 0) {
    throw new EngineError('INVALID_ARGUMENT', 'MSTL needs at least one seasonal period');
  }
  for (const p of config.periods) {
    if (!Number.isFinite(p) || p < 2) {
      throw new EngineError('INVALID_ARGUMENT', `MSTL periods must be at least 2, got ${p}`);
    }
  }
  const kept = config.periods.filter((p) => p < n / 2).sort((a, b) => a - b);
  const droppedPeriods = config.periods.filter((p) => p >= n / 2);
  if (kept.length === 0) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `MSTL: ${n} observations hold fewer than two full cycles of every period (${config.periods.join(', ')})`,
    );
  }
  const windows = seasonalWindows(config.sWindow, kept.length);
  const iterate = Math.max(1, Math.trunc(config.iterate ?? 2));

  const deseas = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = y[i] as number;
    if (!Number.isFinite(v)) {
      throw new EngineError('INVALID_ARGUMENT', `MSTL input must be finite; value ${i} is ${v}`);
    }
    deseas[i] = v;
  }

  const seasonal: Float64Array[] = kept.map(() => new Float64Array(n));
  let trend: Float64Array = new Float64Array(n);
  for (let pass = 0; pass < iterate; pass++) {
    for (let k = 0; k < kept.length; k++) {
      const s = seasonal[k] as Float64Array;
      for (let i = 0; i < n; i++) deseas[i] = (deseas[i] as number) + (s[i] as number);
      const fit = stl(deseas, { ...config.stl, period: kept[k] as number, sWindow: windows[k] as number | 'periodic' });
      s.set(fit.seasonal);
      for (let i = 0; i < n; i++) deseas[i] = (deseas[i] as number) - (s[i] as number);
      trend = fit.trend;
    }
  }
  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = (deseas[i] as number) - (trend[i] as number);

  return {
    trend,
    seasonal: kept.map((period, k) => ({
      period,
      label: `Seasonal${Math.round(period * 100) / 100}`,
      values: seasonal[k] as Float64Array,
    })),
    remainder,
    droppedPeriods,
  };
}

function seasonalWindows(
  sWindow: number | 'periodic' | readonly number[] | undefined,
  count: number,
): (number | 'periodic')[] {
  if (sWindow === undefined) return Array.from({ length: count }, (_, i) => 7 + 4 * (i + 1));
  if (typeof sWindow === 'number' || sWindow === 'periodic') return Array.from({ length: count }, () => sWindow);
  if (sWindow.length === 1) return Array.from({ length: count }, () => sWindow[0] as number);
  if (sWindow.length < count) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `MSTL sWindow has ${sWindow.length} values for ${count} seasonal periods`,
    );
  }
  return sWindow.slice(0, count);
}
