/**
 * The Scenarios screen's state.
 *
 * - `ScenariosState`: the workspace's scenarios (the `scenarios` table, each an
 *   `ebbline.plan/1` document), the one being edited as a draft of typed text, its live
 *   validation by `validatePlan`, autosave, and delete with Undo. What is typed is saved as
 *   typed, also while it has problems (the document then holds the text where a number
 *   belongs, and the problem is shown at its field); only valid scenarios are forecast.
 * - `ScenarioInputs`: what the forecast of a scope starts from (history, decisions) and the
 *   recurring flows it projects, loaded through the workspace for the chosen scope.
 * - `ComparisonState`: the choice of up to four scenarios and a reference, the settings,
 *   and the run through the worker (components/scenarios/comparisonRun.ts).
 *
 * The rules live in plain modules (components/scenarios/planDraft.ts, scenarioStore.ts,
 * comparisonRun.ts), tested under test/renderer; these classes add reactivity and timing.
 */
import type { ForecastHistory } from '@engine/forecast/history';
import {
  projectRecurring,
  type ProjectedRecurring,
  type RecurringDecision,
} from '@engine/forecast/recurringComponents';
import type { SeriesScope } from '@engine/ledger/dailySeries';
import type { RecurringChange } from '@engine/plan/plan';
import type { DetectedRecurringFlow } from '@engine/recurring/detectRecurringFlows';
import { BASE_FORECAST_NAME, MAX_SCENARIOS } from '@engine/scenario/compareScenarios';
import { DEMO_CUSHION, demoScenarioSet } from '@engine/scenario/demoScenarios';
import {
  draftFromDocument,
  emptyChange,
  emptyItem,
  validateDraft,
  type ChangeDraft,
  type DraftValidation,
  type ItemDraft,
  type PlanDraft,
} from '../../components/scenarios/planDraft';
import { nameFromFileName, planFileName, planFileText, readPlanFile } from '../../components/scenarios/planFile';
import { ScenarioStore } from '../../components/scenarios/scenarioStore';
import { runComparison, type ComparisonOutcome, type NamedPlan } from '../../components/scenarios/comparisonRun';
import type { AccountRecord, ScenarioRecord } from '../db/records';
import type { WorkspaceDb } from '../db/WorkspaceDb';
import type { PickedFile } from '../host/hostBridge';
import { CancelledError, EngineClient } from '../worker/engineClient';
import type { WorkspaceState } from './workspace.svelte';

/** Pause after the last keystroke before a draft is saved. */
export const SAVE_DELAY_MS = 500;

/** The workspace setting holding the comparison's choices. */
export const COMPARISON_SETTING = 'scenarios.comparison';

export type SaveStatus = 'saved' | 'pending' | 'saving' | 'error';

// ---- scopes ------------------------------------------------------------------------------

/** A forecast scope the screen offers: every account of a currency, or one account. */
export interface ScopeChoice {
  readonly key: string;
  readonly label: string;
  readonly currency: string;
  readonly scope: SeriesScope;
}

/** All accounts of each currency combined (the CLI's default), then each account alone. */
export function scopeChoices(accounts: readonly AccountRecord[]): ScopeChoice[] {
  const currencies = [...new Set(accounts.map((a) => a.currency))];
  const choices: ScopeChoice[] = currencies.map((currency) => ({
    key: `currency:${currency}`,
    label: `All ${currency} accounts`,
    currency,
    scope: { currency },
  }));
  if (accounts.length > 1) {
    for (const a of accounts) {
      choices.push({
        key: `account:${a.id}`,
        label: `${a.name} (${a.currency})`,
        currency: a.currency,
        scope: { accountIds: [a.id] },
      });
    }
  }
  return choices;
}

// ---- one engine worker for the Scenarios and Report screens ----------------------------

let engine: EngineClient | undefined;
/** The worker the comparison and report forecasts run in (its fitted models are kept between runs). */
export function scenarioEngine(): EngineClient {
  engine ??= new EngineClient();
  return engine;
}

// ---- scenarios -------------------------------------------------------------------------

export interface ScenarioSummary {
  readonly record: ScenarioRecord;
  readonly validation: DraftValidation;
  readonly items: number;
  readonly changes: number;
}

export class ScenariosState {
  #db: WorkspaceDb | null = null;
  #store: ScenarioStore | null = null;
  #currency = $state('EUR');
  #records = $state.raw<ScenarioRecord[]>([]);
  #loaded = $state(false);
  #selectedId = $state<string | null>(null);
  #draft = $state.raw<PlanDraft | null>(null);
  #saveStatus = $state<SaveStatus>('saved');
  #error = $state<string | null>(null);
  #notice = $state<string | null>(null);
  #deleted = $state.raw<ScenarioRecord | null>(null);
  #timer: ReturnType<typeof setTimeout> | null = null;
  #saving: Promise<void> = Promise.resolve();

  #validation = $derived(this.#draft ? validateDraft(this.#draft, this.#currency) : null);
  #summaries = $derived(
    this.#records.map((record): ScenarioSummary => {
      const draft =
        record.id === this.#selectedId && this.#draft
          ? this.#draft
          : draftFromDocument(record.plan, this.#currency, record.name);
      const validation =
        record.id === this.#selectedId && this.#validation ? this.#validation : validateDraft(draft, this.#currency);
      return { record, validation, items: draft.items.length, changes: draft.recurring.length };
    }),
  );

  /** Opens the scenarios of `db` (null: none open). Saves pending edits of the previous one first. */
  async setDb(db: WorkspaceDb | null): Promise<void> {
    if (db === this.#db) return;
    await this.flush();
    this.#db = db;
    this.#store = db ? new ScenarioStore(db) : null;
    this.#records = [];
    this.#selectedId = null;
    this.#draft = null;
    this.#deleted = null;
    this.#error = null;
    this.#notice = null;
    this.#loaded = false;
    if (!db) return;
    await this.reload();
    if (db !== this.#db) return;
    this.#loaded = true;
    const first = this.#records[0];
    if (first) this.#open(first);
  }

  /** The currency amounts are typed and validated in (the scope's). Drafts are re-read in it. */
  setCurrency(currency: string): void {
    if (currency === this.#currency) return;
    this.#currency = currency;
    const selected = this.selected;
    if (selected && this.#saveStatus === 'saved')
      this.#draft = draftFromDocument(selected.plan, currency, selected.name);
  }

  get currency(): string {
    return this.#currency;
  }
  get loaded(): boolean {
    return this.#loaded;
  }
  get store(): ScenarioStore | null {
    return this.#store;
  }
  get records(): readonly ScenarioRecord[] {
    return this.#records;
  }
  /** Each scenario with its validation (the live draft for the one being edited). */
  get summaries(): readonly ScenarioSummary[] {
    return this.#summaries;
  }
  get selectedId(): string | null {
    return this.#selectedId;
  }
  get selected(): ScenarioRecord | null {
    return this.#records.find((r) => r.id === this.#selectedId) ?? null;
  }
  get draft(): PlanDraft | null {
    return this.#draft;
  }
  get validation(): DraftValidation | null {
    return this.#validation;
  }
  get saveStatus(): SaveStatus {
    return this.#saveStatus;
  }
  /** The last failure, in words (a name refused, storage full, a file refused). */
  get error(): string | null {
    return this.#error;
  }
  /** The last success worth saying (a file imported, examples added). */
  get notice(): string | null {
    return this.#notice;
  }
  /** The scenario deleted last, which Undo brings back. */
  get deleted(): ScenarioRecord | null {
    return this.#deleted;
  }

  clearMessages(): void {
    this.#error = null;
    this.#notice = null;
  }

  async reload(): Promise<void> {
    if (!this.#store) return;
    this.#records = await this.#store.list();
  }

  #requireStore(): ScenarioStore {
    if (!this.#store) throw new Error('No workspace is open.');
    return this.#store;
  }

  #open(record: ScenarioRecord): void {
    this.#selectedId = record.id;
    this.#draft = draftFromDocument(record.plan, this.#currency, record.name);
    this.#saveStatus = 'saved';
  }

  #replace(record: ScenarioRecord): void {
    const others = this.#records.filter((r) => r.id !== record.id);
    this.#records = [...others, record].sort((a, b) =>
      a.name.localeCompare(b.name, undefined, { sensitivity: 'base', numeric: true }),
    );
  }

  async #attempt<T>(what: string, action: () => Promise<T>): Promise<T | undefined> {
    this.#error = null;
    this.#notice = null;
    try {
      return await action();
    } catch (error) {
      this.#error = `${what}: ${(error as Error).message}`;
      return undefined;
    }
  }

  /** Opens scenario `id` in the editor (saving the current draft first). */
  async select(id: string): Promise<void> {
    if (id === this.#selectedId) return;
    await this.flush();
    const record = this.#records.find((r) => r.id === id);
    if (record) this.#open(record);
  }

  /** Creates an empty scenario (a free name based on `name`) and opens it. */
  async create(name = 'New scenario'): Promise<ScenarioRecord | undefined> {
    await this.flush();
    return this.#attempt('Not created', async () => {
      const record = await this.#requireStore().create(name, undefined, { uniqueName: true });
      this.#replace(record);
      this.#open(record);
      return record;
    });
  }

  /** @returns the error message, or null when renamed (the name shown is unchanged then). */
  async rename(id: string, name: string): Promise<string | null> {
    await this.flush();
    try {
      const record = await this.#requireStore().rename(id, name);
      this.#replace(record);
      if (id === this.#selectedId && this.#draft) this.#draft = { ...this.#draft, name: record.name };
      return null;
    } catch (error) {
      return (error as Error).message;
    }
  }

  async duplicate(id: string): Promise<void> {
    await this.flush();
    await this.#attempt('Not copied', async () => {
      const record = await this.#requireStore().duplicate(id);
      this.#replace(record);
      this.#open(record);
    });
  }

  /** Deletes scenario `id` (the screen has asked first); Undo can bring it back. */
  async remove(id: string): Promise<void> {
    await this.flush();
    await this.#attempt('Not deleted', async () => {
      const gone = await this.#requireStore().remove(id);
      this.#records = this.#records.filter((r) => r.id !== id);
      this.#deleted = gone ?? null;
      if (this.#selectedId === id) {
        this.#selectedId = null;
        this.#draft = null;
        const next = this.#records[0];
        if (next) this.#open(next);
      }
    });
  }

  /** Brings the last deleted scenario back, exactly as it was, and opens it. */
  async undoRemove(): Promise<void> {
    const record = this.#deleted;
    if (!record) return;
    await this.flush();
    await this.#attempt('Not restored', async () => {
      const back = await this.#requireStore().restore(record);
      this.#deleted = null;
      this.#replace(back);
      this.#open(back);
    });
  }

  // ---- editing the draft -----------------------------------------------------------------

  #edit(change: (draft: PlanDraft) => PlanDraft): void {
    if (!this.#draft) return;
    this.#draft = change(this.#draft);
    this.#saveStatus = 'pending';
    if (this.#timer) clearTimeout(this.#timer);
    this.#timer = setTimeout(() => void this.flush(), SAVE_DELAY_MS);
  }

  updateItem(index: number, patch: Partial<Omit<ItemDraft, 'key'>>): void {
    this.#edit((d) => ({ ...d, items: d.items.map((item, i) => (i === index ? { ...item, ...patch } : item)) }));
  }

  /** Adds an item dated `date` (default empty). */
  addItem(date = ''): void {
    this.#edit((d) => ({ ...d, items: [...d.items, emptyItem(date)] }));
  }

  removeItem(index: number): void {
    this.#edit((d) => ({ ...d, items: d.items.filter((_, i) => i !== index) }));
  }

  updateChange(index: number, patch: Partial<Omit<ChangeDraft, 'key'>>): void {
    this.#edit((d) => ({ ...d, recurring: d.recurring.map((c, i) => (i === index ? { ...c, ...patch } : c)) }));
  }

  addChange(match = '', from = ''): void {
    this.#edit((d) => ({ ...d, recurring: [...d.recurring, emptyChange(match, from)] }));
  }

  removeChange(index: number): void {
    this.#edit((d) => ({ ...d, recurring: d.recurring.filter((_, i) => i !== index) }));
  }

  setStartBalanceChange(text: string): void {
    this.#edit((d) => ({ ...d, startBalanceChange: text }));
  }

  /** Saves the draft now if it has unsaved edits. */
  async flush(): Promise<void> {
    if (this.#timer) clearTimeout(this.#timer);
    this.#timer = null;
    await this.#saving;
    if (this.#saveStatus !== 'pending' && this.#saveStatus !== 'error') return;
    const id = this.#selectedId;
    const validation = this.#validation;
    const store = this.#store;
    if (!id || !validation || !store) return;
    this.#saveStatus = 'saving';
    this.#saving = store
      .savePlan(id, $state.snapshot(validation.document))
      .then((record) => {
        this.#replace(record);
        // Edits made while saving keep the draft pending.
        if (this.#saveStatus === 'saving') this.#saveStatus = 'saved';
      })
      .catch((error: Error) => {
        this.#saveStatus = 'error';
        this.#error = `Not saved: ${error.message}`;
      });
    await this.#saving;
  }

  // ---- files and examples ------------------------------------------------------------------

  /** Creates a scenario from a plan file and opens it; the file's problems are shown in the editor. */
  async importFile(file: PickedFile): Promise<void> {
    await this.flush();
    const reading = readPlanFile(file.bytes, file.name);
    if (!reading.ok) {
      this.#error = `Not imported: ${reading.message}`;
      this.#notice = null;
      return;
    }
    const record = await this.#attempt('Not imported', () =>
      this.#requireStore().create(reading.name ?? nameFromFileName(file.name), reading.document, { uniqueName: true }),
    );
    if (!record) return;
    this.#replace(record);
    this.#open(record);
    const problems = this.#validation?.problems.length ?? 0;
    this.#notice =
      problems === 0
        ? `Imported “${record.name}” from ${file.name}.`
        : `Imported “${record.name}” from ${file.name}; it has ${problems} problem${problems === 1 ? '' : 's'} to fix before it can be forecast.`;
  }

  /**
   * The plan file of scenario `id` (the current draft for the one being edited).
   * @returns null and an error when it has problems: a file the CLI would refuse is not written.
   */
  exportFile(id: string): { name: string; text: string } | null {
    const summary = this.#summaries.find((s) => s.record.id === id);
    if (!summary) return null;
    if (summary.validation.problems.length > 0) {
      this.#error = `Not exported: “${summary.record.name}” has ${summary.validation.problems.length} problem(s) to fix first.`;
      return null;
    }
    return { name: planFileName(summary.record.name), text: planFileText(summary.validation.document) };
  }

  /**
   * Adds the demo's ready-made scenarios (engine/scenario/demoScenarios.ts) for a history
   * ending on `asOf`: the commission on usual terms (the reference), the late commission,
   * the kiln on credit and both together.
   * @returns the ids: the reference first, then the scenarios.
   */
  async addExamples(asOf: string): Promise<{ referenceId: string; scenarioIds: string[] } | undefined> {
    await this.flush();
    return this.#attempt('Not added', async () => {
      const set = demoScenarioSet(asOf);
      const store = this.#requireStore();
      const base = await store.create(set.base.name, set.base, { uniqueName: true });
      const ids: string[] = [];
      for (const s of set.scenarios) ids.push((await store.create(s.name, s.plan, { uniqueName: true })).id);
      await this.reload();
      const open = this.#records.find((r) => r.id === ids[0]);
      if (open) this.#open(open);
      this.#notice = `Added ${set.scenarios.length + 1} example scenarios. ${set.story}`;
      return { referenceId: base.id, scenarioIds: ids };
    });
  }

  /** Stops the save timer after saving (the screen is going away). */
  async dispose(): Promise<void> {
    await this.flush();
  }
}

// ---- what a scope's forecast starts from -------------------------------------------------

export type InputsStatus = 'idle' | 'loading' | 'ready' | 'error';

export class ScenarioInputs {
  #history = $state.raw<ForecastHistory | null>(null);
  #decisions = $state.raw<RecurringDecision[]>([]);
  #flows = $state.raw<DetectedRecurringFlow[]>([]);
  #status = $state<InputsStatus>('idle');
  #error = $state<string | null>(null);
  #key = '';
  #controller: AbortController | null = null;
  #projected = $derived(
    this.#history ? projectRecurring(this.#flows, this.#decisions, [], this.#history.asOf, 90).projected : [],
  );

  get history(): ForecastHistory | null {
    return this.#history;
  }
  get decisions(): readonly RecurringDecision[] {
    return this.#decisions;
  }
  get status(): InputsStatus {
    return this.#status;
  }
  get error(): string | null {
    return this.#error;
  }
  /** The recurring flows the forecast projects (the user's decisions applied, no plan changes). */
  get projected(): readonly ProjectedRecurring[] {
    return this.#projected;
  }

  /**
   * Which projected flows each change matches, by the forecast's own rule
   * (engine/forecast/recurringComponents.ts); an empty list is flagged next to the change.
   */
  matchesOf(changes: readonly Pick<RecurringChange, 'match'>[]): ProjectedRecurring[][] {
    return changes.map((c) => this.#projected.filter((p) => flowMatches(c.match.trim(), p)));
  }

  /** Loads the history and recurring flows of `scope` for workspace data `version`. */
  load(workspace: WorkspaceState, scope: SeriesScope | null, version: number): void {
    const key = `${workspace.currentId}|${version}|${JSON.stringify(scope)}`;
    if (key === this.#key) return;
    this.#key = key;
    this.#controller?.abort();
    this.#controller = null;
    if (!scope) {
      this.#history = null;
      this.#flows = [];
      this.#status = 'idle';
      return;
    }
    const controller = new AbortController();
    this.#controller = controller;
    this.#status = 'loading';
    this.#error = null;
    Promise.all([
      workspace.historyInput(scope, { signal: controller.signal }),
      workspace.recurringFlows(scope, { signal: controller.signal }),
    ])
      .then(([input, flows]) => {
        if (controller.signal.aborted) return;
        this.#history = $state.snapshot(input.history) as ForecastHistory;
        this.#decisions = $state.snapshot(input.decisions) as RecurringDecision[];
        this.#flows = flows.flows as DetectedRecurringFlow[];
        this.#status = 'ready';
      })
      .catch((error: Error) => {
        if (controller.signal.aborted || error instanceof CancelledError) return;
        this.#history = null;
        this.#flows = [];
        this.#status = 'error';
        this.#error = error.message;
      });
  }

  dispose(): void {
    this.#controller?.abort();
    this.#key = '';
  }
}

/** The forecast's matching rule, for one change and one projected flow. */
function flowMatches(match: string, p: ProjectedRecurring): boolean {
  if (match === '') return false;
  const m = match.toLowerCase();
  return p.label.toLowerCase().includes(m) || p.flow.matchLabel.includes(m) || p.flow.key.toLowerCase() === m;
}

// ---- the comparison ------------------------------------------------------------------------

export type ComparisonStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'error';

/** The comparison's choices as stored in the workspace's settings. */
export interface ComparisonChoices {
  readonly scopeKey: string | null;
  /** Scenario ids compared, at most MAX_SCENARIOS. */
  readonly selected: readonly string[];
  /** The scenario compared against, or null for the base forecast. */
  readonly referenceId: string | null;
  readonly horizon: number;
  readonly paths: number;
  /** Minor units of `thresholdCurrency`. */
  readonly threshold: number;
  readonly thresholdCurrency: string | null;
}

export const DEFAULT_CHOICES: ComparisonChoices = {
  scopeKey: null,
  selected: [],
  referenceId: null,
  horizon: 91,
  paths: 5000,
  threshold: 0,
  thresholdCurrency: null,
};

export const HORIZON_CHOICES = [30, 61, 91, 182, 365] as const;
export const PATH_CHOICES = [1000, 5000, 10000] as const;

/** The name of the base forecast column (the CLI's report uses the same). */
export const BASE_NAME = BASE_FORECAST_NAME;

export class ComparisonState {
  #choices = $state.raw<ComparisonChoices>(DEFAULT_CHOICES);
  #outcome = $state.raw<ComparisonOutcome | null>(null);
  /** Inputs of the outcome shown, to say when it is out of date. */
  #outcomeKey = $state('');
  #status = $state<ComparisonStatus>('idle');
  #share = $state(0);
  #label = $state('');
  #error = $state<string | null>(null);
  #highlight = $state(0);
  #controller: AbortController | null = null;
  #store: ScenarioStore | null = null;

  get choices(): ComparisonChoices {
    return this.#choices;
  }
  get outcome(): ComparisonOutcome | null {
    return this.#outcome;
  }
  get outcomeKey(): string {
    return this.#outcomeKey;
  }
  get status(): ComparisonStatus {
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
  /** Column whose bands the overlaid chart shows (0 = the reference). */
  get highlight(): number {
    return this.#highlight;
  }
  setHighlight(column: number): void {
    this.#highlight = column;
  }

  /** Reads the stored choices of a workspace (null: none open). */
  async load(store: ScenarioStore | null): Promise<void> {
    this.cancel();
    this.#store = store;
    this.#outcome = null;
    this.#outcomeKey = '';
    this.#status = 'idle';
    this.#choices = store
      ? { ...DEFAULT_CHOICES, ...(await store.setting(COMPARISON_SETTING, DEFAULT_CHOICES)) }
      : DEFAULT_CHOICES;
  }

  #set(patch: Partial<ComparisonChoices>): void {
    this.#choices = { ...this.#choices, ...patch };
    void this.#store?.saveSetting(COMPARISON_SETTING, this.#choices).catch(() => {
      // The choices are a convenience; a failed write keeps them for this session.
    });
  }

  setScope(key: string): void {
    this.#set({ scopeKey: key });
  }
  setHorizon(days: number): void {
    this.#set({ horizon: days });
  }
  setPaths(paths: number): void {
    this.#set({ paths });
  }
  setThreshold(minor: number, currency: string): void {
    this.#set({ threshold: minor, thresholdCurrency: currency });
  }
  setReference(id: string | null): void {
    this.#set({ referenceId: id, selected: this.#choices.selected.filter((s) => s !== id) });
  }
  /** Adds or removes a scenario; refuses a fifth. @returns false when refused. */
  toggle(id: string, on: boolean): boolean {
    const selected = this.#choices.selected.filter((s) => s !== id);
    if (on) {
      if (selected.length >= MAX_SCENARIOS) return false;
      selected.push(id);
    }
    this.#set({ selected });
    return true;
  }
  /** Forgets scenarios that no longer exist. */
  prune(existing: readonly string[]): void {
    const keep = new Set(existing);
    const selected = this.#choices.selected.filter((s) => keep.has(s));
    const referenceId =
      this.#choices.referenceId && keep.has(this.#choices.referenceId) ? this.#choices.referenceId : null;
    if (selected.length !== this.#choices.selected.length || referenceId !== this.#choices.referenceId) {
      this.#set({ selected, referenceId });
    }
  }

  /** The threshold in minor units of `currency` (0 when it was set for another currency). */
  thresholdFor(currency: string): number {
    return this.#choices.thresholdCurrency === currency ? this.#choices.threshold : 0;
  }

  /** The demo's story: the examples against the commission on usual terms, a cushion of 12,000 EUR. */
  useExamples(ids: { referenceId: string; scenarioIds: readonly string[] }, scopeKey: string | null): void {
    this.#set({
      referenceId: ids.referenceId,
      selected: ids.scenarioIds.slice(0, MAX_SCENARIOS),
      threshold: DEMO_CUSHION * 100,
      thresholdCurrency: 'EUR',
      horizon: 91,
      ...(scopeKey ? { scopeKey } : {}),
    });
  }

  /**
   * Runs the comparison (the newest call wins; one already running is stopped).
   * @param key a text naming every input, to tell later whether the outcome is current.
   */
  async run(
    input: {
      history: ForecastHistory;
      decisions: readonly RecurringDecision[];
      reference: NamedPlan;
      scenarios: readonly NamedPlan[];
      threshold: number;
    },
    key: string,
  ): Promise<void> {
    this.#controller?.abort();
    const controller = new AbortController();
    this.#controller = controller;
    this.#status = 'running';
    this.#error = null;
    this.#share = 0;
    this.#label = 'Starting';
    try {
      const outcome = await runComparison(
        scenarioEngine(),
        {
          history: $state.snapshot(input.history) as ForecastHistory,
          decisions: $state.snapshot(input.decisions) as RecurringDecision[],
          reference: $state.snapshot(input.reference) as NamedPlan,
          scenarios: $state.snapshot(input.scenarios) as NamedPlan[],
          settings: { horizon: this.#choices.horizon, paths: this.#choices.paths, threshold: input.threshold },
        },
        {
          signal: controller.signal,
          onProgress: (share, label) => {
            this.#share = share;
            this.#label = label;
          },
        },
      );
      if (controller !== this.#controller) return;
      this.#outcome = outcome;
      this.#outcomeKey = key;
      this.#highlight = 0;
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
    if (!this.#controller) return;
    this.#controller.abort();
  }

  dispose(): void {
    this.cancel();
  }
}
