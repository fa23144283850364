// The migration harness of the workspace and registry databases (DESIGN.md section 6): for
// every schema version n, a database is seeded at version n − 1 (for version 1: nothing,
// an empty IndexedDB), opened at n through the declared version chain, and its data checked.
// Adding a version without a case here fails the "every version has a case" test.
import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { describe, expect, it } from 'vitest';
import {
  REGISTRY_SCHEMA,
  WORKSPACE_SCHEMA,
  WORKSPACE_SCHEMA_VERSION,
  type SchemaVersion,
} from '../../renderer/src/lib/db/schema';
import { RegistryDb, WorkspaceDb, declareVersions } from '../../renderer/src/lib/db/WorkspaceDb';

let counter = 0;
const uniqueName = (prefix: string) => `${prefix}-${process.pid}-${++counter}`;

interface MigrationCase {
  /** Writes data with the schema of version n − 1 (not called for version 1). */
  seed(db: Dexie): Promise<void>;
  /** Checks the data after opening at version n. */
  check(db: Dexie): Promise<void>;
}

const STORES_V1 = [
  'accounts',
  'statements',
  'statementResults',
  'transactions',
  'anchors',
  'recurring',
  'csvMappings',
  'scenarios',
  'settings',
];

const WORKSPACE_CASES: Record<number, MigrationCase> = {
  1: {
    async seed() {
      // Version 0: no database at all.
    },
    async check(db) {
      expect(db.verno).toBe(1);
      expect(db.tables.map((t) => t.name).sort()).toEqual([...STORES_V1].sort());
      for (const name of STORES_V1) expect(await db.table(name).count()).toBe(0);
      // Every store takes a record and finds it by its indexes.
      await db
        .table('accounts')
        .add({ id: 'NL01', name: 'Studio', currency: 'EUR', identifiers: [], kind: 'current', order: 0 });
      await db.table('statements').add({ id: 's1', fileName: 'a.xml', seq: 1, contentHash: 'h1' });
      await db
        .table('transactions')
        .add({ id: 't1', accountId: 'NL01', bookingDate: '2026-01-02', statementId: 's1', fingerprint: 'f' });
      await db.table('anchors').add({ accountId: 'NL01', date: '2026-01-31', statementId: 's1' });
      await db
        .table('recurring')
        .add({ key: 'out:rent:monthDay', state: 'confirmed', decidedAt: '2026-01-01T00:00:00Z' });
      expect(
        await db.table('transactions').where('[accountId+bookingDate]').equals(['NL01', '2026-01-02']).count(),
      ).toBe(1);
      expect(await db.table('statements').where('contentHash').equals('h1').count()).toBe(1);
      expect(await db.table('accounts').where('currency').equals('EUR').count()).toBe(1);
      expect(await db.table('recurring').where('state').equals('confirmed').count()).toBe(1);
      // File names are unique within a workspace (the ledger tells files apart by name).
      await expect(
        db.table('statements').add({ id: 's2', fileName: 'a.xml', seq: 2, contentHash: 'h2' }),
      ).rejects.toThrow();
    },
  },
};

const REGISTRY_CASES: Record<number, MigrationCase> = {
  1: {
    async seed() {},
    async check(db) {
      expect(db.verno).toBe(1);
      await db.table('workspaces').add({ id: 'w1', name: 'Studio', createdAt: '2026-01-01T00:00:00Z', demo: false });
      expect(await db.table('workspaces').orderBy('createdAt').primaryKeys()).toEqual(['w1']);
    },
  },
};

function openAt(name: string, versions: readonly SchemaVersion[]): Dexie {
  const db = new Dexie(name);
  declareVersions(db, versions);
  return db;
}

function chainTests(label: string, schema: readonly SchemaVersion[], cases: Record<number, MigrationCase>): void {
  describe(`${label} schema`, () => {
    it('has strictly increasing versions, each after the first with an upgrade and a note', () => {
      expect(schema.length).toBeGreaterThan(0);
      schema.forEach((v, i) => {
        expect(Number.isInteger(v.version) && v.version >= 1).toBe(true);
        expect(v.note.length).toBeGreaterThan(0);
        if (i > 0) {
          expect(v.version).toBeGreaterThan(schema[i - 1]!.version);
          expect(typeof v.upgrade).toBe('function');
        }
      });
    });

    it('has a migration case for every version', () => {
      expect(
        Object.keys(cases)
          .map(Number)
          .sort((a, b) => a - b),
      ).toEqual(schema.map((v) => v.version));
    });

    schema.forEach((v, i) => {
      it(`migrates to version ${v.version} from version ${i === 0 ? 0 : schema[i - 1]!.version}`, async () => {
        const name = uniqueName(`${label}-v${v.version}`);
        const c = cases[v.version]!;
        if (i > 0) {
          const before = openAt(name, schema.slice(0, i));
          await before.open();
          await c.seed(before);
          before.close();
        }
        const after = openAt(name, schema.slice(0, i + 1));
        await after.open();
        try {
          await c.check(after);
        } finally {
          after.close();
          await Dexie.delete(name);
        }
      });
    });
  });
}

chainTests('workspace', WORKSPACE_SCHEMA, WORKSPACE_CASES);
chainTests('registry', REGISTRY_SCHEMA, REGISTRY_CASES);

describe('database classes', () => {
  it('WorkspaceDb opens at the latest version with every typed table', async () => {
    const db = new WorkspaceDb(uniqueName('ws'));
    await db.open();
    expect(db.verno).toBe(WORKSPACE_SCHEMA_VERSION);
    expect(db.statementResults.name).toBe('statementResults');
    db.close();
    await Dexie.delete(db.name);
  });

  it('RegistryDb opens its own database', async () => {
    const db = new RegistryDb(uniqueName('reg'));
    await db.open();
    expect(db.workspaces.name).toBe('workspaces');
    db.close();
    await Dexie.delete(db.name);
  });
});
