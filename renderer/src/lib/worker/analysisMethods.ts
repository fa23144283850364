/**
 * The engine methods of the Outlook and Patterns screens, run inside the worker and spread
 * into `engineMethods` (./methods.ts). They take plain data and return plain data; typed
 * arrays cross the boundary as they are (structured clone).
 *
 * `forecast` gives exactly what engine/forecast/runForecast.ts gives for the same history
 * and configuration (test/renderer/outlookForecast.test.ts checks it value for value), but
 * keeps what does not change between the Outlook's calls:
 * - the history itself, under a key the caller chooses (`historyKey`), so the window posts a
 *   large history once rather than with every change of a setting;
 * - the recurring flows found and the residual models chosen by backtest — seconds on three
 *   years of history — per history and set of entries the recurring flows explain. They are fitted once for the
 *   longest horizon the screen offers (MODEL_HORIZON): their seasonal projection is
 *   computed day by day, so its first `h` days do not depend on how far it reaches. The
 *   caller may also fit the two directions in two workers at once (`residualInputs`, then
 *   `fitResidualSeries` in each) and hand both models to `forecast`;
 * - the last simulation: a new threshold alone changes only which paths cross it, so the
 *   paths are not simulated again, only summarised.
 * A new horizon or number of paths then costs only the simulation.
 *
 * Imports are relative, not `@engine/…`, so Vitest (which has no aliases) can load this
 * file; it runs in the worker and in Node alike. Nothing here touches the DOM.
 */
import { CAUTION } from '../../../../engine/core/caution';
import { addDays, fromDayNumber, toDayNumber } from '../../../../engine/core/dates';
import { EngineError } from '../../../../engine/core/errors';
import { decomposeHistory, type HistoryPatterns } from '../../../../engine/forecast/decomposeHistory';
import type { ForecastHistory } from '../../../../engine/forecast/history';
import { plannedComponents } from '../../../../engine/forecast/plannedComponents';
import {
  explainedEntryIds,
  projectRecurring,
  type RecurringDecision,
} from '../../../../engine/forecast/recurringComponents';
import { modelResidualFlow, type ResidualFlowModel } from '../../../../engine/forecast/residualFlows';
import {
  DEFAULT_HORIZON,
  DEFAULT_PATHS,
  DEFAULT_SEED,
  MIN_HISTORY_DAYS,
  residualSeries,
  type DailyOutlook,
  type ForecastConfig,
  type ForecastResult,
} from '../../../../engine/forecast/runForecast';
import { EMPTY_PLAN } from '../../../../engine/plan/plan';
import { detectRecurringFlows, type DetectedRecurringFlow } from '../../../../engine/recurring/detectRecurringFlows';
import {
  MAX_HORIZON,
  MAX_PATHS,
  MIN_PATHS,
  simulateBalances,
  type SimulatedPaths,
} from '../../../../engine/simulate/simulateBalances';
import { summariseBalances } from '../../../../engine/simulate/summariseBalances';
import { QUANTILE_LEVELS, type FlowComponent } from '../../../../engine/simulate/types';

/** What a method receives besides its parameters (structurally ./protocol.ts `MethodContext`). */
export interface AnalysisContext {
  progress(share: number, label: string): void;
}

/** Longest horizon the Outlook offers: residual models are fitted once for it. */
export const MODEL_HORIZON = 365;

/** Histories (and their fitted models) kept for reuse: the current scope and a couple of others. */
const CACHE_SIZE = 3;

/**
 * A 64-bit FNV-1a fingerprint of everything in a history that a forecast reads. Two
 * histories with the same fingerprint forecast the same (up to a 2⁻⁶⁴ collision).
 * Complexity: O(total text length of the entries).
 */
export function historyFingerprint(history: ForecastHistory): string {
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ 0x5bd1e995;
  const add = (text: string) => {
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      h1 = Math.imul(h1 ^ c, 0x01000193);
      h2 = Math.imul(h2 ^ c, 0x5bd1e995);
    }
    h1 = Math.imul(h1 ^ 0x1f, 0x01000193);
    h2 = Math.imul(h2 ^ 0x1f, 0x5bd1e995);
  };
  add(`${history.currency}|${history.start}|${history.asOf}|${history.endBalance}|${history.relative}`);
  for (const e of history.entries) {
    add(e.id);
    add(e.date);
    add(String(e.amount));
    add(e.description);
    add(e.counterparty ?? '');
  }
  return `${(h1 >>> 0).toString(16)}${(h2 >>> 0).toString(16)}:${history.entries.length}`;
}

class LruCache<V> {
  readonly #map = new Map<string, V>();
  constructor(readonly size: number) {}
  get(key: string): V | undefined {
    const value = this.#map.get(key);
    if (value !== undefined) {
      this.#map.delete(key);
      this.#map.set(key, value);
    }
    return value;
  }
  set(key: string, value: V): void {
    this.#map.delete(key);
    this.#map.set(key, value);
    while (this.#map.size > this.size) this.#map.delete(this.#map.keys().next().value as string);
  }
  clear(): void {
    this.#map.clear();
  }
}

/** Residual models of both directions, fitted for horizons up to `fitHorizon`. */
export interface ResidualModels {
  readonly fitHorizon: number;
  readonly inflow: ResidualFlowModel;
  readonly outflow: ResidualFlowModel;
}

/** One direction's residual model and the longest horizon it was fitted for. */
export interface FittedResidualModel {
  readonly fitHorizon: number;
  readonly model: ResidualFlowModel;
}

/** The error thrown when a call names a kept history the worker does not have (it was replaced). */
export class HistoryNotKeptError extends Error {
  readonly code = 'HISTORY_NOT_KEPT';
  constructor(key: string) {
    super(`the engine no longer keeps history "${key}"; send it again`);
    this.name = 'HistoryNotKeptError';
  }
}

/** A history as a call names it: given (and kept under `historyKey` when one is named), or only named. */
export interface HistoryReference {
  readonly history: ForecastHistory | null;
  readonly historyKey?: string;
}

interface KeptHistory {
  readonly history: ForecastHistory;
  readonly fingerprint: string;
}

interface KeptSimulation {
  readonly key: string;
  readonly sim: SimulatedPaths;
  readonly components: readonly FlowComponent[];
}

const histories = new LruCache<KeptHistory>(2);
const detections = new LruCache<readonly DetectedRecurringFlow[]>(CACHE_SIZE);
const models = new LruCache<FittedResidualModel>(4 * CACHE_SIZE);
const patternsCache = new LruCache<HistoryPatterns>(CACHE_SIZE);
let lastSimulation: KeptSimulation | null = null;

/** Forgets every kept history, model and simulation (tests; a replaced worker forgets anyway). */
export function clearAnalysisCache(): void {
  histories.clear();
  detections.clear();
  models.clear();
  patternsCache.clear();
  lastSimulation = null;
}

/**
 * The history a call refers to, with its fingerprint.
 * @throws HistoryNotKeptError when only a key is given and it is not kept.
 */
export function resolveHistory(reference: HistoryReference): KeptHistory {
  if (reference.history) {
    const kept = { history: reference.history, fingerprint: historyFingerprint(reference.history) };
    if (reference.historyKey !== undefined) histories.set(reference.historyKey, kept);
    return kept;
  }
  const kept = reference.historyKey === undefined ? undefined : histories.get(reference.historyKey);
  if (!kept) throw new HistoryNotKeptError(reference.historyKey ?? '(none)');
  return kept;
}

/** The decisions in a stable order, as a cache key. */
function decisionsKey(decisions: readonly RecurringDecision[]): string {
  return JSON.stringify([...decisions].sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0)));
}

/** FNV-1a (32 bits) of a text, in hex. */
function hashText(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return (h >>> 0).toString(16);
}

function detectedFlows(
  kept: KeptHistory,
  onProgress?: (share: number, label: string) => void,
): readonly DetectedRecurringFlow[] {
  let detected = detections.get(kept.fingerprint);
  if (!detected) {
    onProgress?.(0.02, 'Finding recurring flows');
    const { history } = kept;
    detected = detectRecurringFlows(
      history.entries.map((e) => ({
        id: e.id,
        date: e.date,
        amount: e.amount,
        description: e.description,
        counterparty: e.counterparty,
      })),
      { asOf: history.asOf },
    );
    detections.set(kept.fingerprint, detected);
  }
  return detected;
}

/**
 * The key of a residual model: the history and the entries the recurring flows explain
 * (the residual series depends on nothing else), and the direction.
 */
function modelKey(fingerprint: string, explained: ReadonlySet<string>, direction: 'inflow' | 'outflow'): string {
  const ids = [...explained].sort().join('\u0000');
  return `${fingerprint}|${explained.size}:${hashText(ids)}|${direction}`;
}

/** The daily series the residual models are fitted to (runForecast's residual step). */
export interface ResidualInputs {
  /** First day of the series (the history's start). */
  readonly start: string;
  /** First forecast day (the day after the as-of date). */
  readonly forecastStart: string;
  /** Daily magnitudes of the money in and out that no recurring flow explains. */
  readonly inflow: Float64Array;
  readonly outflow: Float64Array;
}

function residualInputsOf(
  kept: KeptHistory,
  decisions: readonly RecurringDecision[],
  onProgress?: (share: number, label: string) => void,
): ResidualInputs & { readonly explained: ReadonlySet<string> } {
  const explained = explainedEntryIds(detectedFlows(kept, onProgress), decisions);
  const residual = residualSeries(kept.history, explained);
  return {
    start: kept.history.start,
    forecastStart: addDays(kept.history.asOf, 1),
    inflow: residual.inflow,
    outflow: residual.outflow,
    explained,
  };
}

/**
 * Fits one direction's residual model (runForecast's step 2) to its daily series, kept for
 * the next call with the same series (a screen that comes back asks again).
 * @param horizon the model serves horizons up to max(horizon, MODEL_HORIZON).
 * @example fitResidualSeries(inputs.outflow, inputs.start, 'outflow', inputs.forecastStart).model.report.method
 */
export function fitResidualSeries(
  series: Float64Array,
  start: string,
  direction: 'inflow' | 'outflow',
  forecastStart: string,
  horizon: number = MODEL_HORIZON,
  onProgress?: (share: number, label: string) => void,
): FittedResidualModel {
  const key = `series|${seriesHash(series)}|${start}|${forecastStart}|${direction}`;
  const known = models.get(key);
  if (known && known.fitHorizon >= horizon) return known;
  const fitHorizon = Math.min(MAX_HORIZON, Math.max(horizon, MODEL_HORIZON));
  onProgress?.(
    direction === 'inflow' ? 0.1 : 0.35,
    direction === 'inflow' ? 'Modelling other inflows' : 'Modelling other outflows',
  );
  const fitted = { fitHorizon, model: modelResidualFlow(series, start, direction, forecastStart, fitHorizon) };
  models.set(key, fitted);
  return fitted;
}

/** FNV-1a over the bytes of a series (its exact values), with its length. */
function seriesHash(series: Float64Array): string {
  const words = new Uint32Array(series.buffer, series.byteOffset, series.length * 2);
  let h = 0x811c9dc5;
  for (let i = 0; i < words.length; i++) h = Math.imul(h ^ (words[i] as number), 0x01000193);
  return `${series.length}:${(h >>> 0).toString(16)}`;
}

/** One direction's residual model of a history, kept for later calls. */
function keptResidualModel(
  kept: KeptHistory,
  decisions: readonly RecurringDecision[],
  direction: 'inflow' | 'outflow',
  horizon: number,
  onProgress?: (share: number, label: string) => void,
): FittedResidualModel {
  const inputs = residualInputsOf(kept, decisions, onProgress);
  const key = modelKey(kept.fingerprint, inputs.explained, direction);
  const known = models.get(key);
  if (known && known.fitHorizon >= horizon) return known;
  const series = direction === 'inflow' ? inputs.inflow : inputs.outflow;
  const fitted = fitResidualSeries(series, inputs.start, direction, inputs.forecastStart, horizon, onProgress);
  models.set(key, fitted);
  return fitted;
}

/**
 * Recurring flows without the ids of the entries each one matched: the window shows flows,
 * not their members, and on a large history the ids run to 100,000 strings that would be
 * copied to the window and parsed there with every forecast.
 */
export function withoutMemberIds<T extends { readonly memberIds: readonly string[] }>(flows: readonly T[]): T[] {
  return flows.map((f) => ({ ...f, memberIds: [] }));
}

/** A forecast result with its recurring flows without member ids (one copy per flow, as before). */
function slimForecast(result: ForecastResult): ForecastResult {
  const detected = withoutMemberIds(result.detected);
  const byKey = new Map(detected.map((f) => [f.key, f]));
  return {
    ...result,
    detected,
    recurring: result.recurring.map((r) => ({ ...r, flow: byKey.get(r.flow.key) ?? { ...r.flow, memberIds: [] } })),
  };
}

/** Keeps models fitted elsewhere (another worker) for a history, as if fitted here. */
function adoptModels(kept: KeptHistory, decisions: readonly RecurringDecision[], given: ResidualModels): void {
  const explained = explainedEntryIds(detectedFlows(kept), decisions);
  models.set(modelKey(kept.fingerprint, explained, 'inflow'), { fitHorizon: given.fitHorizon, model: given.inflow });
  models.set(modelKey(kept.fingerprint, explained, 'outflow'), { fitHorizon: given.fitHorizon, model: given.outflow });
}

/**
 * First day below `threshold` per path, from simulated balances (the rule of
 * simulateBalances: the first end-of-day balance strictly below the threshold).
 * Complexity: O(paths · days until the crossing).
 */
export function crossingsAt(sim: SimulatedPaths, threshold: number): Int32Array {
  const { paths, horizon, balances } = sim;
  const first = new Int32Array(paths).fill(-1);
  for (let p = 0; p < paths; p++) {
    for (let d = 0; d < horizon; d++) {
      if ((balances[d * paths + p] as number) < threshold) {
        first[p] = d;
        break;
      }
    }
  }
  return first;
}

/** The same checks, messages and defaults as runForecast's. */
function checkConfig(config: ForecastConfig): { horizon: number; paths: number; seed: number; threshold: number } {
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

/** A residual model's component cut to `horizon` days (its seasonal offset may reach further). */
function forHorizon(model: ResidualFlowModel, horizon: number): FlowComponent | null {
  const c = model.component;
  if (!c) return null;
  return c.kind === 'residual' && c.offset.length > horizon ? { ...c, offset: c.offset.slice(0, horizon) } : c;
}

/** Where the forecast's inputs come from besides the history and configuration. */
export interface ForecastSources {
  /** The history's fingerprint, when the caller already has it. */
  readonly fingerprint?: string;
  /** Residual models fitted elsewhere for this history and these decisions. */
  readonly models?: ResidualModels;
}

/**
 * The forecast of runForecast, with recurring detection, residual models and the last
 * simulation kept between calls (see the module comment).
 *
 * @throws EngineError as runForecast: INVALID_ARGUMENT for settings outside their bounds,
 *   NOT_ENOUGH_DATA for a history shorter than MIN_HISTORY_DAYS.
 * @example forecastWithKeptModels(history, { horizon: 90, paths: 5000, threshold: 0 }).shortfall.probability
 */
export function forecastWithKeptModels(
  history: ForecastHistory,
  config: ForecastConfig = {},
  onProgress?: (share: number, label: string) => void,
  sources: ForecastSources = {},
): ForecastResult {
  const { horizon, paths, seed, threshold } = checkConfig(config);
  const plan = config.plan ?? EMPTY_PLAN;
  const decisions = config.decisions ?? [];
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
  const kept: KeptHistory = { history, fingerprint: sources.fingerprint ?? historyFingerprint(history) };
  if (sources.models && sources.models.fitHorizon >= horizon) adoptModels(kept, decisions, sources.models);
  const detected = detectedFlows(kept, onProgress);
  const recurring = projectRecurring(detected, decisions, plan.recurring, history.asOf, horizon);
  for (const change of recurring.unmatchedChanges) {
    notes.push(
      `The plan's change "${change.action} ${change.match}" matches no recurring flow that is projected; it was not applied.`,
    );
  }
  const inflow = keptResidualModel(kept, decisions, 'inflow', horizon, onProgress).model;
  const outflow = keptResidualModel(kept, decisions, 'outflow', horizon, onProgress).model;
  const startBalance = history.endBalance + plan.startBalanceChange;
  // Everything the simulation depends on except the threshold, which only decides crossings.
  const simulationKey = JSON.stringify([kept.fingerprint, horizon, paths, seed, plan, decisions]);
  let sim: SimulatedPaths;
  let components: readonly FlowComponent[];
  if (lastSimulation && lastSimulation.key === simulationKey) {
    onProgress?.(0.6, 'Counting the paths below the threshold');
    components = lastSimulation.components;
    sim = { ...lastSimulation.sim, firstCrossing: crossingsAt(lastSimulation.sim, threshold) };
  } else {
    const list: FlowComponent[] = [...recurring.components];
    const inflowComponent = forHorizon(inflow, horizon);
    const outflowComponent = forHorizon(outflow, horizon);
    if (inflowComponent) list.push(inflowComponent);
    if (outflowComponent) list.push(outflowComponent);
    list.push(...plannedComponents(plan.items, history.asOf, horizon));
    components = list;
    const simulating = `Simulating ${paths.toLocaleString('en')} paths`;
    onProgress?.(0.6, simulating);
    lastSimulation = null; // let the old paths go before the new ones are allocated
    sim = simulateBalances({ startBalance, horizon, paths, seed, threshold, components }, (share) =>
      onProgress?.(0.6 + 0.3 * share, simulating),
    );
    lastSimulation = { key: simulationKey, sim, components };
  }
  onProgress?.(0.92, 'Summarising');
  const summary = summariseBalances(sim, threshold, components);
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

/** decomposeHistory, kept for the next call with the same history and decisions. */
export function patternsWithKept(history: ForecastHistory, decisions: readonly RecurringDecision[]): HistoryPatterns {
  const key = `${historyFingerprint(history)}|${decisionsKey(decisions)}`;
  let patterns = patternsCache.get(key);
  if (!patterns) {
    patterns = decomposeHistory(history, decisions);
    patternsCache.set(key, patterns);
  }
  return patterns;
}

export const analysisMethods = {
  /**
   * The Outlook's forecast (engine/forecast/runForecast.ts), models kept between calls.
   * `history` may be null when `historyKey` names a history sent before; `models` may carry
   * residual models fitted by `fitResidualSeries` (in other workers). The recurring flows
   * come without their member ids (see withoutMemberIds).
   * @throws HistoryNotKeptError (code HISTORY_NOT_KEPT) when the named history is not kept.
   */
  async forecast(
    params: HistoryReference & { config: ForecastConfig; models?: ResidualModels },
    context: AnalysisContext,
  ): Promise<ForecastResult> {
    const kept = resolveHistory(params);
    const result = forecastWithKeptModels(
      kept.history,
      params.config,
      (share, label) => context.progress(share, label),
      {
        fingerprint: kept.fingerprint,
        ...(params.models ? { models: params.models } : {}),
      },
    );
    return slimForecast(result);
  },

  /** The daily series the residual models are fitted to, so that another worker can fit one. */
  async residualInputs(
    params: HistoryReference & { decisions: readonly RecurringDecision[] },
    context: AnalysisContext,
  ): Promise<ResidualInputs> {
    const inputs = residualInputsOf(resolveHistory(params), params.decisions, (s, l) => context.progress(s, l));
    return { start: inputs.start, forecastStart: inputs.forecastStart, inflow: inputs.inflow, outflow: inputs.outflow };
  },

  /**
   * One direction's residual model from its daily series. The backtests are the slow part
   * of a first forecast, so money in and money out are fitted in two workers at once.
   */
  async fitResidualSeries(
    params: {
      series: Float64Array;
      start: string;
      direction: 'inflow' | 'outflow';
      forecastStart: string;
      horizon?: number;
    },
    context: AnalysisContext,
  ): Promise<FittedResidualModel> {
    const fitted = fitResidualSeries(
      params.series,
      params.start,
      params.direction,
      params.forecastStart,
      params.horizon ?? MODEL_HORIZON,
      (s, l) => context.progress(s, l),
    );
    context.progress(1, 'Done');
    return fitted;
  },

  /**
   * The Patterns screen's decomposition and diagnostics (engine/forecast/decomposeHistory.ts),
   * its recurring flows without member ids.
   */
  async patterns(
    params: { history: ForecastHistory; decisions: readonly RecurringDecision[] },
    context: AnalysisContext,
  ): Promise<HistoryPatterns> {
    context.progress(0.05, 'Separating trend and seasonal patterns');
    const patterns = patternsWithKept(params.history, params.decisions);
    context.progress(1, 'Done');
    return { ...patterns, recurring: withoutMemberIds(patterns.recurring) };
  },
};
