/**
 * The workspace backup file, `ebbline.backup/1`: one JSON document holding every stored
 * table of a workspace as arrays of plain JSON records, the workspace database's schema
 * version (the Dexie version it was written from) and a SHA-256 checksum of its content.
 *
 * ```
 * {
 *   "schema": "ebbline.backup/1",
 *   "schemaVersion": 3,
 *   "createdOn": "2026-11-02",
 *   "workspace": "Tessellate Ceramics",
 *   "app": "0.1.0",
 *   "checksum": { "algorithm": "SHA-256", "value": "<64 hex digits>" },
 *   "tables": { "accounts": [ {…}, … ], "statements": [ … ], … }
 * }
 * ```
 * The checksum is SHA-256 (FIPS 180-4) of the UTF-8 bytes of the canonical JSON
 * (engine/backup/canonicalJson.ts) of the whole document without its "checksum" member.
 * SHA-256 rather than a shorter non-cryptographic hash (FNV-1a 64): the cost is small next
 * to parsing, it is what people can check with ordinary tools, and accidental collisions
 * are out of the question. Records are treated generically: the engine checks that each
 * table is an array of JSON objects and leaves their fields to the app's database upgrade
 * chain.
 */
import type { CalendarDate } from '../core/dates';

export const BACKUP_SCHEMA = 'ebbline.backup/1';
export const CHECKSUM_ALGORITHM = 'SHA-256';

/**
 * The tables of a workspace, named as the renderer's Dexie stores are
 * (renderer/src/lib/db/schema.ts, version 1): accounts, statements (one per stored file),
 * statementResults (each stored file's ImportResult), transactions, balance anchors,
 * recurring (the user's decisions about recurring flows), CSV mappings, scenarios (plan
 * documents) and settings. A later database version with other stores passes its own
 * list as `tables`.
 */
export const BACKUP_TABLES = [
  'accounts',
  'statements',
  'statementResults',
  'transactions',
  'anchors',
  'recurring',
  'csvMappings',
  'scenarios',
  'settings',
] as const;

/** A JSON value as a backup holds it. */
export type JsonValue = null | boolean | number | string | readonly JsonValue[] | { readonly [key: string]: JsonValue };
/** One stored record. */
export type JsonRecord = { readonly [key: string]: JsonValue };
/** Table name → its records. */
export type BackupTables = Readonly<Record<string, readonly JsonRecord[]>>;

/** What a backup says about itself. */
export interface BackupMeta {
  /** Version of the workspace database schema the tables come from (a whole number ≥ 1). */
  readonly schemaVersion: number;
  /** The day the backup was made, passed in (the engine never reads a clock). */
  readonly createdOn: CalendarDate;
  /** The workspace's name. */
  readonly workspace: string;
  /** The app version that wrote it, for people reading the file. */
  readonly app?: string;
}

/** A backup read back from a file. */
export interface Backup extends BackupMeta {
  readonly schema: typeof BACKUP_SCHEMA;
  readonly checksum: string;
  readonly tables: BackupTables;
}

/** Something wrong with a backup file: where (JSON path) and what. */
export interface BackupProblem {
  readonly path: string;
  readonly message: string;
}

/** Options shared by createBackup and parseBackup. */
export interface BackupTableOptions {
  /** The table names this app version stores (default BACKUP_TABLES); all must be present, no others. */
  readonly tables?: readonly string[];
}
