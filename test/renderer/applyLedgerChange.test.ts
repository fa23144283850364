// Imports are stored in one Dexie transaction: all rows or none. These tests run the real
// importers and ledger on demo statements, store them in a fake-indexeddb workspace, and
// break a second import half-way to show the workspace is left exactly as it was.
import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { readFileSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../engine/ledger/buildLedger';
import {
  StorageFullError,
  WorkspaceChangedError,
  applyLedgerChange,
  isQuotaExceeded,
  newStatementRecord,
  storedLedgerInput,
  type FileToStore,
} from '../../renderer/src/lib/db/applyLedgerChange';
import { WorkspaceDb } from '../../renderer/src/lib/db/WorkspaceDb';

const DEMO = new URL('../../resources/demo/statements/', import.meta.url);

function read(name: string): LedgerInputFile {
  const result = importStatement(readFileSync(new URL(name, DEMO)), { fileName: name });
  if (result.format === undefined) throw new Error(`${name} did not read`);
  return { file: name, result: result as ImportResult };
}

let seq = 0;
function toStore(file: LedgerInputFile): FileToStore {
  seq++;
  const record = newStatementRecord({
    id: `id-${file.file}`,
    fileName: file.file,
    format: file.result.format,
    importedAt: '2026-12-01T00:00:00.000Z',
    seq,
    size: 1,
    contentHash: `hash-${file.file}`,
    options: {},
  });
  return { record, result: file.result };
}

async function snapshot(db: WorkspaceDb) {
  return {
    statements: await db.statements.orderBy('seq').toArray(),
    results: await db.statementResults.count(),
    accounts: await db.accounts.orderBy('order').toArray(),
    transactions: await db.transactions.orderBy('id').toArray(),
    anchors: await db.anchors.toArray(),
    csvMappings: await db.csvMappings.toArray(),
  };
}

const FIRST = ['business-2026-08.xml', 'business-2026-09.xml', 'reserve-2026.sta'];
const SECOND = ['business-2026-10.xml', 'business-export-2026-08-10.csv', 'household-2026-Q4.ofx'];

let db: WorkspaceDb;

beforeEach(async () => {
  db = new WorkspaceDb(`apply-${process.pid}-${Math.random()}`);
  await db.open();
});

afterEach(async () => {
  db.close();
  await Dexie.delete(db.name);
});

async function storeFirst(): Promise<LedgerInputFile[]> {
  const files = FIRST.map(read);
  await applyLedgerChange(db, { basedOn: [], add: files.map(toStore), remove: [], ledger: buildLedger(files) });
  return files;
}

describe('applyLedgerChange', () => {
  it("stores the files and exactly the ledger's accounts, transactions and anchors", async () => {
    const files = await storeFirst();
    const ledger = buildLedger(files);
    const s = await snapshot(db);
    expect(s.statements.map((r) => r.fileName)).toEqual(FIRST);
    expect(s.results).toBe(3);
    expect(s.transactions.map((t) => t.id).sort()).toEqual(ledger.transactions.map((t) => t.id).sort());
    expect(s.transactions.reduce((sum, t) => sum + t.amount, 0)).toBe(
      ledger.transactions.reduce((sum, t) => sum + t.amount, 0),
    );
    expect(s.anchors).toHaveLength(ledger.anchors.length);
    expect(s.accounts.map((a) => [a.id, a.reconciled, a.closingBalance])).toEqual(
      ledger.reconciliation.map((r) => [r.accountId, r.reconciled, r.closingBalance]),
    );
    // Per-file figures come from the ledger's file reports.
    const report = ledger.files.find((f) => f.file === 'business-2026-09.xml')!;
    const stored = s.statements.find((r) => r.fileName === 'business-2026-09.xml')!;
    expect(stored.entries).toBe(report.accounts[0]!.entries);
    expect(stored.from).toBe(report.accounts[0]!.from);
    // The stored input rebuilds the same ledger (what the worker gets on the next import).
    const input = await storedLedgerInput(db);
    expect(input.files.map((f) => f.file)).toEqual(FIRST);
    expect(buildLedger(input.files).transactions).toEqual(ledger.transactions);
  });

  it('keeps the workspace unchanged when an import fails half-way', async () => {
    const first = await storeFirst();
    const before = await snapshot(db);
    const basedOn = before.statements.map((r) => r.id);
    const all = [...first, ...SECOND.map(read)];
    const ledger = buildLedger(all);
    let written = 0;
    db.transactions.hook('creating', () => {
      if (++written === Math.floor(ledger.transactions.length / 2)) throw new Error('disk went away');
    });
    await expect(
      applyLedgerChange(db, { basedOn, add: SECOND.map(read).map(toStore), remove: [], ledger }),
    ).rejects.toThrow('disk went away');
    expect(written).toBeGreaterThan(0);
    expect(await snapshot(db)).toEqual(before);
  });

  it('says plainly that storage is full, and stores nothing', async () => {
    const first = await storeFirst();
    const before = await snapshot(db);
    const ledger = buildLedger([...first, ...SECOND.map(read)]);
    db.anchors.hook('creating', () => {
      throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
    });
    const change = {
      basedOn: before.statements.map((r) => r.id),
      add: SECOND.map(read).map(toStore),
      remove: [],
      ledger,
    };
    const error = await applyLedgerChange(db, change).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(StorageFullError);
    expect((error as Error).message).toMatch(/storage for Ebbline is full/);
    expect(await snapshot(db)).toEqual(before);
  });

  it('refuses a ledger built on other stored files', async () => {
    const first = await storeFirst();
    const before = await snapshot(db);
    const ledger = buildLedger([...first.slice(0, 2), ...SECOND.map(read)]);
    await expect(
      applyLedgerChange(db, { basedOn: before.statements.slice(0, 2).map((r) => r.id), add: [], remove: [], ledger }),
    ).rejects.toBeInstanceOf(WorkspaceChangedError);
    expect(await snapshot(db)).toEqual(before);
  });

  it('removes a file and rebuilds from the others in the same transaction', async () => {
    const first = await storeFirst();
    const before = await snapshot(db);
    const rest = first.filter((f) => f.file !== 'reserve-2026.sta');
    const ledger = buildLedger(rest);
    await applyLedgerChange(db, {
      basedOn: before.statements.map((r) => r.id),
      add: [],
      remove: ['id-reserve-2026.sta'],
      ledger,
    });
    const after = await snapshot(db);
    expect(after.statements.map((r) => r.fileName)).toEqual(rest.map((f) => f.file));
    expect(after.results).toBe(2);
    expect(after.accounts.map((a) => a.id)).toEqual(ledger.accounts.map((a) => a.id));
    expect(after.transactions).toHaveLength(ledger.transactions.length);
    expect(after.transactions.every((t) => t.statementId !== 'id-reserve-2026.sta')).toBe(true);
  });

  it('counts a duplicate once: the CSV export overlapping the camt.053 months adds nothing', async () => {
    const files = [
      'business-2026-08.xml',
      'business-2026-09.xml',
      'business-2026-10.xml',
      'business-export-2026-08-10.csv',
    ].map(read);
    const ledger = buildLedger(files);
    await applyLedgerChange(db, { basedOn: [], add: files.map(toStore), remove: [], ledger });
    const csv = (await db.statements.toArray()).find((s) => s.format === 'csv')!;
    expect(csv.entries).toBe(0);
    expect(csv.duplicates).toBe(42);
  });
});

describe('isQuotaExceeded', () => {
  it('finds the quota error directly or wrapped, as Dexie wraps it', () => {
    expect(isQuotaExceeded({ name: 'QuotaExceededError' })).toBe(true);
    expect(isQuotaExceeded({ name: 'AbortError', inner: { name: 'QuotaExceededError' } })).toBe(true);
    expect(isQuotaExceeded(new Error('other'))).toBe(false);
    expect(isQuotaExceeded(null)).toBe(false);
  });
});
