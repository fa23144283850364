// Workspace backups (fake-indexeddb): a workspace with real imported demo statements,
// decisions, scenarios and settings is exported with createBackup, read back with
// parseBackup and restored into a NEW workspace database whose tables are identical; a
// damaged or newer file is refused and nothing at all changes; a restore that fails
// half-way leaves no database and no registry entry behind.
import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { readFileSync } from 'node:fs';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createBackup } from '../../engine/backup/createBackup';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../engine/ledger/buildLedger';
import { kilnOnCreditPlan } from '../../engine/scenario/demoScenarios';
import { applyLedgerChange, newStatementRecord, type FileToStore } from '../../renderer/src/lib/db/applyLedgerChange';
import { RegistryDb, WorkspaceDb, workspaceDbName } from '../../renderer/src/lib/db/WorkspaceDb';
import {
  backupFileName,
  checkBackupFile,
  describeContents,
  exportWorkspace,
  readWorkspaceTables,
  restoreAsNewWorkspace,
  restoreIntoNewDatabase,
  workspaceTables,
} from '../../renderer/src/components/backup/workspaceBackup';
import { ScenarioStore } from '../../renderer/src/components/scenarios/scenarioStore';

const DEMO = new URL('../../resources/demo/statements/', import.meta.url);
const FILES = ['business-2026-09.xml', 'business-2026-10.xml', 'reserve-2026.sta', 'household-2026-Q4.ofx'];
const encode = (text: string) => new TextEncoder().encode(text);

let counter = 0;
const unique = (prefix: string) => `${prefix}-${process.pid}-${++counter}`;
const cleanup: string[] = [];
afterEach(async () => {
  for (const name of cleanup.splice(0)) await Dexie.delete(name);
});

function read(name: string): LedgerInputFile {
  const result = importStatement(readFileSync(new URL(name, DEMO)), { fileName: name });
  if (result.format === undefined) throw new Error(`${name} did not read`);
  return { file: name, result: result as ImportResult };
}

/** A workspace database like one the app fills: files and ledger, decisions, scenarios, settings, a CSV mapping. */
async function seededWorkspace(): Promise<WorkspaceDb> {
  const name = unique('backup-source');
  const db = new WorkspaceDb(name);
  await db.open();
  const files = FILES.map(read);
  const add: FileToStore[] = files.map((f, i) => {
    const record = newStatementRecord({
      id: `file-${i}`,
      fileName: f.file,
      format: f.result.format,
      importedAt: '2026-11-01T09:00:00.000Z',
      seq: i + 1,
      size: 100 + i,
      contentHash: `hash-${i}`,
      options: {},
    });
    return { record, result: f.result };
  });
  await applyLedgerChange(db, { basedOn: [], add, remove: [], ledger: buildLedger(files) });
  await db.recurring.put({
    key: 'outflow|studio rent|monthly',
    state: 'confirmed',
    decidedAt: '2026-11-01T10:00:00.000Z',
  });
  await db.recurring.put({
    key: 'outflow|phone|monthly',
    state: 'edited',
    edits: { amount: -4500, label: 'Phone and internet' },
    decidedAt: '2026-11-01T10:01:00.000Z',
  });
  const store = new ScenarioStore(db, () => '2026-11-01T11:00:00.000Z');
  await store.create('New kiln bought on credit', kilnOnCreditPlan());
  await store.create('Typed, not yet valid', { schema: 'ebbline.plan/1', items: [{ label: 'x', amount: '12abc' }] });
  await store.saveSetting('scenarios.comparison', { horizon: 91, selected: [], threshold: 1200000 });
  await db.csvMappings.put({
    fingerprint: 'fp-1',
    mapping: { dateColumn: 0 } as never,
    currency: 'EUR',
    savedAt: '2026-11-01T08:00:00.000Z',
  });
  return db;
}

let source: WorkspaceDb;
let sourceTables: Awaited<ReturnType<typeof readWorkspaceTables>>;
let exported: Awaited<ReturnType<typeof exportWorkspace>>;

beforeAll(async () => {
  source = await seededWorkspace();
  sourceTables = await readWorkspaceTables(source);
  exported = await exportWorkspace(source, { workspace: 'Tessellate Ceramics (demo)', createdOn: '2026-11-02' });
});

afterAll(async () => {
  source.close();
  await Dexie.delete(source.name);
});

async function databaseNames(): Promise<string[]> {
  return (await Dexie.getDatabaseNames()).sort();
}

describe('export', () => {
  it('writes every table with its records and names the file after the workspace and day', () => {
    expect(exported.fileName).toBe('Tessellate Ceramics (demo)-backup-2026-11-02.json');
    expect(Object.keys(sourceTables).sort()).toEqual([...workspaceTables()].sort());
    for (const t of workspaceTables()) expect(exported.counts[t]).toBe(sourceTables[t]!.length);
    expect(exported.counts.transactions).toBeGreaterThan(50);
    expect(exported.counts.anchors).toBeGreaterThan(0);
    expect(exported.text.startsWith('{\n  "schema": "ebbline.backup/1",')).toBe(true);
  });

  it('names files safely', () => {
    expect(backupFileName('A/B: "C"', '2026-01-02')).toBe('A-B- -C--backup-2026-01-02.json');
  });
});

describe('restore', () => {
  it('round trip: a new workspace database with identical tables', async () => {
    const check = checkBackupFile(encode(exported.text), exported.fileName);
    if (!check.ok) throw new Error(check.message + JSON.stringify(check.problems));
    expect(check.backup.workspace).toBe('Tessellate Ceramics (demo)');
    expect(describeContents(check.counts)).toContain('2 scenarios');

    const registryName = unique('registry');
    cleanup.push(registryName);
    const registry = new RegistryDb(registryName);
    const id = unique('restored');
    cleanup.push(workspaceDbName(id));
    const entry = await restoreAsNewWorkspace(check.backup, {
      name: 'Tessellate Ceramics (restored)',
      registry,
      id,
      now: () => '2026-11-03T00:00:00.000Z',
    });
    expect(entry).toEqual({
      id,
      name: 'Tessellate Ceramics (restored)',
      createdAt: '2026-11-03T00:00:00.000Z',
      demo: false,
    });
    expect(await registry.workspaces.toArray()).toEqual([entry]);

    const restored = new WorkspaceDb(workspaceDbName(id));
    await restored.open();
    const tables = await readWorkspaceTables(restored);
    for (const t of workspaceTables()) expect(tables[t], t).toEqual(sourceTables[t]);
    // Indexes work on the restored data, and a second backup is byte for byte the first.
    expect(
      await restored.transactions
        .where('accountId')
        .equals(sourceTables.transactions![0]!.accountId as string)
        .count(),
    ).toBeGreaterThan(0);
    const again = await exportWorkspace(restored, { workspace: 'Tessellate Ceramics (demo)', createdOn: '2026-11-02' });
    expect(again.text).toBe(exported.text);
    restored.close();
    registry.close();
    // The source is untouched.
    expect(await readWorkspaceTables(source)).toEqual(sourceTables);
  });

  it('never writes into an existing database', async () => {
    const check = checkBackupFile(encode(exported.text));
    if (!check.ok) throw new Error(check.message);
    await expect(restoreIntoNewDatabase(check.backup, source.name)).rejects.toThrow('nothing was overwritten');
    expect(await readWorkspaceTables(source)).toEqual(sourceTables);
  });

  it('a restore that fails half-way leaves no database and no registry entry', async () => {
    // A valid file whose transactions repeat a primary key: the one transaction aborts.
    const tables = { ...sourceTables, transactions: [...sourceTables.transactions!, sourceTables.transactions![0]!] };
    const text = createBackup(tables, { schemaVersion: 1, createdOn: '2026-11-02', workspace: 'Broken' });
    const check = checkBackupFile(encode(text));
    if (!check.ok) throw new Error(check.message);
    const registryName = unique('registry');
    cleanup.push(registryName);
    const registry = new RegistryDb(registryName);
    await registry.open();
    const before = await databaseNames();
    const id = unique('half');
    await expect(restoreAsNewWorkspace(check.backup, { name: 'Broken', registry, id })).rejects.toThrow();
    expect(await databaseNames()).toEqual(before);
    expect(await registry.workspaces.count()).toBe(0);
    registry.close();
  });
});

describe('refusal', () => {
  async function refusedChangesNothing(text: string | Uint8Array): Promise<{ message: string; paths: string[] }> {
    const before = await databaseNames();
    const check = checkBackupFile(typeof text === 'string' ? encode(text) : text, 'backup.json');
    expect(check.ok).toBe(false);
    if (check.ok) throw new Error('accepted');
    expect(await databaseNames()).toEqual(before);
    expect(await readWorkspaceTables(source)).toEqual(sourceTables);
    return { message: check.message, paths: check.problems.map((p) => p.path) };
  }

  it('refuses a damaged file (one amount changed)', async () => {
    const amount = String(sourceTables.transactions![5]!.amount);
    const damaged = exported.text.replace(`"amount":${amount},`, `"amount":${Number(amount) + 1},`);
    expect(damaged).not.toBe(exported.text);
    const r = await refusedChangesNothing(damaged);
    expect(r.message).toMatch(/damaged or was changed/);
    expect(r.paths).toContain('$.checksum.value');
  });

  it('refuses a truncated file', async () => {
    const r = await refusedChangesNothing(exported.text.slice(0, exported.text.length / 2));
    expect(r.message).toMatch(/damaged/);
  });

  it('refuses a file from a newer version of Ebbline', async () => {
    const newer = exported.text.replace('"schemaVersion": 1,', '"schemaVersion": 99,');
    const r = await refusedChangesNothing(newer);
    expect(r.message).toMatch(/newer version of Ebbline/);
    const nextSchema = exported.text.replace('"schema": "ebbline.backup/1"', '"schema": "ebbline.backup/2"');
    expect((await refusedChangesNothing(nextSchema)).message).toMatch(/newer version/);
  });

  it('refuses what is not a backup at all', async () => {
    expect((await refusedChangesNothing('{"schema": "ebbline.plan/1", "items": []}')).message).toMatch(
      /not a complete/,
    );
    expect((await refusedChangesNothing(new Uint8Array([0xff, 0xfe, 0xfd]))).message).toMatch(/not UTF-8/);
  });
});
