/**
 * Strength of seasonality from a decomposition's seasonal and remainder components.
 */
import { EngineError } from '../core/errors';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** Sample variance (denominator n − 1), as R's `var`. */
function variance(values: ArrayLike<number>): number {
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i] as number;
  mean /= n;
  let s = 0;
  for (let i = 0; i < n; i++) s += ((values[i] as number) - mean) ** 2;
  return s / (n - 1);
}

/**
 * Strength of seasonality F_S = max(0, 1 − Var(R)/Var(S + R)) from the seasonal S and
 * remainder R of a decomposition (Wang, Smith and Hyndman 2006, Data Mining and Knowledge
 * Discovery 13(3), 335–364; Hyndman and Athanasopoulos, Forecasting: Principles and
 * Practice, 3rd ed., §4.3): 0 when the seasonal pattern is lost in the noise, near 1 when it
 * dominates. Computed like forecast's `seas.heuristic` on an `mstl` decomposition, clipped to [0, 1].
 *
 * @throws EngineError INVALID_ARGUMENT when the components differ in length or hold
 *   non-finite values; NOT_ENOUGH_DATA for fewer than 2 values or when S + R does not vary.
 * @example seasonalStrength(decomposition.seasonal, decomposition.remainder) // 0.94 for AirPassengers
 */
export function seasonalStrength(seasonal: SeriesInput, remainder: SeriesInput): number {
  requireFiniteSeries(seasonal, 2, 'seasonalStrength: seasonal');
  requireFiniteSeries(remainder, 2, 'seasonalStrength: remainder');
  if (seasonal.length !== remainder.length) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `seasonalStrength: seasonal has ${seasonal.length} values, remainder ${remainder.length}`,
    );
  }
  const detrended = Float64Array.from(seasonal, (v, i) => v + (remainder[i] as number));
  const total = variance(detrended);
  if (!(total > 0)) throw new EngineError('NOT_ENOUGH_DATA', 'seasonalStrength: seasonal + remainder does not vary');
  return Math.max(0, Math.min(1, 1 - variance(remainder) / total));
}
