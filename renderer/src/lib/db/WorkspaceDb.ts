/**
 * One Dexie database per workspace (a household, a business, a bookkeeper's client), and a
 * small registry database listing them. All versions of the schema are declared, in order,
 * so an old database is upgraded step by step.
 */
import Dexie, { type EntityTable } from 'dexie';
import { REGISTRY_SCHEMA, WORKSPACE_SCHEMA, type SchemaVersion } from './schema';
import type {
  AccountRecord,
  AnchorRecord,
  CsvMappingRecord,
  RecurringDecisionRecord,
  ScenarioRecord,
  SettingRecord,
  StatementRecord,
  StatementResultRecord,
  TransactionRecord,
} from './records';

/** Declares `versions` on `db` in order, each with its upgrade. */
export function declareVersions(db: Dexie, versions: readonly SchemaVersion[]): void {
  for (const v of versions) {
    const declared = db.version(v.version).stores(v.stores);
    if (v.upgrade) declared.upgrade(v.upgrade);
  }
}

export class WorkspaceDb extends Dexie {
  accounts!: EntityTable<AccountRecord, 'id'>;
  statements!: EntityTable<StatementRecord, 'id'>;
  statementResults!: EntityTable<StatementResultRecord, 'id'>;
  transactions!: EntityTable<TransactionRecord, 'id'>;
  anchors!: EntityTable<AnchorRecord, 'id'>;
  recurring!: EntityTable<RecurringDecisionRecord, 'key'>;
  csvMappings!: EntityTable<CsvMappingRecord, 'fingerprint'>;
  scenarios!: EntityTable<ScenarioRecord, 'id'>;
  settings!: EntityTable<SettingRecord, 'key'>;

  /** @param versions the schema to declare; tests pass a prefix of WORKSPACE_SCHEMA. */
  constructor(name: string, versions: readonly SchemaVersion[] = WORKSPACE_SCHEMA) {
    super(name);
    declareVersions(this, versions);
  }
}

export interface WorkspaceEntry {
  id: string;
  name: string;
  createdAt: string;
  /** True for the invented demo workspace. */
  demo: boolean;
}

export class RegistryDb extends Dexie {
  workspaces!: EntityTable<WorkspaceEntry, 'id'>;
  constructor(name = 'ebbline-workspaces') {
    super(name);
    declareVersions(this, REGISTRY_SCHEMA);
  }
}

/** Database name of a workspace. */
export function workspaceDbName(id: string): string {
  return `ebbline-workspace-${id}`;
}

/** Opens (creating when new) the database of workspace `id` at the latest schema. */
export function openWorkspaceDb(id: string): WorkspaceDb {
  return new WorkspaceDb(workspaceDbName(id));
}

/** Deletes the whole database of workspace `id` (every file, decision and setting in it). */
export function deleteWorkspaceDb(id: string): Promise<void> {
  return Dexie.delete(workspaceDbName(id));
}
