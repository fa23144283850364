/**
 * The part of a forecast that does not depend on the scenario: recurring flows found in the
 * history and the residual inflow and outflow models (the expensive step, a rolling-origin
 * backtest per direction). Scenarios only add planned items and pause or scale recurring
 * flows, so one basis serves the base forecast and every scenario compared with it
 * (engine/scenario/forecastScenario.ts), and the models are fitted once instead of once per
 * scenario.
 *
 * runForecast (engine/forecast/runForecast.ts) is this basis plus one scenario, so the
 * base forecast and the scenarios compared with it come from the same steps.
 */
import { addDays } from '../core/dates';
import { checkHistoryLength, checkHorizon, DEFAULT_HORIZON } from '../forecast/forecastSettings';
import type { ForecastHistory } from '../forecast/history';
import { explainedEntryIds, type RecurringDecision } from '../forecast/recurringComponents';
import { modelResidualFlow, type ResidualFlowModel } from '../forecast/residualFlows';
import { residualSeries } from '../forecast/residualSeries';
import { detectRecurringFlows, type DetectedRecurringFlow } from '../recurring/detectRecurringFlows';

/** What a basis is prepared from besides the history. */
export interface ForecastBasisConfig {
  /** Days after the as-of date, 1..730 (default 90). */
  readonly horizon?: number;
  /** The user's decisions about detected recurring flows. */
  readonly decisions?: readonly RecurringDecision[];
}

/** Everything a scenario forecast needs that no scenario changes (plain data). */
export interface ForecastBasis {
  readonly history: ForecastHistory;
  readonly horizon: number;
  readonly decisions: readonly RecurringDecision[];
  readonly detected: readonly DetectedRecurringFlow[];
  readonly inflow: ResidualFlowModel;
  readonly outflow: ResidualFlowModel;
}

/**
 * Finds the recurring flows and fits the residual models of a history.
 *
 * @param onProgress share done (0..1) and a label, for progress bars.
 * @throws EngineError INVALID_ARGUMENT for a horizon outside 1..730; NOT_ENOUGH_DATA when
 *   the history is shorter than MIN_HISTORY_DAYS (28 days).
 * @example
 * const basis = prepareForecastBasis(history, { horizon: 91 });
 * const base = forecastScenario(basis, { paths: 5000, seed: 7 });
 * Complexity: that of modelResidualFlow (4 backtest origins × candidate fits), twice.
 */
export function prepareForecastBasis(
  history: ForecastHistory,
  config: ForecastBasisConfig = {},
  onProgress?: (share: number, label: string) => void,
): ForecastBasis {
  const horizon = checkHorizon(config.horizon ?? DEFAULT_HORIZON);
  checkHistoryLength(history);
  const decisions = config.decisions ?? [];
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
  // Entries of detected flows leave the residual history unless the user dismissed the
  // flow or it is an unconfirmed low-confidence suggestion (explainedEntryIds). Plan changes
  // (pause, scale) act on the projection only.
  const residual = residualSeries(history, explainedEntryIds(detected, decisions));
  const forecastStart = addDays(history.asOf, 1);
  onProgress?.(0.1, 'Modelling other inflows');
  const inflow = modelResidualFlow(residual.inflow, history.start, 'inflow', forecastStart, horizon);
  onProgress?.(0.5, 'Modelling other outflows');
  const outflow = modelResidualFlow(residual.outflow, history.start, 'outflow', forecastStart, horizon);
  onProgress?.(1, 'Models ready');
  return { history, horizon, decisions, detected, inflow, outflow };
}
