/**
 * One scenario's forecast on a prepared basis: the plan's recurring changes and planned
 * items are applied, the paths simulated and summarised exactly as runForecast does, and
 * the raw paths and components are kept for what needs them (runway for another threshold,
 * the 13-week view's expected inflow and outflow).
 *
 * Every component draws from its own substream keyed by its stable key (engine/simulate),
 * so the base and a scenario share the draws of everything the scenario leaves alone:
 * their difference is the scenario's change, not noise.
 */
import { plannedComponents } from '../forecast/plannedComponents';
import { projectRecurring } from '../forecast/recurringComponents';
import { checkSimulationSettings, DEFAULT_PATHS, DEFAULT_SEED } from '../forecast/forecastSettings';
import type { ForecastResult } from '../forecast/runForecast';
import { EMPTY_PLAN, type Plan } from '../plan/plan';
import { simulateBalances, type SimulatedPaths } from '../simulate/simulateBalances';
import { summariseBalances } from '../simulate/summariseBalances';
import type { FlowComponent } from '../simulate/types';
import type { ForecastBasis } from './forecastBasis';
import { forecastResultOf } from './forecastResultOf';

/** The scenario's settings; the horizon and decisions come from the basis. */
export interface ScenarioConfig {
  /** Simulated paths, 100..100,000 (default 5,000). */
  readonly paths?: number;
  readonly seed?: number;
  /** Threshold in minor units (default 0). */
  readonly threshold?: number;
  /** The scenario's plan (default: none, the base forecast). */
  readonly plan?: Plan;
}

/** A scenario's forecast with the raw material behind it. */
export interface ScenarioRun {
  /** The same result runForecast gives for the same history, settings and seed. */
  readonly result: ForecastResult;
  /** Raw paths: balances day-major, first crossing per path, component totals. */
  readonly sim: SimulatedPaths;
  /** The simulated components, in simulation order. */
  readonly components: readonly FlowComponent[];
}

/**
 * Forecasts one scenario on a basis.
 *
 * @param onProgress share done (0..1), for progress bars.
 * @throws EngineError INVALID_ARGUMENT for paths, seed or threshold outside their bounds.
 * @example
 * const run = forecastScenario(basis, { paths: 5000, seed: 7, plan });
 * run.result.shortfall.probability;
 * Complexity: O(paths · (horizon + Σ occurrences)) for the simulation, plus the summary's
 * O(horizon · paths · quantile levels).
 */
export function forecastScenario(
  basis: ForecastBasis,
  config: ScenarioConfig = {},
  onProgress?: (share: number) => void,
): ScenarioRun {
  const paths = config.paths ?? DEFAULT_PATHS;
  const seed = config.seed ?? DEFAULT_SEED;
  const threshold = config.threshold ?? 0;
  checkSimulationSettings(paths, seed, threshold);
  const plan = config.plan ?? EMPTY_PLAN;
  const { history, horizon, inflow, outflow } = basis;
  const recurring = projectRecurring(basis.detected, basis.decisions, plan.recurring, history.asOf, horizon);
  // The order matters: it is the order of runForecast, so drivers tie-break the same way.
  const components: FlowComponent[] = [...recurring.components];
  if (inflow.component) components.push(inflow.component);
  if (outflow.component) components.push(outflow.component);
  components.push(...plannedComponents(plan.items, history.asOf, horizon));
  const startBalance = history.endBalance + plan.startBalanceChange;
  const sim = simulateBalances({ startBalance, horizon, paths, seed, threshold, components }, onProgress);
  const summary = summariseBalances(sim, threshold, components);
  const result = forecastResultOf({
    history,
    summary,
    paths,
    seed,
    threshold,
    startBalance,
    detected: basis.detected,
    recurring,
    inflow,
    outflow,
    planItems: plan.items.length,
  });
  return { result, sim, components };
}
