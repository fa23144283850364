/**
 * Runs a side-by-side comparison: the base and each chosen scenario forecast through the
 * worker's `forecast` method (engine/forecast/runForecast.ts numbers) with the same
 * history, decisions, horizon, paths, threshold and — the point — the same seed, so every
 * component a scenario leaves alone draws the same random numbers and the difference is
 * the scenario's change, not noise. The results are then set side by side by
 * engine/scenario/compareScenarios.ts.
 *
 * Runs one after the other: the worker is one thread, and the first run fits the residual
 * models that the others reuse.
 */
import type { ForecastHistory } from '../../../../engine/forecast/history';
import type { RecurringDecision } from '../../../../engine/forecast/recurringComponents';
import type { ForecastConfig, ForecastResult } from '../../../../engine/forecast/runForecast';
import type { Plan } from '../../../../engine/plan/plan';
import { compareScenarios, MAX_SCENARIOS, type ScenarioComparison } from '../../../../engine/scenario/compareScenarios';

/** The seed of every comparison run (the Outlook's too, so the base matches it). */
export const SCENARIO_SEED = 1;

/** What the runner needs from the engine client (a fake in tests). */
export interface ScenarioForecastCaller {
  call(
    method: 'forecast',
    params: { history: ForecastHistory; config: ForecastConfig },
    options?: { signal?: AbortSignal; onProgress?: (share: number, label: string) => void },
  ): Promise<ForecastResult>;
}

export interface ComparisonSettings {
  readonly horizon: number;
  readonly paths: number;
  /** Minor units of the history's currency. */
  readonly threshold: number;
}

export interface NamedPlan {
  /** Scenario id, or null for the base forecast. */
  readonly id: string | null;
  readonly name: string;
  /** The validated plan, or null for the base forecast (no changes). */
  readonly plan: Plan | null;
}

export interface ComparisonInput {
  readonly history: ForecastHistory;
  readonly decisions: readonly RecurringDecision[];
  /** What the scenarios are compared against: the base forecast or a scenario. */
  readonly reference: NamedPlan;
  readonly scenarios: readonly NamedPlan[];
  readonly settings: ComparisonSettings;
}

export interface ComparedRun {
  readonly id: string | null;
  readonly name: string;
  readonly result: ForecastResult;
  /** Plan changes that matched no projected recurring flow (from the result's notes). */
  readonly unmatched: readonly string[];
}

export interface ComparisonOutcome {
  readonly settings: ComparisonSettings & { readonly seed: number };
  readonly reference: ComparedRun;
  readonly runs: readonly ComparedRun[];
  readonly comparison: ScenarioComparison;
}

/** The notes of a result that say a plan change was not applied. */
export function unmatchedNotes(result: ForecastResult): string[] {
  return result.notes.filter((n) => n.includes('matches no recurring flow'));
}

/**
 * @throws Error for more than MAX_SCENARIOS scenarios; the engine's errors (EngineCallError
 *   with its code); CancelledError when the signal aborts.
 * @example const outcome = await runComparison(engine, { history, decisions, reference: { id: null, name: 'Base forecast', plan: null }, scenarios, settings: { horizon: 90, paths: 5000, threshold: 0 } });
 */
export async function runComparison(
  caller: ScenarioForecastCaller,
  input: ComparisonInput,
  options: { signal?: AbortSignal; onProgress?: (share: number, label: string) => void } = {},
): Promise<ComparisonOutcome> {
  if (input.scenarios.length > MAX_SCENARIOS) {
    throw new Error(`At most ${MAX_SCENARIOS} scenarios can be compared at once.`);
  }
  const all = [input.reference, ...input.scenarios];
  const runs: ComparedRun[] = [];
  for (let i = 0; i < all.length; i++) {
    const entry = all[i] as NamedPlan;
    const config: ForecastConfig = {
      horizon: input.settings.horizon,
      paths: input.settings.paths,
      seed: SCENARIO_SEED,
      threshold: input.settings.threshold,
      decisions: input.decisions,
      ...(entry.plan ? { plan: entry.plan } : {}),
    };
    const result = await caller.call(
      'forecast',
      { history: input.history, config },
      {
        signal: options.signal,
        onProgress: (share, label) =>
          options.onProgress?.(
            (i + share) / all.length,
            `${entry.name}: ${label.charAt(0).toLowerCase()}${label.slice(1)}`,
          ),
      },
    );
    runs.push({ id: entry.id, name: entry.name, result, unmatched: unmatchedNotes(result) });
  }
  const [reference, ...scenarioRuns] = runs as [ComparedRun, ...ComparedRun[]];
  const comparison = compareScenarios(
    reference.result,
    scenarioRuns.map((r) => ({ name: r.name, result: r.result })),
    { baseName: reference.name },
  );
  return { settings: { ...input.settings, seed: SCENARIO_SEED }, reference, runs: scenarioRuns, comparison };
}
