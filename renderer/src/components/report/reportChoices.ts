/**
 * What the Report screen reports on (kept as a workspace setting), and the choices the
 * demo's ready-made scenarios suggest: the combined case on the business account against
 * the owner's cushion, beside the commission on usual terms.
 */
import { DEMO_CUSHION } from '../../../../engine/scenario/demoScenarios';
import type { ScenarioStore } from '../scenarios/scenarioStore';

/** The workspace setting holding the report's choices. */
export const REPORT_SETTING = 'report.choices';

export interface ReportChoices {
  readonly scopeKey: string | null;
  /** Scenario shown, or null for the base forecast. */
  readonly scenarioId: string | null;
  /** What the scenario is compared with in the report: a scenario, or null for the base forecast. */
  readonly referenceId: string | null;
  readonly horizon: number;
  readonly paths: number;
  /** Minor units of `thresholdCurrency`. */
  readonly threshold: number;
  readonly thresholdCurrency: string | null;
}

export const DEFAULT_REPORT_CHOICES: ReportChoices = {
  scopeKey: null,
  scenarioId: null,
  referenceId: null,
  horizon: 91,
  paths: 5000,
  threshold: 0,
  thresholdCurrency: null,
};

/**
 * The choices after the demo's examples were added: unchanged when a scenario is already
 * chosen (the user's choice wins), otherwise the last example (both changes together)
 * compared with the reference, on `scopeKey` (when known) against the demo's cushion.
 */
export function exampleReportChoices(
  current: ReportChoices,
  ids: { readonly referenceId: string; readonly scenarioIds: readonly string[] },
  scopeKey: string | null,
): ReportChoices {
  const scenarioId = ids.scenarioIds.at(-1);
  if (current.scenarioId !== null || scenarioId === undefined) return current;
  return {
    ...current,
    scenarioId,
    referenceId: ids.referenceId,
    ...(scopeKey ? { scopeKey } : {}),
    threshold: DEMO_CUSHION * 100,
    thresholdCurrency: 'EUR',
  };
}

/** Stores {@link exampleReportChoices} of the workspace's saved choices. */
export async function saveExampleReportChoices(
  store: ScenarioStore,
  ids: { readonly referenceId: string; readonly scenarioIds: readonly string[] },
  scopeKey: string | null,
): Promise<ReportChoices> {
  const current = { ...DEFAULT_REPORT_CHOICES, ...(await store.setting(REPORT_SETTING, DEFAULT_REPORT_CHOICES)) };
  const next = exampleReportChoices(current, ids, scopeKey);
  if (next !== current) await store.saveSetting(REPORT_SETTING, next);
  return next;
}
