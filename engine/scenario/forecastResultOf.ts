/**
 * The ForecastResult of a finished simulation: what runForecast returns, assembled from
 * the simulation summary and the pieces that produced it. One place for this assembly, so
 * scenario runs (forecastScenario) and callers that keep their own paths (e.g. a worker
 * that re-counts crossings for a new threshold without simulating again) give results
 * identical to runForecast's.
 */
import { CAUTION } from '../core/caution';
import { addDays, fromDayNumber, toDayNumber } from '../core/dates';
import type { ForecastHistory } from '../forecast/history';
import type { RecurringProjection } from '../forecast/recurringComponents';
import type { ResidualFlowModel } from '../forecast/residualFlows';
import type { DailyOutlook, ForecastResult } from '../forecast/runForecast';
import type { DetectedRecurringFlow } from '../recurring/detectRecurringFlows';
import { QUANTILE_LEVELS, type BalanceSummary } from '../simulate/types';

export interface ForecastResultParts {
  readonly history: ForecastHistory;
  readonly summary: BalanceSummary;
  readonly paths: number;
  readonly seed: number;
  /** Minor units. */
  readonly threshold: number;
  /** The simulation's starting balance (history end balance + the plan's change). */
  readonly startBalance: number;
  readonly detected: readonly DetectedRecurringFlow[];
  readonly recurring: Pick<RecurringProjection, 'projected' | 'skipped' | 'unmatchedChanges'>;
  readonly inflow: ResidualFlowModel;
  readonly outflow: ResidualFlowModel;
  readonly planItems: number;
}

/**
 * @example forecastResultOf({ history, summary, paths, seed, threshold, startBalance, detected, recurring, inflow, outflow, planItems: 0 }).daily[0]
 * Complexity: O(horizon · quantile levels).
 */
export function forecastResultOf(parts: ForecastResultParts): ForecastResult {
  const { history, summary, inflow, outflow, recurring } = parts;
  const horizon = summary.horizon;
  const notes: string[] = [];
  if (history.relative) {
    notes.push('No statement states a balance, so balances are relative to the first day of the history.');
  }
  for (const change of recurring.unmatchedChanges) {
    notes.push(
      `The plan's change "${change.action} ${change.match}" matches no recurring flow that is projected; it was not applied.`,
    );
  }
  const first = toDayNumber(addDays(history.asOf, 1));
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
  return {
    asOf: history.asOf,
    currency: history.currency,
    horizonDays: horizon,
    paths: parts.paths,
    seed: parts.seed,
    threshold: parts.threshold,
    startBalance: parts.startBalance,
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
    detected: parts.detected,
    model: { inflow: inflow.report, outflow: outflow.report },
    planItems: parts.planItems,
    notes: [
      ...notes,
      ...inflow.report.notes.map((n) => `Inflows: ${n}`),
      ...outflow.report.notes.map((n) => `Outflows: ${n}`),
    ],
    caution: CAUTION,
  };
}
