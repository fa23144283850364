/**
 * The Report screen's state: which accounts, which scenario (or the base forecast), the
 * horizon, paths and threshold; the report document built from them by the engine
 * (engine/report/renderReportHtml.ts) and its daily figures as CSV (reportCsv).
 *
 * Forecasts run in the Scenarios/Report worker (scenarioEngine). The `reportForecast`
 * method (lib/worker/scenarioMethods.ts) gives the 13-week view with receipts and payments
 * split; until it is registered in the worker's methods, the worker's `forecast` is used
 * and the 13-week view shows the net flow only (the report says so). With a scenario
 * chosen, its reference (the base forecast, or another scenario such as the demo's
 * "commission on usual terms") runs too, on the same seed, and the report includes the
 * comparison.
 */
import type { ForecastHistory } from '@engine/forecast/history';
import type { RecurringDecision } from '@engine/forecast/recurringComponents';
import type { ForecastConfig, ForecastResult } from '@engine/forecast/runForecast';
import type { Plan } from '@engine/plan/plan';
import { renderReportHtml } from '@engine/report/renderReportHtml';
import { reportCsv } from '@engine/report/reportCsv';
import { runway } from '@engine/runway/runway';
import { thirteenWeekView } from '@engine/runway/thirteenWeekView';
import { compareScenarios } from '@engine/scenario/compareScenarios';
import { SCENARIO_SEED } from '../../components/scenarios/comparisonRun';
import type { ScenarioStore } from '../../components/scenarios/scenarioStore';
import { DEFAULT_REPORT_CHOICES, REPORT_SETTING, type ReportChoices } from '../../components/report/reportChoices';
import { fileStem, reconciliationOf } from '../../components/report/reportDocument';
import { localDateText } from '../../components/backup/workspaceBackup';
import type { AccountRecord } from '../db/records';
import { CancelledError, EngineCallError } from '../worker/engineClient';
import type { ReportForecastParams, ReportRun } from '../worker/scenarioMethods';
import { BASE_NAME, scenarioEngine } from './scenarios.svelte';

export type ReportStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'error';

/** A finished report. */
export interface BuiltReport {
  readonly html: string;
  readonly csv: string;
  readonly result: ForecastResult;
  readonly title: string;
  readonly generatedOn: string;
  /** False when the 13-week view could only show the net flow. */
  readonly splitWeeks: boolean;
  readonly pdfName: string;
  readonly csvName: string;
}

export interface ReportInput {
  readonly workspaceName: string;
  readonly scopeLabel: string;
  readonly accounts: readonly AccountRecord[];
  readonly history: ForecastHistory;
  readonly decisions: readonly RecurringDecision[];
  /** The chosen scenario's name and validated plan, or null for the base forecast. */
  readonly scenario: { readonly name: string; readonly plan: Plan } | null;
  /** What the scenario is compared with: a scenario, or null for the base forecast (no changes). */
  readonly reference: { readonly name: string; readonly plan: Plan } | null;
  readonly threshold: number;
}

/** What the report needs from the engine client; loose because `reportForecast` may not be registered yet. */
interface LooseCaller {
  call(
    method: string,
    params: unknown,
    options?: { signal?: AbortSignal; onProgress?: (share: number, label: string) => void },
  ): Promise<unknown>;
}

export class ReportState {
  #choices = $state.raw<ReportChoices>(DEFAULT_REPORT_CHOICES);
  #report = $state.raw<BuiltReport | null>(null);
  #reportKey = $state('');
  #status = $state<ReportStatus>('idle');
  #share = $state(0);
  #label = $state('');
  #error = $state<string | null>(null);
  #store: ScenarioStore | null = null;
  #controller: AbortController | null = null;
  readonly #engine: LooseCaller;

  constructor(engine?: LooseCaller) {
    this.#engine = engine ?? (scenarioEngine() as unknown as LooseCaller);
  }

  get choices(): ReportChoices {
    return this.#choices;
  }
  get report(): BuiltReport | null {
    return this.#report;
  }
  /** The inputs of the report shown (compare with the current key to tell it is out of date). */
  get reportKey(): string {
    return this.#reportKey;
  }
  get status(): ReportStatus {
    return this.#status;
  }
  get running(): boolean {
    return this.#status === 'running';
  }
  get share(): number {
    return this.#share;
  }
  get label(): string {
    return this.#label;
  }
  get error(): string | null {
    return this.#error;
  }

  async load(store: ScenarioStore | null): Promise<void> {
    this.cancel();
    this.#controller = null;
    this.#store = store;
    this.#report = null;
    this.#reportKey = '';
    this.#status = 'idle';
    this.#choices = store
      ? { ...DEFAULT_REPORT_CHOICES, ...(await store.setting(REPORT_SETTING, DEFAULT_REPORT_CHOICES)) }
      : DEFAULT_REPORT_CHOICES;
  }

  set(patch: Partial<ReportChoices>): void {
    this.#choices = { ...this.#choices, ...patch };
    void this.#store?.saveSetting(REPORT_SETTING, this.#choices).catch(() => {
      // A convenience only: the choices stay for this session.
    });
  }

  thresholdFor(currency: string): number {
    return this.#choices.thresholdCurrency === currency ? this.#choices.threshold : 0;
  }

  async #forecasts(
    input: ReportInput,
    signal: AbortSignal,
    onProgress: (share: number, label: string) => void,
  ): Promise<{ runs: ReportRun[]; split: boolean }> {
    const plans = input.scenario ? [input.reference?.plan ?? null, input.scenario.plan] : [null];
    const params: ReportForecastParams = {
      history: input.history,
      horizon: this.#choices.horizon,
      paths: this.#choices.paths,
      seed: SCENARIO_SEED,
      threshold: input.threshold,
      decisions: input.decisions,
      plans,
    };
    try {
      const runs = (await this.#engine.call('reportForecast', params, { signal, onProgress })) as ReportRun[];
      return { runs, split: true };
    } catch (error) {
      if (!(error instanceof EngineCallError && /unknown engine method/.test(error.message))) throw error;
    }
    const runs: ReportRun[] = [];
    for (let i = 0; i < plans.length; i++) {
      const plan = plans[i];
      const config: ForecastConfig = {
        horizon: params.horizon,
        paths: params.paths,
        seed: params.seed,
        threshold: params.threshold,
        decisions: params.decisions,
        ...(plan ? { plan } : {}),
      };
      const result = (await this.#engine.call(
        'forecast',
        { history: input.history, config },
        { signal, onProgress: (s, l) => onProgress((i + s) / plans.length, l) },
      )) as ForecastResult;
      runs.push({ result, weeks: thirteenWeekView(result), runway: runway({ result, history: input.history }) });
    }
    return { runs, split: false };
  }

  /** Builds the report (the newest call wins). */
  async build(input: ReportInput, key: string): Promise<void> {
    this.#controller?.abort();
    const controller = new AbortController();
    this.#controller = controller;
    this.#status = 'running';
    this.#error = null;
    this.#share = 0;
    this.#label = 'Starting';
    try {
      const snapshot = {
        ...input,
        history: $state.snapshot(input.history) as ForecastHistory,
        decisions: $state.snapshot(input.decisions) as RecurringDecision[],
        scenario: input.scenario ? ($state.snapshot(input.scenario) as ReportInput['scenario']) : null,
        reference: input.reference ? ($state.snapshot(input.reference) as ReportInput['reference']) : null,
      };
      const { runs, split } = await this.#forecasts(snapshot, controller.signal, (share, label) => {
        this.#share = share;
        this.#label = label;
      });
      if (controller !== this.#controller) return;
      const base = runs[0] as ReportRun;
      const main = (input.scenario ? runs[1] : runs[0]) as ReportRun;
      const comparison = input.scenario
        ? compareScenarios(base.result, [{ name: input.scenario.name, result: main.result }], {
            baseName: input.reference?.name ?? BASE_NAME,
          })
        : undefined;
      const generatedOn = localDateText();
      const title = input.scenario
        ? `Cash outlook for ${input.workspaceName}: scenario “${input.scenario.name}”`
        : `Cash outlook for ${input.workspaceName}`;
      const html = renderReportHtml({
        result: main.result,
        title,
        scopeLabel: input.scopeLabel,
        generatedOn,
        reconciliation: reconciliationOf(input.accounts),
        weeks: main.weeks,
        runway: main.runway,
        ...(comparison ? { comparison } : {}),
      });
      const stem = fileStem(input.workspaceName);
      this.#report = {
        html,
        csv: reportCsv(main.result),
        result: main.result,
        title,
        generatedOn,
        splitWeeks: split,
        pdfName: `${stem}-report-${generatedOn}.pdf`,
        csvName: `${stem}-daily-figures-${main.result.asOf}.csv`,
      };
      this.#reportKey = key;
      this.#status = 'done';
    } catch (error) {
      if (controller !== this.#controller) return;
      if (error instanceof CancelledError) this.#status = 'cancelled';
      else {
        this.#status = 'error';
        this.#error = (error as Error).message;
      }
    } finally {
      if (controller === this.#controller) this.#controller = null;
    }
  }

  cancel(): void {
    this.#controller?.abort();
  }

  dispose(): void {
    this.cancel();
  }
}
