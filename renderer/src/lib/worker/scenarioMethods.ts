/**
 * Worker methods of the Report screen, spread into `engineMethods` (./methods.ts) next to
 * the analysis methods. They take plain data and return plain data.
 *
 * `reportForecast` forecasts the base and the chosen scenarios on one prepared basis
 * (engine/scenario/forecastBasis.ts + forecastScenario.ts: the residual models fitted once,
 * each plan simulated with the same seed, the same numbers as runForecast), and returns,
 * besides each result, what needs the raw simulation and therefore cannot be rebuilt from
 * a result in the window: the 13-week cash view with receipts and payments split (from the
 * simulated components) and the runway with the 13-week burn. The raw paths stay here.
 *
 * Imports are relative, not `@engine/…`, so Vitest can load this file.
 */
import type { ForecastHistory } from '../../../../engine/forecast/history';
import type { RecurringDecision } from '../../../../engine/forecast/recurringComponents';
import type { ForecastResult } from '../../../../engine/forecast/runForecast';
import type { Plan } from '../../../../engine/plan/plan';
import { runway, type RunwayEstimate } from '../../../../engine/runway/runway';
import { thirteenWeekView, type ThirteenWeekView } from '../../../../engine/runway/thirteenWeekView';
import { prepareForecastBasis, type ForecastBasis } from '../../../../engine/scenario/forecastBasis';
import { forecastScenario } from '../../../../engine/scenario/forecastScenario';
import { historyFingerprint } from './analysisMethods';

/** What a method receives besides its parameters (structurally ./protocol.ts `MethodContext`). */
export interface ScenarioMethodContext {
  progress(share: number, label: string): void;
}

export interface ReportForecastParams {
  readonly history: ForecastHistory;
  readonly horizon: number;
  readonly paths: number;
  readonly seed: number;
  /** Minor units. */
  readonly threshold: number;
  readonly decisions: readonly RecurringDecision[];
  /** The plans to forecast, in order; null = the base forecast. */
  readonly plans: readonly (Plan | null)[];
}

export interface ReportRun {
  readonly result: ForecastResult;
  /** With expected receipts and payments from the simulated components. */
  readonly weeks: ThirteenWeekView;
  /** Simulated range and the 13-week burn. */
  readonly runway: RunwayEstimate;
}

let kept: { key: string; basis: ForecastBasis } | null = null;

/** The basis depends on the history, the horizon and every decision (they decide what is projected). */
function basisKey(p: ReportForecastParams): string {
  return `${historyFingerprint(p.history)}|${p.horizon}|${JSON.stringify(p.decisions)}`;
}

/** Forgets the kept basis (tests). */
export function clearScenarioCache(): void {
  kept = null;
}

export const scenarioMethods = {
  /**
   * The report's forecasts: every plan on one basis and one seed, each with its 13-week
   * view and runway.
   * @throws EngineError as prepareForecastBasis and forecastScenario (INVALID_ARGUMENT,
   *   NOT_ENOUGH_DATA).
   */
  async reportForecast(params: ReportForecastParams, context: ScenarioMethodContext): Promise<ReportRun[]> {
    const key = basisKey(params);
    let basis = kept?.key === key ? kept.basis : null;
    if (!basis) {
      basis = prepareForecastBasis(
        params.history,
        { horizon: params.horizon, decisions: params.decisions },
        (share, label) => context.progress(0.7 * share, label),
      );
      kept = { key, basis };
    }
    const runs: ReportRun[] = [];
    const n = params.plans.length || 1;
    params.plans.forEach((plan, i) => {
      const label = `Simulating ${params.paths.toLocaleString('en')} paths`;
      context.progress(0.7 + (0.3 * i) / n, label);
      const run = forecastScenario(
        basis,
        { paths: params.paths, seed: params.seed, threshold: params.threshold, ...(plan ? { plan } : {}) },
        (share) => context.progress(0.7 + (0.3 * (i + share)) / n, label),
      );
      runs.push({
        result: run.result,
        weeks: thirteenWeekView(run.result, run.components),
        runway: runway({ result: run.result, history: params.history }),
      });
    });
    context.progress(1, 'Done');
    return runs;
  },
};
