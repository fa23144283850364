/**
 * The workspace's scenarios in its `scenarios` table: `{ id, name, plan, updatedAt }`, where
 * `plan` is an `ebbline.plan/1` document (major units, what the CLI's `--plan` reads). The
 * record's name and the document's `name` are kept the same.
 *
 * Plain TypeScript over Dexie, so the rules (unique names, copies, delete and undo) are
 * tested with fake-indexeddb; the screen's reactive state (lib/state/scenarios.svelte.ts)
 * wraps it.
 */
import type { ScenarioRecord } from '../../lib/db/records';
import type { WorkspaceDb } from '../../lib/db/WorkspaceDb';
import { PLAN_SCHEMA } from '../../../../engine/plan/plan';

/** Longest scenario name. */
export const MAX_SCENARIO_NAME = 120;

/** The tables the store needs (a WorkspaceDb, or a stand-in in tests). */
export type ScenarioTables = Pick<WorkspaceDb, 'scenarios' | 'settings'>;

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;
}

/** Collapses white space; the form every name is stored in. */
export function cleanScenarioName(name: string): string {
  return name.trim().replace(/\s+/g, ' ');
}

/**
 * A name not yet taken (compared without case): `base`, `base 2`, `base 3`, …
 * @example freeScenarioName('Hire', ['hire']) // 'Hire 2'
 */
export function freeScenarioName(base: string, taken: readonly string[]): string {
  const used = new Set(taken.map((t) => t.toLowerCase()));
  const clean = cleanScenarioName(base) || 'Scenario';
  if (!used.has(clean.toLowerCase())) return clean;
  for (let n = 2; ; n++) if (!used.has(`${clean} ${n}`.toLowerCase())) return `${clean} ${n}`;
}

/** An empty plan document named `name`. */
export function emptyPlanDocument(name: string): Record<string, unknown> {
  return { schema: PLAN_SCHEMA, name, items: [], recurring: [], startBalanceChange: 0 };
}

function withName(plan: unknown, name: string): unknown {
  return typeof plan === 'object' && plan !== null && !Array.isArray(plan) ? { ...plan, name } : plan;
}

/** A deep plain copy (no reactive proxies, nothing shared with the caller). */
function plain<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

function byName(a: ScenarioRecord, b: ScenarioRecord): number {
  return a.name.localeCompare(b.name, undefined, { sensitivity: 'base', numeric: true }) || a.id.localeCompare(b.id);
}

export class ScenarioStore {
  readonly #db: ScenarioTables;
  readonly #now: () => string;

  /** @param now the clock for `updatedAt` (tests pin it). */
  constructor(db: ScenarioTables, now: () => string = () => new Date().toISOString()) {
    this.#db = db;
    this.#now = now;
  }

  /** Every scenario, by name. */
  async list(): Promise<ScenarioRecord[]> {
    const all = await this.#db.scenarios.toArray();
    return all.sort(byName);
  }

  async get(id: string): Promise<ScenarioRecord | undefined> {
    return this.#db.scenarios.get(id);
  }

  /**
   * Checks a name for scenario `exceptId` (null for a new one).
   * @returns the cleaned name.
   * @throws Error with a message for the person: empty, too long, or taken.
   */
  async checkName(name: string, exceptId: string | null): Promise<string> {
    const clean = cleanScenarioName(name);
    if (clean === '') throw new Error('Give the scenario a name.');
    if (clean.length > MAX_SCENARIO_NAME) throw new Error(`Keep the name under ${MAX_SCENARIO_NAME} characters.`);
    const all = await this.#db.scenarios.toArray();
    const clash = all.find((s) => s.id !== exceptId && s.name.toLowerCase() === clean.toLowerCase());
    if (clash) throw new Error(`A scenario called “${clash.name}” already exists; choose another name.`);
    return clean;
  }

  /** A free name based on `base`. */
  async freeName(base: string): Promise<string> {
    const all = await this.#db.scenarios.toArray();
    return freeScenarioName(
      base,
      all.map((s) => s.name),
    );
  }

  /**
   * Creates a scenario holding `plan` (an empty plan by default); its name is made free
   * when `uniqueName` is set, otherwise a taken name is refused.
   * @throws Error for an empty, too long or taken name.
   */
  async create(name: string, plan?: unknown, options: { uniqueName?: boolean } = {}): Promise<ScenarioRecord> {
    const clean = options.uniqueName ? await this.freeName(name) : await this.checkName(name, null);
    const record: ScenarioRecord = {
      id: newId(),
      name: clean,
      plan: plain(withName(plan ?? emptyPlanDocument(clean), clean)),
      updatedAt: this.#now(),
    };
    await this.#db.scenarios.add(record);
    return record;
  }

  /**
   * Stores a new version of a scenario's document (the name inside follows the record's).
   * @throws Error when the scenario no longer exists.
   */
  async savePlan(id: string, plan: unknown): Promise<ScenarioRecord> {
    return this.#db.scenarios.db.transaction('rw', this.#db.scenarios, async () => {
      const current = await this.#db.scenarios.get(id);
      if (!current) throw new Error('That scenario no longer exists.');
      const next: ScenarioRecord = { ...current, plan: plain(withName(plan, current.name)), updatedAt: this.#now() };
      await this.#db.scenarios.put(next);
      return next;
    });
  }

  /** @throws Error for an empty, too long or taken name, or a scenario that no longer exists. */
  async rename(id: string, name: string): Promise<ScenarioRecord> {
    const clean = await this.checkName(name, id);
    return this.#db.scenarios.db.transaction('rw', this.#db.scenarios, async () => {
      const current = await this.#db.scenarios.get(id);
      if (!current) throw new Error('That scenario no longer exists.');
      const next: ScenarioRecord = {
        ...current,
        name: clean,
        plan: withName(current.plan, clean),
        updatedAt: this.#now(),
      };
      await this.#db.scenarios.put(next);
      return next;
    });
  }

  /** A copy named “… (copy)” (made free). @throws Error when the scenario no longer exists. */
  async duplicate(id: string): Promise<ScenarioRecord> {
    const current = await this.#db.scenarios.get(id);
    if (!current) throw new Error('That scenario no longer exists.');
    return this.create(`${current.name} (copy)`, current.plan, { uniqueName: true });
  }

  /** Deletes a scenario. @returns the record as it was, for Undo (undefined when already gone). */
  async remove(id: string): Promise<ScenarioRecord | undefined> {
    return this.#db.scenarios.db.transaction('rw', this.#db.scenarios, async () => {
      const current = await this.#db.scenarios.get(id);
      if (current) await this.#db.scenarios.delete(id);
      return current;
    });
  }

  /**
   * Puts a deleted scenario back exactly as it was (Undo). When its name was taken
   * meanwhile, it comes back under a free name.
   */
  async restore(record: ScenarioRecord): Promise<ScenarioRecord> {
    const all = await this.#db.scenarios.toArray();
    const others = all.filter((s) => s.id !== record.id).map((s) => s.name);
    const name = others.some((n) => n.toLowerCase() === record.name.toLowerCase())
      ? freeScenarioName(record.name, others)
      : record.name;
    const back: ScenarioRecord =
      name === record.name ? plain(record) : { ...plain(record), name, plan: withName(record.plan, name) };
    await this.#db.scenarios.put(back);
    return back;
  }

  /** A workspace setting (the comparison's choices), or `fallback`. */
  async setting<T>(key: string, fallback: T): Promise<T> {
    const row = await this.#db.settings.get(key);
    return row === undefined ? fallback : (row.value as T);
  }

  async saveSetting(key: string, value: unknown): Promise<void> {
    await this.#db.settings.put({ key, value: plain(value) });
  }
}
