/**
 * The forecast: from a history to a distribution of balance paths and an honest summary.
 *
 * 1. Recurring flows are detected in the history; the user's decisions and the plan's
 *    changes decide which are projected, by their own schedules.
 * 2. Everything the projected flows do not explain is split into daily inflow and outflow
 *    magnitudes, each modelled by the candidate that wins a rolling-origin backtest
 *    (engine/forecast/residualFlows.ts).
 * 3. Planned items from the plan are added.
 * 4. Thousands of seeded paths are simulated (engine/simulate) and summarised: per-day
 *    quantiles, pBelow, pCrossed, first-crossing range and the flows that drive a shortfall.
 * Same history, configuration and seed give the same numbers, in Node, a worker or the CLI.
 */
import type { DetectedRecurringFlow } from '../recurring/detectRecurringFlows';
import type { CalendarDate } from '../core/dates';
import type { Plan } from '../plan/plan';
import { prepareForecastBasis } from '../scenario/forecastBasis';
import { forecastScenario } from '../scenario/forecastScenario';
import {
  checkHorizon,
  checkSimulationSettings,
  DEFAULT_HORIZON,
  DEFAULT_PATHS,
  DEFAULT_SEED,
} from './forecastSettings';
import type { ForecastHistory } from './history';
import type { ProjectedRecurring, RecurringDecision } from './recurringComponents';
import type { DirectionReport } from './residualFlows';

export { DEFAULT_HORIZON, DEFAULT_PATHS, DEFAULT_SEED, MIN_HISTORY_DAYS } from './forecastSettings';
export { residualSeries } from './residualSeries';

export interface ForecastConfig {
  /** Days after the as-of date, 1..730 (default 90). */
  readonly horizon?: number;
  /** Simulated paths, 100..100,000 (default 5,000). */
  readonly paths?: number;
  readonly seed?: number;
  /** Threshold in minor units (default 0). */
  readonly threshold?: number;
  readonly plan?: Plan;
  readonly decisions?: readonly RecurringDecision[];
}

export interface DailyOutlook {
  readonly date: CalendarDate;
  readonly mean: number;
  /** Quantiles at QUANTILE_LEVELS (P5, P10, P25, P50, P75, P90, P95), minor units. */
  readonly quantiles: readonly number[];
  readonly pBelow: number;
  readonly pCrossed: number;
}

export interface ForecastResult {
  readonly asOf: CalendarDate;
  readonly currency: string;
  readonly horizonDays: number;
  readonly paths: number;
  readonly seed: number;
  readonly threshold: number;
  readonly startBalance: number;
  readonly relativeBalance: boolean;
  readonly historyStart: CalendarDate;
  readonly daily: readonly DailyOutlook[];
  readonly shortfall: {
    readonly probability: number;
    readonly standardError: number;
    readonly firstCrossing: {
      readonly p10: CalendarDate | null;
      readonly p50: CalendarDate | null;
      readonly p90: CalendarDate | null;
    };
    readonly drivers: readonly { readonly key: string; readonly label: string; readonly amount: number }[];
  };
  readonly recurring: readonly ProjectedRecurring[];
  readonly recurringSkipped: readonly { readonly key: string; readonly label: string; readonly reason: string }[];
  readonly detected: readonly DetectedRecurringFlow[];
  readonly model: { readonly inflow: DirectionReport; readonly outflow: DirectionReport };
  readonly planItems: number;
  /**
   * Every note in reading order: those about the whole forecast (balances, the plan), then
   * the model notes of each direction, prefixed "Inflows: " and "Outflows: ".
   */
  readonly notes: readonly string[];
  readonly caution: string;
}

/**
 * Runs the forecast: prepares the basis (recurring flows found, residual models chosen by
 * backtest; engine/scenario/forecastBasis.ts) and simulates the plan on it
 * (engine/scenario/forecastScenario.ts). Scenario comparisons reuse one basis for several
 * plans; this is the one-plan case, so both give the same numbers by construction.
 *
 * @param onProgress share done (0..1) and a label, for progress bars.
 * @throws EngineError INVALID_ARGUMENT for settings outside their bounds; NOT_ENOUGH_DATA
 *   when the history is shorter than MIN_HISTORY_DAYS.
 * @example runForecast(historyFromLedger(ledger), { horizon: 90, paths: 5000, seed: 7 }).shortfall.probability
 */
export function runForecast(
  history: ForecastHistory,
  config: ForecastConfig = {},
  onProgress?: (share: number, label: string) => void,
): ForecastResult {
  const horizon = checkHorizon(config.horizon ?? DEFAULT_HORIZON);
  const paths = config.paths ?? DEFAULT_PATHS;
  const seed = config.seed ?? DEFAULT_SEED;
  const threshold = config.threshold ?? 0;
  checkSimulationSettings(paths, seed, threshold);
  const basis = prepareForecastBasis(history, { horizon, decisions: config.decisions ?? [] }, (share, label) =>
    onProgress?.(0.6 * share, label),
  );
  const label = `Simulating ${paths.toLocaleString('en')} paths`;
  const run = forecastScenario(basis, { paths, seed, threshold, plan: config.plan }, (share) =>
    onProgress?.(0.6 + 0.4 * share, share < 1 ? label : 'Done'),
  );
  return run.result;
}
