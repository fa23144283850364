/**
 * The Outlook screen's state: the user's settings (horizon, paths, threshold, table view),
 * the forecast shown and the run in progress.
 *
 * Every forecast runs in engine workers, never on the window's thread:
 * - the first forecast of a history fits the residual models of money in and money out in
 *   two workers at once (the backtests are the slow part), then simulates in the first;
 * - the history is posted to each worker once, under a key; later calls only name it;
 * - a change of a setting re-forecasts after a short pause while the user is still typing
 *   (DEBOUNCE_MS), or at once when the change is committed (Enter, leaving the field, a
 *   preset). A run under way when a setting changes is left to finish — it keeps the
 *   workers' fitted models warm — and the newest settings run right after it. Only a new
 *   history or Cancel stops a run (Cancel replaces the workers).
 * The workers are shared by every Outlook screen mounted, so coming back to the screen
 * finds the models still fitted.
 */
import type { ForecastHistory } from '@engine/forecast/history';
import type { RecurringDecision } from '@engine/forecast/recurringComponents';
import type { ForecastResult } from '@engine/forecast/runForecast';
import { CancelledError, EngineCallError, EngineClient, type CallOptions } from '../worker/engineClient';
import type { ParamsOf, ResultOf } from '../worker/protocol';
import type { ResidualModels } from '../worker/analysisMethods';

/** Horizons offered as buttons; any whole number of days from MIN_HORIZON to MAX_HORIZON may be typed. */
export const HORIZON_PRESETS = [30, 60, 90, 180, 365] as const;
export const MIN_HORIZON = 30;
export const MAX_HORIZON = 365;
export const PATH_CHOICES = [1000, 5000, 10000] as const;
export const DEFAULT_HORIZON = 90;
export const DEFAULT_PATHS = 5000;
/** The Outlook's seed: the same statements and settings always give the same figures. */
export const OUTLOOK_SEED = 1;
/** Pause after the last keystroke before an uncommitted change re-forecasts. */
export const DEBOUNCE_MS = 400;
/** A run shorter than this shows no progress bar (no flicker on quick re-forecasts). */
const PROGRESS_DELAY_MS = 150;

type AnalysisMethod = 'forecast' | 'residualInputs' | 'fitResidualSeries';

/** What the state needs from an engine client (injectable for tests and benches). */
export interface AnalysisCaller {
  call<M extends AnalysisMethod>(method: M, params: ParamsOf<M>, options?: CallOptions): Promise<ResultOf<M>>;
}

export type OutlookStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'error';

/** True for the error postMessage throws for a value it cannot clone (e.g. a Svelte proxy). */
export function isDataCloneError(e: unknown): boolean {
  return typeof e === 'object' && e !== null && (e as { name?: unknown }).name === 'DataCloneError';
}

/** Clamps a typed horizon to a whole number of days in MIN_HORIZON..MAX_HORIZON. */
export function clampHorizon(days: number): number {
  if (!Number.isFinite(days)) return DEFAULT_HORIZON;
  return Math.min(MAX_HORIZON, Math.max(MIN_HORIZON, Math.round(days)));
}

let sharedEngines: { primary: EngineClient; helper: EngineClient } | null = null;

/** The Outlook's two engine clients (workers start on first use). */
function outlookEngines(): { primary: EngineClient; helper: EngineClient } {
  sharedEngines ??= { primary: new EngineClient(), helper: new EngineClient() };
  return sharedEngines;
}

let nextHistoryKey = 1;

/** One worker and the key of the history it has been sent. */
interface Lane {
  readonly engine: AnalysisCaller;
  sent: string | null;
}

export class OutlookState {
  readonly #primary: Lane;
  readonly #helper: AnalysisCaller | null;

  #horizon = $state(DEFAULT_HORIZON);
  #paths = $state<number>(DEFAULT_PATHS);
  /** Minor units of the history's currency. */
  #threshold = $state(0);
  #showTable = $state(false);

  #result = $state.raw<ForecastResult | null>(null);
  #status = $state<OutlookStatus>('idle');
  #share = $state(0);
  #label = $state('');
  #showProgress = $state(false);
  #error = $state<string | null>(null);
  #lastDuration = $state<number | null>(null);

  /** The history as handed over (to notice a new one). */
  #source: ForecastHistory | null = null;
  /** The history as posted: the same object, or a plain copy of a reactive proxy. */
  #history: ForecastHistory | null = null;
  #historyKey = '';
  #decisions: RecurringDecision[] = [];
  #version: number | null = null;
  /** Counts new histories: a result is shown only if no new history came while it ran. */
  #generation = 0;
  /** Residual models fitted for the current history and decisions. */
  #models: { readonly key: string; readonly models: ResidualModels } | null = null;
  #timer: ReturnType<typeof setTimeout> | null = null;
  #progressTimer: ReturnType<typeof setTimeout> | null = null;
  #controller: AbortController | null = null;
  #supersede = false;
  #rerun = false;
  /** Settings of the run under way, to skip a rerun with the very same settings. */
  #inflight = '';

  /**
   * @param engine runs the forecasts (default: the Outlook's shared worker).
   * @param helper fits money out while `engine` fits money in on a first forecast; null fits both in `engine`.
   */
  constructor(engine?: AnalysisCaller, helper?: AnalysisCaller | null) {
    const shared = engine ? null : outlookEngines();
    this.#primary = { engine: engine ?? (shared as { primary: EngineClient }).primary, sent: null };
    this.#helper = helper === undefined ? (shared?.helper ?? null) : helper;
  }

  get horizon(): number {
    return this.#horizon;
  }
  get paths(): number {
    return this.#paths;
  }
  /** Threshold in minor units. */
  get threshold(): number {
    return this.#threshold;
  }
  get showTable(): boolean {
    return this.#showTable;
  }
  get result(): ForecastResult | null {
    return this.#result;
  }
  get status(): OutlookStatus {
    return this.#status;
  }
  get running(): boolean {
    return this.#status === 'running';
  }
  /** Progress 0..1 and its label, while running. */
  get share(): number {
    return this.#share;
  }
  get label(): string {
    return this.#label;
  }
  /** True once a run has taken long enough to deserve a progress bar. */
  get showProgress(): boolean {
    return this.#showProgress;
  }
  get error(): string | null {
    return this.#error;
  }
  /** Milliseconds the last finished run took, from request to result. */
  get lastDuration(): number | null {
    return this.#lastDuration;
  }

  /** True when the result shown was computed with the current settings. */
  get current(): boolean {
    const r = this.#result;
    return !!r && r.horizonDays === this.#horizon && r.paths === this.#paths && r.threshold === this.#threshold;
  }

  /**
   * The screen's inputs. A new `version` (or history) forecasts again at once, stopping a
   * run for the old history. The threshold resets when the currency changes.
   */
  setInputs(history: ForecastHistory | null, decisions: readonly RecurringDecision[], version: number): void {
    if (version === this.#version && history === this.#source) return;
    const currencyChanged = (history?.currency ?? null) !== (this.#history?.currency ?? null);
    this.#version = version;
    this.#source = history;
    this.#history = history;
    this.#historyKey = `outlook-${nextHistoryKey++}`;
    this.#generation++;
    this.#models = null;
    this.#decisions = $state.snapshot(decisions) as RecurringDecision[];
    if (currencyChanged && history !== null) this.#threshold = 0;
    if (!history) {
      this.#stop(true);
      this.#result = null;
      this.#status = 'idle';
      return;
    }
    if (this.#controller) {
      this.#supersede = true;
      this.#controller.abort();
    }
    this.#schedule(0);
  }

  setHorizon(days: number, commit: boolean): void {
    const next = clampHorizon(days);
    if (next === this.#horizon && commit) return this.#schedule(0, true);
    this.#horizon = next;
    this.#schedule(commit ? 0 : DEBOUNCE_MS);
  }

  setPaths(paths: number): void {
    if (!(PATH_CHOICES as readonly number[]).includes(paths)) return;
    this.#paths = paths;
    this.#schedule(0);
  }

  /** Sets the threshold in minor units. */
  setThreshold(minor: number, commit: boolean): void {
    if (!Number.isSafeInteger(minor)) return;
    if (minor === this.#threshold && commit) return this.#schedule(0, true);
    this.#threshold = minor;
    this.#schedule(commit ? 0 : DEBOUNCE_MS);
  }

  setShowTable(show: boolean): void {
    this.#showTable = show;
  }

  /** Stops the run under way; the last outlook stays on screen. */
  cancel(): void {
    if (!this.#controller) return;
    this.#rerun = false;
    this.#controller.abort();
  }

  /** Runs again with the current settings (after Cancel or an error). */
  retry(): void {
    this.#schedule(0);
  }

  /** Stops timers and any run (the screen is going away). */
  dispose(): void {
    this.#history = null;
    this.#source = null;
    this.#generation++;
    this.#stop(true);
  }

  #settingsKey(): string {
    return `${this.#horizon}|${this.#paths}|${this.#threshold}`;
  }

  #stop(abort: boolean): void {
    if (this.#timer) clearTimeout(this.#timer);
    this.#timer = null;
    this.#rerun = false;
    if (abort && this.#controller) {
      this.#supersede = true;
      this.#controller.abort();
    }
  }

  /** Runs after `delay` ms; `onlyIfStale` skips a run whose result already matches the settings. */
  #schedule(delay: number, onlyIfStale = false): void {
    if (this.#timer) clearTimeout(this.#timer);
    this.#timer = null;
    if (onlyIfStale && this.current) return;
    if (delay <= 0) void this.#run();
    else this.#timer = setTimeout(() => void this.#run(), delay);
  }

  /**
   * Calls a worker with the current history: posted the first time, named by its key after
   * that; sent again if the worker no longer has it, and as a plain copy if it is a proxy.
   */
  async #call<M extends AnalysisMethod>(
    lane: Lane,
    method: M,
    params: Omit<ParamsOf<M>, 'history' | 'historyKey'>,
    options: CallOptions,
  ): Promise<ResultOf<M>> {
    const key = this.#historyKey;
    const send = (history: ForecastHistory | null) =>
      lane.engine.call(method, { ...params, history, historyKey: key } as ParamsOf<M>, options);
    try {
      let result: ResultOf<M>;
      try {
        result = await send(lane.sent === key ? null : this.#history);
      } catch (e) {
        if (e instanceof EngineCallError && e.code === 'HISTORY_NOT_KEPT') {
          result = await send(this.#history);
        } else if (isDataCloneError(e) && this.#history) {
          // A reactive proxy cannot be posted to a worker: post a plain copy from now on
          // (copied only then, so a plain history of 100,000 entries is never held twice).
          this.#history = $state.snapshot(this.#history) as ForecastHistory;
          result = await send(this.#history);
        } else throw e;
      }
      lane.sent = key;
      return result;
    } catch (e) {
      lane.sent = null; // the worker may have been replaced (Cancel, a crash)
      throw e;
    }
  }

  /**
   * Fits both directions' residual models at once: the first worker finds the recurring
   * flows and returns what they leave (two daily series), then each worker runs one
   * direction's backtest. Only the first worker ever receives the history.
   */
  async #fitModels(helper: AnalysisCaller, signal: AbortSignal): Promise<ResidualModels> {
    this.#label = 'Finding recurring flows';
    this.#share = 0.03;
    const inputs = await this.#call(this.#primary, 'residualInputs', { decisions: this.#decisions }, { signal });
    this.#label = 'Comparing models for money in and money out';
    this.#share = 0.1;
    let done = 0;
    const finished = <T>(value: T): T => {
      done++;
      this.#share = 0.1 + 0.3 * done;
      return value;
    };
    const fit = (engine: AnalysisCaller, direction: 'inflow' | 'outflow') =>
      engine
        .call(
          'fitResidualSeries',
          { series: inputs[direction], start: inputs.start, direction, forecastStart: inputs.forecastStart },
          { signal },
        )
        .then(finished);
    const [inflow, outflow] = await Promise.all([fit(this.#primary.engine, 'inflow'), fit(helper, 'outflow')]);
    return {
      fitHorizon: Math.min(inflow.fitHorizon, outflow.fitHorizon),
      inflow: inflow.model,
      outflow: outflow.model,
    };
  }

  async #run(): Promise<void> {
    this.#timer = null;
    const history = this.#history;
    if (!history) return;
    const key = this.#settingsKey();
    if (this.#controller) {
      if (key !== this.#inflight || this.#supersede) this.#rerun = true; // the newest settings run when this one ends
      return;
    }
    this.#inflight = key;
    const controller = new AbortController();
    this.#controller = controller;
    this.#supersede = false;
    this.#status = 'running';
    this.#error = null;
    this.#share = 0;
    this.#label = 'Starting';
    this.#progressTimer = setTimeout(() => (this.#showProgress = true), PROGRESS_DELAY_MS);
    const started = performance.now();
    performance.mark('ebbline:forecast-request');
    const generation = this.#generation;
    const decisions = this.#decisions;
    const config = {
      horizon: this.#horizon,
      paths: this.#paths,
      seed: OUTLOOK_SEED,
      threshold: this.#threshold,
      decisions,
    };
    // Any change of a decision may change which entries the recurring flows explain.
    const modelsKey = `${this.#historyKey}|${JSON.stringify(decisions)}`;
    try {
      let models = this.#models?.key === modelsKey ? this.#models.models : undefined;
      if (!models && this.#helper) {
        models = await this.#fitModels(this.#helper, controller.signal);
        if (generation === this.#generation) this.#models = { key: modelsKey, models };
      }
      const fitted = !!models;
      const result = await this.#call(
        this.#primary,
        'forecast',
        { config, ...(models ? { models } : {}) },
        {
          signal: controller.signal,
          onProgress: (share, label) => {
            this.#share = fitted ? 0.7 + 0.3 * share : share;
            this.#label = label;
          },
        },
      );
      if (generation === this.#generation) {
        this.#result = result;
        this.#status = 'done';
        this.#lastDuration = performance.now() - started;
        performance.mark('ebbline:forecast-result');
      }
    } catch (e) {
      if (e instanceof CancelledError) {
        if (!this.#supersede) this.#status = 'cancelled';
        // Cancelling replaced both workers: the models they kept are gone with them.
        this.#primary.sent = null;
      } else {
        this.#status = 'error';
        this.#error = e instanceof Error ? e.message : String(e);
        this.#rerun = false;
      }
    } finally {
      if (this.#progressTimer) clearTimeout(this.#progressTimer);
      this.#progressTimer = null;
      this.#showProgress = false;
      this.#controller = null;
      const again = this.#rerun || this.#supersede;
      this.#rerun = false;
      this.#supersede = false;
      if (again && this.#history) void this.#run();
    }
  }
}
