/**
 * The workspace database schema, version by version. This list is append-only: a released
 * version is never edited or removed, and every version after the first carries an
 * `upgrade` that moves the data forward. Each version has a migration test
 * (test/renderer/db.migrations.test.ts) that seeds the previous version, opens this one and
 * checks the data.
 */
import type { Transaction } from 'dexie';

export interface SchemaVersion {
  readonly version: number;
  /** Dexie store definitions: primary key first, then indexed fields only. */
  readonly stores: Readonly<Record<string, string | null>>;
  readonly upgrade?: (tx: Transaction) => Promise<void>;
  /** What changed, for people reading the history. */
  readonly note: string;
}

export const WORKSPACE_SCHEMA: readonly SchemaVersion[] = [
  {
    version: 1,
    note: 'First schema: imported files (summary and parsed content), the derived ledger (accounts, transactions, balance anchors), recurring decisions, CSV mappings, scenarios, settings.',
    stores: {
      accounts: 'id, currency, order',
      statements: 'id, &fileName, seq, contentHash',
      statementResults: 'id',
      // Few indexes on purpose: each one roughly doubles the cost of writing 100,000 rows.
      transactions: 'id, bookingDate, [accountId+bookingDate]',
      anchors: '++id, accountId, [accountId+date], statementId',
      recurring: 'key, state',
      csvMappings: 'fingerprint',
      scenarios: 'id, name',
      settings: 'key',
    },
  },
];

/** The latest schema version. */
export const WORKSPACE_SCHEMA_VERSION = WORKSPACE_SCHEMA[WORKSPACE_SCHEMA.length - 1]!.version;

/** Schema of the small registry database that lists the workspaces. */
export const REGISTRY_SCHEMA: readonly SchemaVersion[] = [
  { version: 1, note: 'Workspace list.', stores: { workspaces: 'id, name, createdAt' } },
];
