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
import { CAUTION } from '../core/caution';
import { EngineError } from '../core/errors';
import { addDays, fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import { EMPTY_PLAN, type Plan } from '../plan/plan';
import { detectRecurringFlows, type DetectedRecurringFlow } from '../recurring/detectRecurringFlows';
import { MAX_HORIZON, MAX_PATHS, MIN_PATHS, simulateBalances } from '../simulate/simulateBalances';
import { summariseBalances } from '../simulate/summariseBalances';
import { QUANTILE_LEVELS, type BalanceSummary, type FlowComponent } from '../simulate/types';
import type { ForecastHistory } from './history';
import { plannedComponents } from './plannedComponents';
import {
  explainedEntryIds,
  projectRecurring,
  type ProjectedRecurring,
  type RecurringDecision,
} from './recurringComponents';
import { modelResidualFlow, type DirectionReport } from './residualFlows';

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

export const DEFAULT_HORIZON = 90;
export const DEFAULT_PATHS = 5000;
export const DEFAULT_SEED = 1;
/** Fewest days of history a forecast accepts. */
export const MIN_HISTORY_DAYS = 28;

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

function checkConfig(config: ForecastConfig): Required<Omit<ForecastConfig, 'plan' | 'decisions'>> {
  const horizon = config.horizon ?? DEFAULT_HORIZON;
  const paths = config.paths ?? DEFAULT_PATHS;
  const seed = config.seed ?? DEFAULT_SEED;
  const threshold = config.threshold ?? 0;
  if (!Number.isInteger(horizon) || horizon < 1 || horizon > MAX_HORIZON) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `horizon must be a whole number of days from 1 to ${MAX_HORIZON}, got ${horizon}`,
    );
  }
  if (!Number.isInteger(paths) || paths < MIN_PATHS || paths > MAX_PATHS) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `paths must be a whole number from ${MIN_PATHS} to ${MAX_PATHS}, got ${paths}`,
    );
  }
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
    throw new EngineError('INVALID_ARGUMENT', `seed must be a whole number from 0 to 4294967295, got ${seed}`);
  }
  if (!Number.isFinite(threshold)) throw new EngineError('INVALID_ARGUMENT', 'threshold must be a finite amount');
  return { horizon, paths, seed, threshold };
}

/**
 * Daily inflow and outflow magnitudes of the entries not explained by projected recurring
 * flows, zero-filled over the history.
 */
export function residualSeries(
  history: ForecastHistory,
  explained: ReadonlySet<string>,
): { inflow: Float64Array; outflow: Float64Array; days: number } {
  const start = toDayNumber(history.start);
  const days = toDayNumber(history.asOf) - start + 1;
  const inflow = new Float64Array(days);
  const outflow = new Float64Array(days);
  for (const e of history.entries) {
    if (explained.has(e.id)) continue;
    const d = toDayNumber(e.date) - start;
    if (d < 0 || d >= days) continue;
    if (e.amount > 0) inflow[d] = (inflow[d] as number) + e.amount;
    else outflow[d] = (outflow[d] as number) - e.amount;
  }
  return { inflow, outflow, days };
}

/**
 * Runs the forecast.
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
  const { horizon, paths, seed, threshold } = checkConfig(config);
  const plan = config.plan ?? EMPTY_PLAN;
  const historyDays = toDayNumber(history.asOf) - toDayNumber(history.start) + 1;
  if (historyDays < MIN_HISTORY_DAYS) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `a forecast needs at least ${MIN_HISTORY_DAYS} days of history, the statements cover ${historyDays}`,
    );
  }
  const notes: string[] = [];
  if (history.relative) {
    notes.push('No statement states a balance, so balances are relative to the first day of the history.');
  }
  onProgress?.(0.02, 'Finding recurring flows');
  const detected = detectRecurringFlows(
    history.entries.map((e) => ({
      id: e.id,
      date: e.date,
      amount: e.amount,
      description: e.description,
      counterparty: e.counterparty,
    })),
    { asOf: history.asOf },
  );
  const recurring = projectRecurring(detected, config.decisions ?? [], plan.recurring, history.asOf, horizon);
  for (const change of recurring.unmatchedChanges) {
    notes.push(
      `The plan's change "${change.action} ${change.match}" matches no recurring flow that is projected; it was not applied.`,
    );
  }
  const residual = residualSeries(history, explainedEntryIds(detected, config.decisions ?? []));
  const forecastStart = addDays(history.asOf, 1);
  onProgress?.(0.1, 'Modelling other inflows');
  const inflow = modelResidualFlow(residual.inflow, history.start, 'inflow', forecastStart, horizon);
  onProgress?.(0.35, 'Modelling other outflows');
  const outflow = modelResidualFlow(residual.outflow, history.start, 'outflow', forecastStart, horizon);
  const components: FlowComponent[] = [...recurring.components];
  if (inflow.component) components.push(inflow.component);
  if (outflow.component) components.push(outflow.component);
  components.push(...plannedComponents(plan.items, history.asOf, horizon));
  const startBalance = history.endBalance + plan.startBalanceChange;
  onProgress?.(0.6, `Simulating ${paths.toLocaleString('en')} paths`);
  const sim = simulateBalances({ startBalance, horizon, paths, seed, threshold, components }, (share) =>
    onProgress?.(0.6 + 0.3 * share, `Simulating ${paths.toLocaleString('en')} paths`),
  );
  onProgress?.(0.92, 'Summarising');
  const summary: BalanceSummary = summariseBalances(sim, threshold, components);
  const first = toDayNumber(forecastStart);
  const daily: DailyOutlook[] = [];
  for (let d = 0; d < horizon; d++) {
    daily.push({
      date: fromDayNumber(first + d),
      mean: summary.mean[d] as number,
      quantiles: QUANTILE_LEVELS.map((_, k) => (summary.quantiles[k] as Float64Array)[d] as number),
      pBelow: summary.pBelow[d] as number,
      pCrossed: summary.pCrossed[d] as number,
    });
  }
  const dayToDate = (d: number | null) => (d === null ? null : fromDayNumber(first + d));
  onProgress?.(1, 'Done');
  return {
    asOf: history.asOf,
    currency: history.currency,
    horizonDays: horizon,
    paths,
    seed,
    threshold,
    startBalance,
    relativeBalance: history.relative,
    historyStart: history.start,
    daily,
    shortfall: {
      probability: horizon > 0 ? (summary.pCrossed[horizon - 1] as number) : 0,
      standardError: summary.standardError,
      firstCrossing: {
        p10: dayToDate(summary.firstCrossing.p10),
        p50: dayToDate(summary.firstCrossing.p50),
        p90: dayToDate(summary.firstCrossing.p90),
      },
      drivers: summary.drivers.map((d) => ({ key: d.key, label: d.label, amount: d.difference })),
    },
    recurring: recurring.projected,
    recurringSkipped: recurring.skipped,
    detected,
    model: { inflow: inflow.report, outflow: outflow.report },
    planItems: plan.items.length,
    notes: [
      ...notes,
      ...inflow.report.notes.map((n) => `Inflows: ${n}`),
      ...outflow.report.notes.map((n) => `Outflows: ${n}`),
    ],
    caution: CAUTION,
  };
}
