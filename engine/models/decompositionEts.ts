/**
 * Forecasting by decomposition: remove the seasonal component, forecast the seasonally
 * adjusted series with a non-seasonal ETS model chosen by AICc, and add the projected
 * seasonal component back (Hyndman and Athanasopoulos, FPP3 section 3.7 and chapter 8;
 * the approach of R forecast's `stlf`). The seasonal component comes from outside (STL,
 * MSTL or the calendar-based monthly pattern of engine/decompose), so this file does not
 * depend on how it was estimated.
 *
 * The seasonal projection is treated as known: intervals are those of the adjusted
 * series' ETS model shifted by the seasonal values, as `stlf` does. They therefore leave
 * out the uncertainty of the seasonal estimate.
 */
import { EngineError } from '../core/errors';
import { autoEts, type AutoEtsFit, type AutoEtsOptions } from './autoEts';
import { forecastEts } from './etsForecast';
import { checkFinite, checkHorizon, type Forecast, type ForecastOptions, type Series } from './forecastTypes';

/** Configuration of {@link fitDecompositionEts}. */
export interface DecompositionEtsConfig {
  /** In-sample seasonal component, same length as y (the sum of all seasonal components). */
  readonly seasonal: Series;
  /**
   * Period used to repeat the last cycle of `seasonal` when no future seasonal values are
   * given at forecast time (forecast's `stlf` does this with the seasonal naive method).
   */
  readonly period?: number;
  /** Restrict the non-seasonal ETS models; default ANN, AAN and AAdN. */
  readonly allowedModels?: AutoEtsOptions['allowedModels'];
  readonly ic?: AutoEtsOptions['ic'];
  /** ETS optimiser strategy (EtsConfig.optimizer); default 'refined'. */
  readonly optimizer?: AutoEtsOptions['optimizer'];
}

/** A fitted decomposition + ETS model (plain data). */
export interface FittedDecompositionEts {
  readonly kind: 'decompositionEts';
  /** The ETS model of the seasonally adjusted series. */
  readonly adjustedModel: AutoEtsFit;
  /** The last `period` values of the seasonal component (oldest first), or null without a period. */
  readonly lastCycle: Float64Array | null;
  readonly method: string;
}

/** Options of {@link forecastDecompositionEts}. */
export interface DecompositionForecastOptions extends ForecastOptions {
  /** Projected seasonal component for the forecast days (length ≥ horizon). */
  readonly futureSeasonal?: Series;
}

/**
 * Fits ETS (ANN, AAN or AAdN by AICc) to y − seasonal.
 *
 * Complexity: that of {@link autoEts} on n values.
 *
 * @throws EngineError INVALID_ARGUMENT when `seasonal` and `y` differ in length, a value is
 *   not finite, the period is not an integer in 1..n or a seasonal ETS model is allowed;
 *   NOT_ENOUGH_DATA as autoEts.
 * @example fitDecompositionEts(y, { seasonal: stl.seasonal, period: 7 })
 */
export function fitDecompositionEts(y: Series, config: DecompositionEtsConfig): FittedDecompositionEts {
  checkFinite(y, 'y');
  checkFinite(config.seasonal, 'seasonal');
  const n = y.length;
  if (config.seasonal.length !== n) {
    throw new EngineError('INVALID_ARGUMENT', `seasonal has ${config.seasonal.length} values for ${n} observations`);
  }
  const adjusted = new Float64Array(n);
  for (let t = 0; t < n; t++) adjusted[t] = (y[t] as number) - (config.seasonal[t] as number);
  const allowed = config.allowedModels ?? ['ANN', 'AAN', 'AAdN'];
  if (allowed.length === 0 || allowed.some((m) => m.endsWith('A'))) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      'the adjusted series takes non-seasonal ETS models only (ANN, AAN, AAdN)',
    );
  }
  const adjustedModel = autoEts(adjusted, {
    allowedModels: allowed,
    ...(config.ic ? { ic: config.ic } : {}),
    ...(config.optimizer ? { optimizer: config.optimizer } : {}),
  });
  let lastCycle: Float64Array | null = null;
  if (config.period !== undefined) {
    const m = config.period;
    if (!Number.isInteger(m) || m < 1 || m > n) {
      throw new EngineError('INVALID_ARGUMENT', `period must be an integer from 1 to ${n}, got ${m}`);
    }
    lastCycle = Float64Array.from({ length: m }, (_, j) => config.seasonal[n - m + j] as number);
  }
  return { kind: 'decompositionEts', adjustedModel, lastCycle, method: `decomposition + ${adjustedModel.method}` };
}

/**
 * Forecast of the adjusted series plus the seasonal projection: `futureSeasonal` when given,
 * otherwise the last seasonal cycle repeated.
 *
 * Complexity: O(horizon · levels).
 *
 * @throws EngineError INVALID_ARGUMENT for a bad horizon or level, a `futureSeasonal` shorter
 *   than the horizon, or neither `futureSeasonal` nor a fitted period.
 * @example forecastDecompositionEts(fit, 28, { levels: [0.8, 0.9], futureSeasonal: projected })
 */
export function forecastDecompositionEts(
  fitted: FittedDecompositionEts,
  horizon: number,
  options: DecompositionForecastOptions = {},
): Forecast {
  checkHorizon(horizon);
  const future = new Float64Array(horizon);
  if (options.futureSeasonal !== undefined) {
    if (options.futureSeasonal.length < horizon) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        `futureSeasonal has ${options.futureSeasonal.length} values for horizon ${horizon}`,
      );
    }
    checkFinite(options.futureSeasonal, 'futureSeasonal');
    for (let h = 0; h < horizon; h++) future[h] = options.futureSeasonal[h] as number;
  } else if (fitted.lastCycle !== null) {
    const m = fitted.lastCycle.length;
    for (let h = 0; h < horizon; h++) future[h] = fitted.lastCycle[h % m] as number;
  } else {
    throw new EngineError('INVALID_ARGUMENT', 'give futureSeasonal, or a period when fitting, to project the season');
  }
  const base = forecastEts(fitted.adjustedModel, horizon, options.levels ? { levels: options.levels } : {});
  const shift = (a: Float64Array): Float64Array => a.map((v, h) => v + (future[h] as number));
  return {
    point: shift(base.point),
    intervals: base.intervals.map((i) => ({ level: i.level, lower: shift(i.lower), upper: shift(i.upper) })),
    model: fitted.method,
  };
}

/** A seasonal decomposition re-estimated on each training window (e.g. STL or MSTL). */
export type SeasonalDecomposer = (
  train: Float64Array,
  horizon: number,
) => { readonly seasonal: Series; readonly futureSeasonal: Series };

/**
 * The decomposition + ETS model as one `fitForecast(train, horizon, levels)` step, for the
 * rolling-origin backtest: `decompose` is called on each training window so the seasonal
 * component never sees the test data.
 *
 * @example rollingOriginBacktest(y, [{ name: 'STL + ETS', fitForecast: decompositionEtsForecaster(stlDecomposer) }], …)
 */
export function decompositionEtsForecaster(
  decompose: SeasonalDecomposer,
  config: Omit<DecompositionEtsConfig, 'seasonal' | 'period'> = {},
): (train: Float64Array, horizon: number, levels: readonly number[]) => Forecast {
  return (train, horizon, levels) => {
    const { seasonal, futureSeasonal } = decompose(train, horizon);
    const fitted = fitDecompositionEts(train, { ...config, seasonal });
    return forecastDecompositionEts(fitted, horizon, { levels, futureSeasonal });
  };
}
