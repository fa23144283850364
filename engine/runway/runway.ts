/**
 * Weeks of runway at the current burn, with its uncertainty: the simulated first-crossing
 * range (P10 / P50 / P90 in weeks from the as-of date, or beyond the horizon) beside the
 * plain average weekly burn of the last 13 weeks and the naive runway it implies. Composes
 * with a forecast result alone (its pCrossed) or with the raw paths of a scenario run for a
 * threshold other than the forecast's.
 */
import { CAUTION } from '../core/caution';
import { EngineError } from '../core/errors';
import type { ForecastHistory } from '../forecast/history';
import type { ForecastResult } from '../forecast/runForecast';
import { averageWeeklyBurn, type WeeklyBurn } from './averageWeeklyBurn';
import { firstCrossingDays, type BalancePaths } from './firstCrossingDays';
import { naiveRunway, NAIVE_RUNWAY_LABEL, type NaiveRunway } from './naiveRunway';
import type { CrossingRunway } from './runwayFromCrossedShares';
import { runwayFromPaths } from './runwayFromPaths';
import { runwayFromResult } from './runwayFromResult';

/** How the simulated runway is labelled wherever it is shown. */
export const SIMULATED_RUNWAY_LABEL =
  'Simulated runway: weeks until the balance first falls below the threshold in 10%, 50% and 90% of the simulated paths';

export interface RunwayEstimate {
  readonly currency: string;
  /** Balance on the as-of date the naive runway divides (minor units). */
  readonly balance: number;
  readonly simulated: CrossingRunway;
  readonly burn: WeeklyBurn;
  readonly naive: NaiveRunway;
  readonly labels: { readonly simulated: string; readonly naive: string };
  readonly caution: string;
}

export interface RunwayInput {
  readonly result: ForecastResult;
  /** The history the forecast came from (for the 13-week burn). */
  readonly history: Pick<ForecastHistory, 'start' | 'asOf' | 'entries'>;
  /** Raw paths of the same forecast; needed only for a threshold other than the result's. */
  readonly sim?: BalancePaths;
  /** Threshold in minor units (default: the forecast's). */
  readonly threshold?: number;
}

/**
 * @throws EngineError INVALID_ARGUMENT when a threshold other than the forecast's is asked
 *   for without raw paths, or the paths do not match the result; as averageWeeklyBurn.
 * @example
 * const r = runway({ result: run.result, history });
 * r.simulated.p50.weeks; r.naive.weeks;
 */
export function runway(input: RunwayInput): RunwayEstimate {
  const { result, history, sim } = input;
  const threshold = input.threshold ?? result.threshold;
  let simulated: CrossingRunway;
  if (threshold === result.threshold && !sim) {
    simulated = runwayFromResult(result);
  } else {
    if (!sim) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        'a runway for a threshold other than the forecast’s needs the raw simulated paths',
      );
    }
    if (sim.horizon !== result.horizonDays || sim.paths !== result.paths) {
      throw new EngineError('INVALID_ARGUMENT', 'the simulated paths do not belong to this forecast result');
    }
    simulated = runwayFromPaths(firstCrossingDays(sim, threshold), result.asOf, sim.horizon, threshold);
  }
  const burn = averageWeeklyBurn(history);
  return {
    currency: result.currency,
    balance: result.startBalance,
    simulated,
    burn,
    naive: naiveRunway(result.startBalance, threshold, burn.burnPerWeek),
    labels: { simulated: SIMULATED_RUNWAY_LABEL, naive: NAIVE_RUNWAY_LABEL },
    caution: CAUTION,
  };
}
