/**
 * runForecast's inputs, runForecast's result, plus the raw material: the same history and
 * ForecastConfig give the same ForecastResult as runForecast, and also the simulated paths
 * and components that the runway for another threshold and the 13-week view's
 * inflow/outflow split need. For several scenarios on one history, prepare the basis once
 * (prepareForecastBasis) and call forecastScenario per scenario instead.
 */
import type { ForecastHistory } from '../forecast/history';
import type { ForecastConfig } from '../forecast/runForecast';
import { prepareForecastBasis } from './forecastBasis';
import { forecastScenario, type ScenarioRun } from './forecastScenario';

/**
 * @throws EngineError as runForecast (INVALID_ARGUMENT for settings out of bounds,
 *   NOT_ENOUGH_DATA for under 28 days of history).
 * @example
 * const run = forecastWithPaths(history, { horizon: 91, paths: 5000, seed: 7 });
 * thirteenWeekView(run.result, run.components);
 */
export function forecastWithPaths(
  history: ForecastHistory,
  config: ForecastConfig = {},
  onProgress?: (share: number, label: string) => void,
): ScenarioRun {
  const basis = prepareForecastBasis(
    history,
    {
      ...(config.horizon !== undefined ? { horizon: config.horizon } : {}),
      ...(config.decisions !== undefined ? { decisions: config.decisions } : {}),
    },
    (share, label) => onProgress?.(0.6 * share, label),
  );
  return forecastScenario(
    basis,
    {
      ...(config.paths !== undefined ? { paths: config.paths } : {}),
      ...(config.seed !== undefined ? { seed: config.seed } : {}),
      ...(config.threshold !== undefined ? { threshold: config.threshold } : {}),
      ...(config.plan !== undefined ? { plan: config.plan } : {}),
    },
    (share) => onProgress?.(0.6 + 0.4 * share, 'Simulating paths'),
  );
}
