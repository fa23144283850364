/**
 * Runway from raw simulated paths: the first-crossing day of each path (as simulateBalances
 * records it, or firstCrossingDays gives it for another threshold).
 */
import type { CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { runwayFromCrossedShares, type CrossingRunway } from './runwayFromCrossedShares';

/**
 * @param firstCrossing per path, the day offset (0 = the first forecast day) of the first
 *   end-of-day balance below the threshold, −1 when never within the horizon.
 * @param threshold the line the crossings refer to (minor units), carried into the result.
 * @throws EngineError INVALID_ARGUMENT for no paths, a horizon below 1 or a crossing day
 *   outside −1..horizon−1.
 * @example runwayFromPaths(run.sim.firstCrossing, '2026-10-31', 91, 0).p50.weeks
 * Complexity: O(paths + horizon).
 */
export function runwayFromPaths(
  firstCrossing: Int32Array,
  asOf: CalendarDate,
  horizon: number,
  threshold = 0,
): CrossingRunway {
  const n = firstCrossing.length;
  if (n === 0) throw new EngineError('INVALID_ARGUMENT', 'runway needs at least one simulated path');
  if (!Number.isInteger(horizon) || horizon < 1) {
    throw new EngineError('INVALID_ARGUMENT', `horizon must be a whole number of days ≥ 1, got ${horizon}`);
  }
  const byDay = new Float64Array(horizon);
  for (let p = 0; p < n; p++) {
    const d = firstCrossing[p] as number;
    if (d < -1 || d >= horizon) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        `path ${p} crosses on day ${d}, outside the horizon of ${horizon} days`,
      );
    }
    if (d >= 0) byDay[d] = (byDay[d] as number) + 1;
  }
  const shares = new Float64Array(horizon);
  let run = 0;
  for (let d = 0; d < horizon; d++) {
    run += byDay[d] as number;
    shares[d] = run / n;
  }
  return runwayFromCrossedShares(shares, asOf, threshold, n);
}
