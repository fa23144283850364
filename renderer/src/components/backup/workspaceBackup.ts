/**
 * Workspace backups between the Dexie database and the `ebbline.backup/1` file
 * (engine/backup): every table read in one read transaction and written by createBackup;
 * a file checked by parseBackup before anything is written, then restored into a NEW
 * workspace database in ONE write transaction — never into an existing one — and only
 * then listed in the registry. Any failure removes what was begun, so a refused or failed
 * restore changes nothing.
 *
 * A backup of an older schema version is written into a database at that version and then
 * opened at the latest one, so it goes through the same upgrade chain as any old database
 * (renderer/src/lib/db/schema.ts). Plain TypeScript, tested with fake-indexeddb.
 */
import Dexie from 'dexie';
import { createBackup } from '../../../../engine/backup/createBackup';
import { parseBackup } from '../../../../engine/backup/parseBackup';
import type { Backup, BackupProblem, BackupTables, JsonRecord } from '../../../../engine/backup/backupFormat';
import { WORKSPACE_SCHEMA, WORKSPACE_SCHEMA_VERSION, type SchemaVersion } from '../../lib/db/schema';
import { RegistryDb, WorkspaceDb, workspaceDbName, type WorkspaceEntry } from '../../lib/db/WorkspaceDb';

/** Largest backup file read (a workspace with years of statements is a few tens of MiB). */
export const MAX_BACKUP_BYTES = 512 * 1024 * 1024;

/** The schema versions up to `version`, and the stores that exist at that version. */
export function schemaAt(version: number): { versions: SchemaVersion[]; tables: string[] } {
  const versions = WORKSPACE_SCHEMA.filter((v) => v.version <= version);
  const stores = new Map<string, string>();
  for (const v of versions) {
    for (const [name, spec] of Object.entries(v.stores)) {
      if (spec === null) stores.delete(name);
      else stores.set(name, spec);
    }
  }
  return { versions, tables: [...stores.keys()] };
}

/** The tables of the latest schema. */
export function workspaceTables(): string[] {
  return schemaAt(WORKSPACE_SCHEMA_VERSION).tables;
}

/** Every table of an open workspace database, read in one transaction. */
export async function readWorkspaceTables(
  db: Dexie,
  tables: readonly string[] = workspaceTables(),
): Promise<BackupTables> {
  const out: Record<string, JsonRecord[]> = {};
  await db.transaction(
    'r',
    tables.map((t) => db.table(t)),
    async () => {
      for (const t of tables) out[t] = (await db.table(t).toArray()) as JsonRecord[];
    },
  );
  return out;
}

/** A local calendar date as YYYY-MM-DD (the day a person sees on their clock). */
export function localDateText(date: Date = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

/**
 * `<workspace>-backup-YYYY-MM-DD.json`, with characters file systems refuse replaced.
 * @example backupFileName('Tessellate Ceramics (demo)', '2026-11-02') // 'Tessellate Ceramics (demo)-backup-2026-11-02.json'
 */
export function backupFileName(workspace: string, createdOn: string): string {
  const safe =
    [...workspace]
      .map((ch) => (ch.charCodeAt(0) < 32 || '\\/:*?"<>|'.includes(ch) ? '-' : ch))
      .join('')
      .replace(/\s+/g, ' ')
      .trim()
      .slice(0, 80) || 'workspace';
  return `${safe}-backup-${createdOn}.json`;
}

/**
 * The backup file of an open workspace database.
 * @throws EngineError from createBackup when a stored value cannot be written as JSON.
 */
export async function exportWorkspace(
  db: Dexie,
  meta: { workspace: string; createdOn?: string; app?: string },
): Promise<{ fileName: string; text: string; counts: Record<string, number> }> {
  const tables = workspaceTables();
  const data = await readWorkspaceTables(db, tables);
  const createdOn = meta.createdOn ?? localDateText();
  const text = createBackup(
    data,
    {
      schemaVersion: db.verno || WORKSPACE_SCHEMA_VERSION,
      createdOn,
      workspace: meta.workspace,
      ...(meta.app ? { app: meta.app } : {}),
    },
    { tables },
  );
  const counts = Object.fromEntries(tables.map((t) => [t, data[t]?.length ?? 0]));
  return { fileName: backupFileName(meta.workspace, createdOn), text, counts };
}

export type BackupCheck =
  | { readonly ok: true; readonly backup: Backup; readonly counts: Readonly<Record<string, number>> }
  | { readonly ok: false; readonly message: string; readonly problems: readonly BackupProblem[] };

/**
 * Reads and checks a backup file; nothing is written.
 * @returns the backup with its table counts, or why it is refused (a sentence and the
 *   problems with their JSON paths).
 */
export function checkBackupFile(bytes: Uint8Array, fileName = 'The file'): BackupCheck {
  if (bytes.length > MAX_BACKUP_BYTES) {
    return { ok: false, message: `${fileName} is larger than a backup can be (512 MiB).`, problems: [] };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return { ok: false, message: `${fileName} is not UTF-8 text, so it is not an Ebbline backup.`, problems: [] };
  }
  // The version decides which tables the file must hold; read it before the full check.
  let version = WORKSPACE_SCHEMA_VERSION;
  const m = /"schemaVersion"\s*:\s*(\d{1,6})/.exec(text.slice(0, 4096));
  if (m) {
    const v = Number(m[1]);
    if (v >= 1 && v < WORKSPACE_SCHEMA_VERSION) version = v;
  }
  const parsed = parseBackup(text, { maxSchemaVersion: WORKSPACE_SCHEMA_VERSION, tables: schemaAt(version).tables });
  if (!parsed.ok) {
    const newer = parsed.problems.some((p) => p.message.includes('newer version of Ebbline'));
    const damaged = parsed.problems.some((p) => /damaged|not valid JSON|checksum/.test(p.message + p.path));
    const message = newer
      ? `${fileName} was made by a newer version of Ebbline. Update Ebbline to restore it; nothing was changed.`
      : damaged
        ? `${fileName} is damaged or was changed after it was made, so it cannot be restored; nothing was changed.`
        : `${fileName} is not a complete Ebbline backup, so it cannot be restored; nothing was changed.`;
    return { ok: false, message, problems: parsed.problems };
  }
  const counts = Object.fromEntries(Object.entries(parsed.backup.tables).map(([t, rows]) => [t, rows.length]));
  return { ok: true, backup: parsed.backup, counts };
}

/** What a restore will create, in words, for the confirmation. */
export function describeContents(counts: Readonly<Record<string, number>>): string[] {
  const n = (t: string) => counts[t] ?? 0;
  const plural = (k: number, one: string, many: string) => `${k.toLocaleString('en')} ${k === 1 ? one : many}`;
  return [
    plural(n('accounts'), 'account', 'accounts'),
    plural(n('statements'), 'imported statement file', 'imported statement files'),
    plural(n('transactions'), 'transaction', 'transactions'),
    plural(n('recurring'), 'recurring-flow decision', 'recurring-flow decisions'),
    plural(n('scenarios'), 'scenario', 'scenarios'),
    plural(n('csvMappings'), 'remembered CSV layout', 'remembered CSV layouts'),
    plural(n('settings'), 'setting', 'settings'),
  ];
}

/**
 * Writes a checked backup into a database that must not exist yet, in one transaction,
 * then opens it at the latest schema (running the upgrades of an older backup).
 * @throws Error when the database exists already, or the storage error; the new database
 *   is deleted again then.
 */
export async function restoreIntoNewDatabase(backup: Backup, dbName: string): Promise<void> {
  if (await Dexie.exists(dbName))
    throw new Error('a workspace database of that name exists already; nothing was overwritten');
  const { versions, tables } = schemaAt(backup.schemaVersion);
  const db = new WorkspaceDb(dbName, versions);
  try {
    await db.open();
    await db.transaction(
      'rw',
      tables.map((t) => db.table(t)),
      async () => {
        for (const t of tables) {
          const rows = backup.tables[t] ?? [];
          if (rows.length) await db.table(t).bulkAdd(rows as object[]);
        }
      },
    );
    db.close();
    if (backup.schemaVersion < WORKSPACE_SCHEMA_VERSION) {
      const upgraded = new WorkspaceDb(dbName);
      await upgraded.open();
      upgraded.close();
    }
  } catch (error) {
    db.close();
    await Dexie.delete(dbName).catch(() => undefined);
    throw error;
  }
}

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;
}

export interface RestoreOptions {
  /** The new workspace's name (the caller makes it free). */
  readonly name: string;
  readonly registry: RegistryDb;
  readonly id?: string;
  readonly now?: () => string;
}

/**
 * Restores a checked backup as a new workspace: its database first (one transaction),
 * then its entry in the registry. On any failure both are removed again.
 * @returns the new workspace's registry entry.
 */
export async function restoreAsNewWorkspace(backup: Backup, options: RestoreOptions): Promise<WorkspaceEntry> {
  const id = options.id ?? newId();
  const dbName = workspaceDbName(id);
  await restoreIntoNewDatabase(backup, dbName);
  const entry: WorkspaceEntry = {
    id,
    name: options.name,
    createdAt: options.now?.() ?? new Date().toISOString(),
    demo: false,
  };
  try {
    await options.registry.workspaces.add(entry);
  } catch (error) {
    await Dexie.delete(dbName).catch(() => undefined);
    throw error;
  }
  return entry;
}
