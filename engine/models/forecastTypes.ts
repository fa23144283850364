/**
 * The one forecast shape every Ebbline model returns, and the configure → fit → forecast
 * pattern they share. A model's configuration (what to fit) is separate from its fitted
 * form (what was estimated); both are plain data, so they cross the worker boundary and
 * can be stored in a report unchanged.
 */
import { EngineError } from '../core/errors';
import { requireFiniteSeries } from '../stats/requireFiniteSeries';

/** A numeric series as models read it: never mutated. Plain arrays and Float64Array both fit. */
export type Series = ArrayLike<number>;

/** One central prediction interval: `level` is the coverage probability, e.g. 0.8. */
export interface PredictionInterval {
  readonly level: number;
  readonly lower: Float64Array;
  readonly upper: Float64Array;
}

/**
 * A forecast over `point.length` future steps (step 1 is the first period after the data).
 * `point` is the mean of the predictive distribution; `intervals` are central intervals in
 * ascending `level`. `median` is present only when the predictive distribution is skewed
 * (e.g. intermittent flows); otherwise the point forecast is also the median.
 */
export interface Forecast {
  readonly point: Float64Array;
  readonly intervals: readonly PredictionInterval[];
  /** Human-readable model name, e.g. `ETS(A,Ad,N)` or `seasonal naive (m = 7)`. */
  readonly model: string;
  readonly median?: Float64Array;
}

/** Options every `forecastX(fitted, horizon, options)` accepts. */
export interface ForecastOptions {
  /** Coverage levels of the central intervals, each in (0, 1). Default [0.8, 0.95]. */
  readonly levels?: readonly number[];
}

/** The interval levels used when a caller gives none (those R's `forecast()` prints). */
export const DEFAULT_LEVELS: readonly number[] = [0.8, 0.95];

/**
 * A model in configure → fit → forecast form. `fit` turns data and a configuration into a
 * plain-data fitted model; `forecast` turns a fitted model into a {@link Forecast}.
 */
export interface ForecastingModel<Config, Fitted> {
  readonly fit: (y: Series, config: Config) => Fitted;
  readonly forecast: (fitted: Fitted, horizon: number, options?: ForecastOptions) => Forecast;
}

/**
 * Checks interval levels and returns them sorted ascending without duplicates.
 *
 * @throws EngineError INVALID_ARGUMENT when a level is not strictly between 0 and 1.
 * @example checkLevels([0.95, 0.8]) // [0.8, 0.95]
 */
export function checkLevels(levels: readonly number[] = DEFAULT_LEVELS): number[] {
  for (const level of levels) {
    if (!(level > 0 && level < 1)) {
      throw new EngineError('INVALID_ARGUMENT', `interval levels must lie strictly between 0 and 1, got ${level}`);
    }
  }
  return [...new Set(levels)].sort((a, b) => a - b);
}

/**
 * Checks a forecast horizon.
 *
 * @throws EngineError INVALID_ARGUMENT unless `horizon` is a positive integer.
 * @example checkHorizon(14) // no error
 */
export function checkHorizon(horizon: number): void {
  if (!Number.isInteger(horizon) || horizon < 1) {
    throw new EngineError('INVALID_ARGUMENT', `forecast horizon must be a positive integer, got ${horizon}`);
  }
}

/**
 * Checks that every value of a series is finite (the engine zero-fills calendar days
 * before modelling, so a NaN here is a caller's bug, not missing data). The models share
 * the series statistics' check.
 *
 * @throws EngineError INVALID_ARGUMENT at the first non-finite value.
 * @example checkFinite([1, 2, 3], 'y') // no error
 */
export function checkFinite(y: Series, name = 'series'): void {
  requireFiniteSeries(y, 0, name);
}
