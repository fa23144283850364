/**
 * Whether a seasonal difference is needed, by the seasonal-strength rule of forecast's `nsdiffs`.
 */
import { EngineError } from '../core/errors';
import { isConstant } from './isConstant';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** Options of {@link nsdiffs}. */
export interface NsdiffsOptions {
  /** Observations per seasonal cycle (7 for a weekly rhythm in daily data), an integer ≥ 2. */
  readonly period: number;
  /** F_S of the series' decomposition, from {@link seasonalStrength}; in [0, 1]. */
  readonly seasonalStrength: number;
}

/** Strength above which forecast's `nsdiffs(test = "seas")` takes a seasonal difference. */
export const SEASONAL_DIFFERENCE_THRESHOLD = 0.64;

/**
 * Number of seasonal differences (0 or 1) the series needs: 1 when its seasonal strength
 * exceeds 0.64, the rule of R's `forecast::nsdiffs(y, test = "seas")` with max.D = 1 (Wang,
 * Smith and Hyndman 2006 for the strength measure; the threshold is forecast's). Like
 * forecast it answers 0 for a constant series and when one cycle is as long as the series.
 * The strength comes from a decomposition (engine/decompose), passed in so that this
 * module stays independent of it.
 *
 * @throws EngineError INVALID_ARGUMENT for a period that is not an integer ≥ 2 (a
 *   non-seasonal series), a strength outside [0, 1] or non-finite values; NOT_ENOUGH_DATA
 *   for an empty series.
 * @example nsdiffs(airPassengers, { period: 12, seasonalStrength: 0.94 }) // 1
 */
export function nsdiffs(y: SeriesInput, options: NsdiffsOptions): 0 | 1 {
  const { period, seasonalStrength } = options;
  requireFiniteSeries(y, 1, 'nsdiffs');
  if (!Number.isInteger(period) || period < 2) {
    throw new EngineError('INVALID_ARGUMENT', `nsdiffs: period must be an integer ≥ 2, got ${period}`);
  }
  if (!(seasonalStrength >= 0 && seasonalStrength <= 1)) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `nsdiffs: seasonalStrength must be within [0, 1], got ${seasonalStrength}`,
    );
  }
  if (isConstant(y) || period >= y.length) return 0;
  return seasonalStrength > SEASONAL_DIFFERENCE_THRESHOLD ? 1 : 0;
}
