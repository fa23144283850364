/**
 * Lagged and iterated differences, as R's `diff`.
 */
import { EngineError } from '../core/errors';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** Options of {@link diff}. */
export interface DiffOptions {
  /** Distance between the values subtracted: 1 for day-to-day changes, 7 for week-on-week. Default 1. */
  readonly lag?: number;
  /** How many times the differencing is applied. Default 1. */
  readonly order?: number;
}

/**
 * Differences of `y` at `lag`, applied `order` times: ∇_lag y_t = y_t − y_{t−lag}, so
 * `diff(y, { lag: 7 })` compares each day with the same weekday a week earlier and
 * `diff(y, { order: 2 })` is the change of the change. Same result as R's
 * `diff(y, lag, differences = order)`.
 *
 * O(n · order).
 *
 * @returns a new Float64Array of length n − lag · order
 * @throws EngineError NOT_ENOUGH_DATA when n ≤ lag · order (nothing would be left);
 *   INVALID_ARGUMENT for non-finite values or a lag or order that is not a positive integer.
 * @example diff([1, 4, 9, 16]) // Float64Array [3, 5, 7]
 * @example diff([1, 4, 9, 16], { order: 2 }) // Float64Array [2, 2]
 */
export function diff(y: SeriesInput, options: DiffOptions = {}): Float64Array {
  const lag = options.lag ?? 1;
  const order = options.order ?? 1;
  if (!Number.isInteger(lag) || lag < 1 || !Number.isInteger(order) || order < 1) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `diff: lag and order must be integers ≥ 1, got lag ${lag}, order ${order}`,
    );
  }
  requireFiniteSeries(y, 0, 'diff');
  if (y.length <= lag * order) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `diff: differencing at lag ${lag} ${order} time${order === 1 ? '' : 's'} needs more than ${lag * order} observations, got ${y.length}`,
    );
  }
  let current = Float64Array.from(y);
  for (let d = 0; d < order; d++) {
    const next = new Float64Array(current.length - lag);
    for (let t = 0; t < next.length; t++) next[t] = (current[t + lag] as number) - (current[t] as number);
    current = next;
  }
  return current;
}
