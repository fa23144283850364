/**
 * Runway from a finished forecast alone: its daily `pCrossed` is the cumulative share of
 * paths that have crossed the forecast's threshold, which is all the first-crossing
 * distribution needs. For another threshold, use firstCrossingDays on the raw paths.
 */
import type { ForecastResult } from '../forecast/runForecast';
import { runwayFromCrossedShares, type CrossingRunway } from './runwayFromCrossedShares';

/**
 * @throws EngineError INVALID_ARGUMENT for a result without forecast days.
 * @example runwayFromResult(runForecast(history, { horizon: 91 })).p10.beyondHorizon
 */
export function runwayFromResult(
  result: Pick<ForecastResult, 'asOf' | 'daily' | 'threshold' | 'paths'>,
): CrossingRunway {
  return runwayFromCrossedShares(
    result.daily.map((d) => d.pCrossed),
    result.asOf,
    result.threshold,
    result.paths,
  );
}
