/**
 * The open workspace, shared by every screen. One instance lives in App.svelte; screens get
 * it as the `workspace` prop (and through `getWorkspace()` from context).
 *
 * ## For the Outlook / Patterns screens
 *
 * ```svelte
 * <script lang="ts">
 *   import type { WorkspaceState } from '../lib/state/workspace.svelte';
 *   interface Props { workspace: WorkspaceState }
 *   let { workspace }: Props = $props();
 *   let scope = $derived(workspace.defaultScope);            // { currency: 'EUR' } or null
 *   $effect(() => {
 *     void workspace.version;                                 // re-run after every change
 *     if (!scope) return;
 *     const controller = new AbortController();
 *     workspace.historyInput(scope, { signal: controller.signal }).then(({ history, decisions }) => {
 *       // history: ForecastHistory (engine/forecast/history.ts), decisions: RecurringDecision[]
 *       // → engineClient().call('…your forecast method…', { history, config: { decisions, … } })
 *     });
 *     return () => controller.abort();
 *   });
 * </script>
 * ```
 *
 * - `version` (number) increases after every change of the workspace's data (import, file
 *   removed, recurring decision, workspace switched). Read it inside `$derived`/`$effect`
 *   to re-run when the data changes.
 * - `currentId`, `currentName`, `current` (WorkspaceEntry | null), `db` (WorkspaceDb | null).
 * - `accounts` (AccountRecord[], ledger order, with reconciliation), `currencies`
 *   (string[], in account order), `statements` (StatementRecord[], import order).
 * - `defaultScope`: `{ currency }` of the first account's currency, or null when empty.
 * - `scopes`: one `{ currency }` scope per currency (the CLI's default scope).
 * - `historyInput(scope, { signal?, onProgress? })` → `{ history: ForecastHistory,
 *   decisions: RecurringDecision[] }`: the forecast's plain input, built in the worker from
 *   the stored import results by `buildLedger` + `historyFromLedger` (exactly the CLI's
 *   history for the same files). Cached per version and scope. Rejects with the engine's
 *   error (`EngineCallError`, `.code`) when the scope has no entries, or `CancelledError`.
 * - `recurringDecisions`: RecurringDecision[] (engine/forecast/recurringComponents.ts shape).
 * - `ledgerInput()` → the stored files in ledger order (`LedgerInputFile[]`) for any other
 *   engine method that needs the ledger.
 * - `transactionRows()` → every stored transaction (TransactionRow[], by date), cached per version.
 * - `withStoredFiles(call)` → runs a worker method that takes `stored: StoredFiles`
 *   (./worker/methods.ts), sending the stored files only when the worker lacks them.
 *
 * State is private `$state`; read it through the getters, change it through the methods.
 */
import { getContext, setContext } from 'svelte';
import type { ForecastHistory } from '../../../../engine/forecast/history';
import type { RecurringDecision } from '../../../../engine/forecast/recurringComponents';
import type { SeriesScope } from '../../../../engine/ledger/dailySeries';
import type { LedgerInputFile } from '../../../../engine/ledger/buildLedger';
import { applyLedgerChange, storedLedgerInput, storageError, type LedgerChange } from '../db/applyLedgerChange';
import type { AccountRecord, CsvMappingRecord, RecurringDecisionRecord, StatementRecord } from '../db/records';
import { RegistryDb, WorkspaceDb, deleteWorkspaceDb, openWorkspaceDb, type WorkspaceEntry } from '../db/WorkspaceDb';
import { prepareRows, type TransactionRow } from '../transactions/filterTransactions';
import { EngineCallError, engineClient, type EngineClient } from '../worker/engineClient';
import { STORED_FILES_NEEDED, type RecurringFlowsResult, type StoredFiles } from '../worker/methods';

const CURRENT_KEY = 'ebbline.currentWorkspace';

/** Options of calls that run in the worker. */
export interface WorkerCallOptions {
  readonly signal?: AbortSignal;
  readonly onProgress?: (share: number, label: string) => void;
}

/** What the forecast needs, as plain data. */
export interface ForecastInput {
  readonly history: ForecastHistory;
  readonly decisions: readonly RecurringDecision[];
}

/** What deleting a workspace removes, for the confirmation dialog. */
export interface WorkspaceContents {
  readonly files: number;
  readonly transactions: number;
  readonly decisions: number;
  readonly scenarios: number;
}

/** One decision and the one it replaced, for Undo. */
interface DecisionStep {
  readonly key: string;
  readonly label: string;
  readonly before: RecurringDecisionRecord | undefined;
  readonly after: RecurringDecisionRecord | undefined;
}

export interface WorkspaceStateOptions {
  readonly registry?: RegistryDb;
  /** Where the current workspace id is remembered (localStorage by default). */
  readonly storage?: Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;
  readonly engine?: Pick<EngineClient, 'call'>;
  /** Opens a workspace database (tests pass fake-indexeddb backed ones). */
  readonly openDb?: (id: string) => WorkspaceDb;
}

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;
}

function cleanName(name: string): string {
  return name.trim().replace(/\s+/g, ' ');
}

export class WorkspaceState {
  #registry: RegistryDb;
  #storage: WorkspaceStateOptions['storage'];
  #engine: Pick<EngineClient, 'call'> | undefined;
  #openDb: (id: string) => WorkspaceDb;

  #ready = $state(false);
  #loadError = $state<string | null>(null);
  #workspaces = $state.raw<WorkspaceEntry[]>([]);
  #currentId = $state<string | null>(null);
  #db = $state.raw<WorkspaceDb | null>(null);
  #accounts = $state.raw<AccountRecord[]>([]);
  #statements = $state.raw<StatementRecord[]>([]);
  #decisions = $state.raw<RecurringDecisionRecord[]>([]);
  #version = $state(0);
  #undo = $state.raw<DecisionStep[]>([]);
  #historyCache = new Map<string, Promise<ForecastInput>>();
  #rowsCache: { key: string; rows: Promise<TransactionRow[]> } | null = null;

  #currencies = $derived([...new Set(this.#accounts.map((a) => a.currency))]);
  #current = $derived(this.#workspaces.find((w) => w.id === this.#currentId) ?? null);

  constructor(options: WorkspaceStateOptions = {}) {
    this.#registry = options.registry ?? new RegistryDb();
    this.#storage = options.storage ?? (typeof localStorage === 'undefined' ? undefined : localStorage);
    this.#engine = options.engine;
    this.#openDb = options.openDb ?? openWorkspaceDb;
  }

  // ---- reading -------------------------------------------------------------------------

  /** True once the workspace list is loaded. */
  get ready(): boolean {
    return this.#ready;
  }
  /** Why the list could not be loaded (storage unavailable), or null. */
  get loadError(): string | null {
    return this.#loadError;
  }
  get workspaces(): readonly WorkspaceEntry[] {
    return this.#workspaces;
  }
  get currentId(): string | null {
    return this.#currentId;
  }
  get current(): WorkspaceEntry | null {
    return this.#current;
  }
  get currentName(): string | null {
    return this.#current?.name ?? null;
  }
  get db(): WorkspaceDb | null {
    return this.#db;
  }
  /** Accounts in ledger order, each with its reconciliation. */
  get accounts(): readonly AccountRecord[] {
    return this.#accounts;
  }
  /** Stored files in import order (without their parsed content). */
  get statements(): readonly StatementRecord[] {
    return this.#statements;
  }
  get currencies(): readonly string[] {
    return this.#currencies;
  }
  /** One scope per currency: all accounts of that currency combined. */
  get scopes(): readonly SeriesScope[] {
    return this.#currencies.map((currency) => ({ currency }));
  }
  get defaultScope(): SeriesScope | null {
    const c = this.#currencies[0];
    return c === undefined ? null : { currency: c };
  }
  /** Stored decisions, with when they were made. */
  get decisionRecords(): readonly RecurringDecisionRecord[] {
    return this.#decisions;
  }
  /** The decisions in the forecast pipeline's shape `{ key, state, edits? }`. */
  get recurringDecisions(): RecurringDecision[] {
    return this.#decisions.map(({ key, state, edits }) => (edits ? { key, state, edits } : { key, state }));
  }
  /** Bumped after every change of the workspace's data. */
  get version(): number {
    return this.#version;
  }
  /** The last recurring decision that Undo would revert, or null. */
  get lastDecision(): { key: string; label: string; after: RecurringDecisionRecord | undefined } | null {
    const step = this.#undo[this.#undo.length - 1];
    return step ? { key: step.key, label: step.label, after: step.after } : null;
  }

  #engineClient(): Pick<EngineClient, 'call'> {
    this.#engine ??= engineClient();
    return this.#engine;
  }

  #requireDb(): WorkspaceDb {
    if (!this.#db) throw new Error('No workspace is open.');
    return this.#db;
  }

  // ---- the workspace list ----------------------------------------------------------------

  /** Loads the workspace list and reopens the workspace used last. */
  async init(): Promise<void> {
    try {
      const list = await this.#registry.workspaces.orderBy('createdAt').toArray();
      this.#workspaces = list;
      const remembered = this.#storage?.getItem(CURRENT_KEY) ?? null;
      const pick = list.find((w) => w.id === remembered) ?? list[0];
      if (pick) await this.switchTo(pick.id);
    } catch (error) {
      this.#loadError = `Ebbline cannot open its storage in this browser: ${(error as Error).message}`;
    } finally {
      this.#ready = true;
    }
  }

  async #reloadList(): Promise<void> {
    this.#workspaces = await this.#registry.workspaces.orderBy('createdAt').toArray();
  }

  /**
   * Creates a workspace and opens it.
   * @throws Error for an empty name or one already used (compared without case).
   */
  async create(name: string, options: { demo?: boolean } = {}): Promise<WorkspaceEntry> {
    const clean = cleanName(name);
    this.#checkName(clean, null);
    const entry: WorkspaceEntry = {
      id: newId(),
      name: clean,
      createdAt: new Date().toISOString(),
      demo: !!options.demo,
    };
    try {
      await this.#registry.workspaces.add(entry);
    } catch (error) {
      throw storageError(error);
    }
    await this.#reloadList();
    await this.switchTo(entry.id);
    return entry;
  }

  #checkName(name: string, exceptId: string | null): void {
    if (name === '') throw new Error('Give the workspace a name.');
    if (name.length > 120) throw new Error('Keep the name under 120 characters.');
    const clash = this.#workspaces.find((w) => w.id !== exceptId && w.name.toLowerCase() === name.toLowerCase());
    if (clash) throw new Error(`A workspace called “${clash.name}” already exists; choose another name.`);
  }

  /** A name for a new workspace that is not taken: `base`, `base 2`, … */
  freeName(base: string): string {
    const taken = new Set(this.#workspaces.map((w) => w.name.toLowerCase()));
    if (!taken.has(base.toLowerCase())) return base;
    for (let n = 2; ; n++) if (!taken.has(`${base} ${n}`.toLowerCase())) return `${base} ${n}`;
  }

  /** @throws Error for an empty or already used name; the stored name is unchanged then. */
  async rename(id: string, name: string): Promise<void> {
    const clean = cleanName(name);
    this.#checkName(clean, id);
    try {
      const changed = await this.#registry.workspaces.update(id, { name: clean });
      if (changed === 0) throw new Error('That workspace no longer exists.');
    } catch (error) {
      throw storageError(error);
    }
    await this.#reloadList();
  }

  /** Counts what deleting workspace `id` would remove. */
  async contentsOf(id: string): Promise<WorkspaceContents> {
    const db = id === this.#currentId && this.#db ? this.#db : this.#openDb(id);
    try {
      const [files, transactions, decisions, scenarios] = await Promise.all([
        db.statements.count(),
        db.transactions.count(),
        db.recurring.count(),
        db.scenarios.count(),
      ]);
      return { files, transactions, decisions, scenarios };
    } finally {
      if (db !== this.#db) db.close();
    }
  }

  /** Deletes workspace `id` and its whole database; opens another one when it was current. */
  async remove(id: string): Promise<void> {
    if (id === this.#currentId) this.#close();
    await deleteWorkspaceDb(id);
    await this.#registry.workspaces.delete(id);
    await this.#reloadList();
    if (this.#currentId === null) {
      const next = this.#workspaces[0];
      if (next) await this.switchTo(next.id);
      else this.#storage?.removeItem(CURRENT_KEY);
    }
  }

  #close(): void {
    this.#db?.close();
    this.#db = null;
    this.#currentId = null;
    this.#accounts = [];
    this.#statements = [];
    this.#decisions = [];
    this.#undo = [];
    this.#bump();
  }

  /** Opens workspace `id` and remembers it across reloads. */
  async switchTo(id: string): Promise<void> {
    if (id === this.#currentId && this.#db) return;
    if (!this.#workspaces.some((w) => w.id === id)) throw new Error('That workspace no longer exists.');
    this.#close();
    const db = this.#openDb(id);
    await db.open();
    this.#db = db;
    this.#currentId = id;
    this.#storage?.setItem(CURRENT_KEY, id);
    await this.#reloadData();
  }

  // ---- data ------------------------------------------------------------------------------

  async #reloadData(): Promise<void> {
    const db = this.#db;
    if (!db) return;
    const [accounts, statements, decisions] = await Promise.all([
      db.accounts.orderBy('order').toArray(),
      db.statements.orderBy('seq').toArray(),
      db.recurring.toArray(),
    ]);
    if (db !== this.#db) return; // switched meanwhile
    this.#accounts = accounts;
    this.#statements = statements;
    this.#decisions = decisions;
    this.#bump();
  }

  #bump(): void {
    this.#historyCache.clear();
    this.#rowsCache = null;
    this.#version++;
  }

  /**
   * Every stored transaction, sorted by date (then ledger order), with its search text;
   * loaded once per version, so coming back to the Transactions screen costs nothing.
   */
  transactionRows(): Promise<TransactionRow[]> {
    const db = this.#requireDb();
    const key = `${this.#currentId}|${this.#version}`;
    if (this.#rowsCache?.key !== key) {
      const rows = db.transactions.orderBy('bookingDate').toArray().then(prepareRows);
      rows.catch(() => {
        if (this.#rowsCache?.rows === rows) this.#rowsCache = null;
      });
      this.#rowsCache = { key, rows };
    }
    return this.#rowsCache.rows;
  }

  /** The stored files in ledger order, with their parsed content. */
  async ledgerInput(): Promise<{ ids: string[]; records: StatementRecord[]; files: LedgerInputFile[] }> {
    return storedLedgerInput(this.#requireDb());
  }

  /** Remembered CSV mappings by layout fingerprint. */
  async csvMappings(): Promise<Map<string, CsvMappingRecord>> {
    const all = await this.#requireDb().csvMappings.toArray();
    return new Map(all.map((m) => [m.fingerprint, m]));
  }

  /**
   * Runs a worker call that needs the stored files: first by revision only (the worker
   * keeps the last stored files and their ledger), then, if the worker does not have them,
   * again with the files read from the database.
   * @returns the call's value and the stored file ids (in ledger order) it was based on.
   */
  async withStoredFiles<T>(call: (stored: StoredFiles) => Promise<T>): Promise<{ value: T; ids: string[] }> {
    const revisionOf = (ids: readonly string[]) => `${this.#currentId}:${ids.join(',')}`;
    const ids = this.#statements.map((s) => s.id);
    if (ids.length === 0) return { value: await call({ revision: revisionOf(ids), files: [] }), ids };
    try {
      return { value: await call({ revision: revisionOf(ids) }), ids };
    } catch (error) {
      if (!(error instanceof EngineCallError) || error.code !== STORED_FILES_NEEDED) throw error;
    }
    const input = await this.ledgerInput();
    return { value: await call({ revision: revisionOf(input.ids), files: input.files }), ids: input.ids };
  }

  /** Stores a change of files and ledger (one transaction), then reloads. See applyLedgerChange. */
  async applyChange(change: LedgerChange): Promise<void> {
    await applyLedgerChange(this.#requireDb(), change);
    await this.#reloadData();
  }

  /**
   * Removes one stored file and rebuilds the ledger from the others, in one transaction.
   * @throws as applyLedgerChange, and the engine's error when the rest cannot build a ledger.
   */
  async removeStatement(id: string, options: WorkerCallOptions = {}): Promise<void> {
    const input = await this.ledgerInput();
    const index = input.ids.indexOf(id);
    if (index < 0) throw new Error('That file is no longer stored.');
    const files = input.files.filter((_, i) => i !== index);
    const ledger = await this.#engineClient().call('buildLedger', { files }, options);
    await this.applyChange({ basedOn: input.ids, add: [], remove: [id], ledger });
  }

  /**
   * The forecast's input for one scope (see the top of this file).
   * @throws EngineCallError (with the engine's `code`) when the scope has nothing to forecast from.
   */
  historyInput(scope: SeriesScope, options: WorkerCallOptions = {}): Promise<ForecastInput> {
    const key = `${this.#currentId}|${this.#version}|${scope.currency ?? ''}|${(scope.accountIds ?? []).join(',')}`;
    let cached = this.#historyCache.get(key);
    if (!cached) {
      const decisions = this.recurringDecisions;
      cached = this.withStoredFiles((stored) =>
        this.#engineClient().call('forecastHistory', { stored, scope }, options),
      ).then(({ value: history }) => ({ history, decisions }));
      // A failed or cancelled call is not remembered.
      cached.catch(() => this.#historyCache.delete(key));
      this.#historyCache.set(key, cached);
    }
    return cached;
  }

  /** Recurring flows of a scope, found in the worker exactly as the forecast finds them. */
  async recurringFlows(scope: SeriesScope, options: WorkerCallOptions = {}): Promise<RecurringFlowsResult> {
    const { value } = await this.withStoredFiles((stored) =>
      this.#engineClient().call('recurringFlows', { stored, scope }, options),
    );
    return value;
  }

  /**
   * Records (or, with `null`, clears) the decision about flow `key`; Undo can revert it.
   * @throws the storage error; the stored decision is unchanged then.
   */
  async decide(key: string, label: string, decision: RecurringDecision | null): Promise<void> {
    const db = this.#requireDb();
    const before = this.#decisions.find((d) => d.key === key);
    const after: RecurringDecisionRecord | undefined = decision
      ? { ...decision, key, decidedAt: new Date().toISOString() }
      : undefined;
    await this.#writeDecision(db, key, after);
    this.#undo = [...this.#undo.slice(-49), { key, label, before, after }];
    await this.#reloadData();
  }

  /** Reverts the last decision made in this session. */
  async undoDecision(): Promise<void> {
    const step = this.#undo[this.#undo.length - 1];
    if (!step) return;
    await this.#writeDecision(this.#requireDb(), step.key, step.before);
    this.#undo = this.#undo.slice(0, -1);
    await this.#reloadData();
  }

  async #writeDecision(db: WorkspaceDb, key: string, record: RecurringDecisionRecord | undefined): Promise<void> {
    try {
      if (record) await db.recurring.put($state.snapshot(record) as RecurringDecisionRecord);
      else await db.recurring.delete(key);
    } catch (error) {
      throw storageError(error);
    }
  }
}

const CONTEXT = Symbol('workspace');

/** Makes `workspace` available to descendants (App.svelte calls this once). */
export function setWorkspace(workspace: WorkspaceState): WorkspaceState {
  return setContext(CONTEXT, workspace);
}

/** The workspace set by App.svelte. */
export function getWorkspace(): WorkspaceState {
  const workspace = getContext<WorkspaceState | undefined>(CONTEXT);
  if (!workspace) throw new Error('getWorkspace() is used outside the app');
  return workspace;
}
