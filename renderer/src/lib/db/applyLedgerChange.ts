/**
 * Adds or removes imported files and replaces the derived ledger rows, all in ONE Dexie
 * `rw` transaction: either every row is written or none is. An exception, a full disk or
 * a window closed half-way leaves the workspace exactly as it was (IndexedDB aborts an
 * uncommitted transaction).
 *
 * The caller builds the new ledger first (in the worker, over every file that will be
 * stored, in import order) and passes it here together with the stored file ids the
 * ledger was built on; if the stored files changed meanwhile (another window), nothing is
 * written and `WorkspaceChangedError` is thrown so the caller can rebuild.
 */
import Dexie from 'dexie';
import type { ImportResult } from '../../../../engine/import/types';
import type { Ledger } from '../../../../engine/ledger/types';
import type { WorkspaceDb } from './WorkspaceDb';
import { ledgerRows } from './ledgerRows';
import type { CsvMappingRecord, StatementRecord } from './records';

/** A file to store: its summary (ledger fields are filled in here) and its parsed content. */
export interface FileToStore {
  readonly record: StatementRecord;
  readonly result: ImportResult;
}

/** What a new file's record holds before the ledger's fields are filled in. */
export type NewStatementFields = Pick<
  StatementRecord,
  'id' | 'fileName' | 'format' | 'importedAt' | 'seq' | 'size' | 'contentHash' | 'options'
>;

/** A new file's record, its ledger fields (accounts, period, counts, problems) still empty. */
export function newStatementRecord(fields: NewStatementFields): StatementRecord {
  return { ...fields, accounts: [], accountIds: [], from: null, to: null, entries: 0, duplicates: 0, problems: [] };
}

/** One change of the stored files and the ledger of the files after it. */
export interface LedgerChange {
  /** Ids of the stored files, in `seq` order, when the ledger was built. */
  readonly basedOn: readonly string[];
  readonly add: readonly FileToStore[];
  /** Ids of stored files to delete. */
  readonly remove: readonly string[];
  /** The ledger of (basedOn − remove) + add, in that order. */
  readonly ledger: Ledger;
  /** CSV mappings to remember (per layout fingerprint). */
  readonly csvMappings?: readonly CsvMappingRecord[];
}

/** The stored files changed between building the ledger and storing it. */
export class WorkspaceChangedError extends Error {
  constructor() {
    super('The workspace changed while the files were being read (another window?). Nothing was stored; try again.');
    this.name = 'WorkspaceChangedError';
  }
}

/** The browser's storage for the app (or the disk) is full. */
export class StorageFullError extends Error {
  constructor() {
    super(
      "Nothing was stored: the disk or the browser's storage for Ebbline is full. " +
        'Free some disk space (or remove a workspace you no longer need) and try again.',
    );
    this.name = 'StorageFullError';
  }
}

/** True when `error` (or an error it wraps, as Dexie does) is a QuotaExceededError. */
export function isQuotaExceeded(error: unknown): boolean {
  for (let e = error as { name?: unknown; inner?: unknown } | null | undefined, depth = 0; e && depth < 5; depth++) {
    if (e.name === 'QuotaExceededError' || e.name === Dexie.errnames.QuotaExceeded) return true;
    e = e.inner as typeof e;
  }
  return false;
}

/** Maps a storage failure to the error a person should read. */
export function storageError(error: unknown): Error {
  if (isQuotaExceeded(error)) return new StorageFullError();
  if (error instanceof Error) return error;
  return new Error(String(error));
}

/**
 * Applies `change` in one transaction.
 *
 * @throws WorkspaceChangedError when the stored files are no longer `change.basedOn`;
 *   StorageFullError when the storage quota is exceeded; otherwise the storage error.
 *   In every case nothing was written.
 * @example await applyLedgerChange(db, { basedOn: [], add: [{ record, result }], remove: [], ledger })
 */
export async function applyLedgerChange(db: WorkspaceDb, change: LedgerChange): Promise<void> {
  const removed = new Set(change.remove);
  try {
    await db.transaction(
      'rw',
      [db.statements, db.statementResults, db.accounts, db.transactions, db.anchors, db.csvMappings],
      async () => {
        const stored = await db.statements.orderBy('seq').toArray();
        const ids = stored.map((s) => s.id);
        if (ids.length !== change.basedOn.length || ids.some((id, i) => id !== change.basedOn[i])) {
          throw new WorkspaceChangedError();
        }
        const kept = stored.filter((s) => !removed.has(s.id));
        const all = [...kept, ...change.add.map((f) => f.record)];
        const rows = ledgerRows(change.ledger, new Map(all.map((s) => [s.fileName, s.id])));
        const updated = all.map((s) => ({ ...s, ...(rows.files.get(s.id) ?? {}) }));

        if (change.remove.length > 0) {
          await db.statements.bulkDelete([...change.remove]);
          await db.statementResults.bulkDelete([...change.remove]);
        }
        await db.statementResults.bulkAdd(change.add.map((f) => ({ id: f.record.id, result: f.result })));
        await db.statements.bulkPut(updated);
        await db.accounts.clear();
        await db.transactions.clear();
        await db.anchors.clear();
        await db.accounts.bulkAdd(rows.accounts);
        await db.transactions.bulkAdd(rows.transactions);
        await db.anchors.bulkAdd(rows.anchors);
        if (change.csvMappings && change.csvMappings.length > 0) await db.csvMappings.bulkPut([...change.csvMappings]);
      },
    );
  } catch (error) {
    if (error instanceof WorkspaceChangedError) throw error;
    throw storageError(error);
  }
}

/**
 * The stored files in ledger order with their parsed content: the input of `buildLedger`.
 * @example const { ids, files } = await storedLedgerInput(db)
 */
export async function storedLedgerInput(
  db: WorkspaceDb,
): Promise<{ ids: string[]; records: StatementRecord[]; files: { file: string; result: ImportResult }[] }> {
  return db.transaction('r', [db.statements, db.statementResults], async () => {
    const records = await db.statements.orderBy('seq').toArray();
    const results = await db.statementResults.bulkGet(records.map((r) => r.id));
    const files = records.map((r, i) => {
      const stored = results[i];
      if (!stored) throw new Error(`the parsed content of "${r.fileName}" is missing`);
      return { file: r.fileName, result: stored.result };
    });
    return { ids: records.map((r) => r.id), records, files };
  });
}
