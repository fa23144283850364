import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BACKUP_TABLES, type BackupTables, type JsonRecord } from '../../engine/backup/backupFormat';
import { canonicalJson } from '../../engine/backup/canonicalJson';
import { createBackup } from '../../engine/backup/createBackup';
import { parseBackup, type BackupParse } from '../../engine/backup/parseBackup';
import { sha256Hex } from '../../engine/backup/sha256';

const meta = { schemaVersion: 3, createdOn: '2026-11-02', workspace: 'Tessellate Ceramics', app: '0.1.0' };

function emptyTables(): Record<string, JsonRecord[]> {
  return Object.fromEntries(BACKUP_TABLES.map((t) => [t, []]));
}

function sampleTables(): BackupTables {
  return {
    ...emptyTables(),
    accounts: [{ id: 'NL21HRBL0412345670', name: 'Geschäftskonto — Tessellate', currency: 'EUR', kind: 'current' }],
    transactions: [
      {
        id: 't1',
        accountId: 'NL21HRBL0412345670',
        bookingDate: '2026-10-30',
        amount: -205000,
        description: 'Owner’s draw 10/2026',
      },
      {
        id: 't2',
        accountId: 'NL21HRBL0412345670',
        bookingDate: '2026-10-31',
        amount: Number.MAX_SAFE_INTEGER,
        description: '<script>alert(1)</script>',
      },
      {
        id: 't3',
        amount: -Number.MAX_SAFE_INTEGER,
        description: '日本語 😀 \u2028 "quoted" \\ back',
        tags: ['a', 'b'],
        nested: { z: 1, a: [null, true, 0.1] },
      },
    ],
    statements: [
      { file: 'business-2026-10.xml', result: { format: 'camt.053', statements: [{ entries: [] }], problems: [] } },
    ],
    // A key named __proto__ (as JSON.parse makes it: an own property) stays data.
    settings: [{ key: 'threshold', value: 0 }, JSON.parse('{"__proto__": {"polluted": true}}')],
  };
}

function problemsOf(r: BackupParse) {
  if (r.ok) throw new Error('expected the backup to be refused');
  return r.problems;
}

describe('createBackup → parseBackup', () => {
  it('round-trips the tables exactly: unicode, the largest safe integers, empty tables', () => {
    const tables = sampleTables();
    const text = createBackup(tables, meta);
    const r = parseBackup(text, { maxSchemaVersion: 3 });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.backup.tables).toEqual(tables);
    expect(r.backup.tables.anchors).toEqual([]);
    expect(r.backup).toMatchObject({
      schema: 'ebbline.backup/1',
      schemaVersion: 3,
      createdOn: '2026-11-02',
      workspace: 'Tessellate Ceramics',
      app: '0.1.0',
    });
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('leaves out properties whose value is undefined, as stored records may have them', () => {
    const text = createBackup(
      { ...emptyTables(), transactions: [{ id: 't', valueDate: undefined } as unknown as JsonRecord] },
      meta,
    );
    const r = parseBackup(text, { maxSchemaVersion: 3 });
    expect(r.ok && r.backup.tables.transactions).toStrictEqual([{ id: 't' }]);
  });

  it('writes the same bytes for the same data whatever the key order, one record per line', () => {
    const a = createBackup({ ...emptyTables(), accounts: [{ b: 1, a: 2 }] }, meta);
    const b = createBackup({ ...emptyTables(), accounts: [{ a: 2, b: 1 }] }, meta);
    expect(a).toBe(b);
    expect(a.split('\n')).toContain('      {"a":2,"b":1}');
  });

  it('states a checksum that is SHA-256 of the canonical content without it', () => {
    const text = createBackup(sampleTables(), meta);
    const doc = JSON.parse(text);
    const { checksum, ...content } = doc;
    expect(checksum.algorithm).toBe('SHA-256');
    expect(checksum.value).toBe(sha256Hex(canonicalJson(content)));
  });

  it('refuses data JSON cannot keep exactly, naming where it is', () => {
    const bad = (records: unknown[]) => () =>
      createBackup({ ...emptyTables(), transactions: records as JsonRecord[] }, meta);
    expect(bad([{ amount: 2 ** 53 }])).toThrow(/\$\.tables\.transactions\[0\]\.amount .* too large/);
    expect(bad([{ amount: 10n }])).toThrow(/bigint/);
    expect(bad([{ when: new Date(0) }])).toThrow(/Date, not a plain object/);
    expect(bad([{ list: [1, undefined] }])).toThrow(/\$\.tables\.transactions\[0\]\.list\[1\] is undefined/);
    expect(bad([{ x: NaN }])).toThrow(/not a JSON number/);
    const cycle: Record<string, unknown> = {};
    cycle.self = cycle;
    expect(bad([cycle])).toThrow(/refers back to itself/);
    expect(bad([[1, 2]])).toThrow(/must be a record/);
    expect(() => createBackup({ accounts: [] }, meta)).toThrow(/statements is missing/);
    expect(() => createBackup({ ...emptyTables(), extra: [] }, meta)).toThrow(/"extra" is not a table/);
    expect(() => createBackup(emptyTables(), { ...meta, createdOn: '2026-13-01' })).toThrow(/createdOn/);
  });
});

describe('parseBackup refuses damaged or foreign files', () => {
  const good = createBackup(sampleTables(), meta);

  it('text that is not JSON, or not a backup', () => {
    expect(problemsOf(parseBackup(good.slice(0, -20), { maxSchemaVersion: 3 }))[0]!.message).toMatch(/not valid JSON/);
    expect(problemsOf(parseBackup('[]', { maxSchemaVersion: 3 }))[0]!.path).toBe('$');
    expect(problemsOf(parseBackup('{"schema":"ebbline.plan/1"}', { maxSchemaVersion: 3 }))[0]!.message).toMatch(
      /not an Ebbline backup/,
    );
  });

  it('one changed character anywhere in the content', () => {
    const edited = good.replace('-205000', '-205001');
    expect(edited).not.toBe(good);
    expect(problemsOf(parseBackup(edited, { maxSchemaVersion: 3 }))).toEqual([
      {
        path: '$.checksum.value',
        message: 'does not match the content: the file was damaged or changed after it was made',
      },
    ]);
    const renamed = good.replace('"Tessellate Ceramics"', '"Tessellate Ceramic"');
    expect(problemsOf(parseBackup(renamed, { maxSchemaVersion: 3 }))[0]!.path).toBe('$.checksum.value');
  });

  it('a newer workspace schema or backup schema: update the app', () => {
    const newer = createBackup(sampleTables(), { ...meta, schemaVersion: 4 });
    expect(problemsOf(parseBackup(newer, { maxSchemaVersion: 3 }))).toEqual([
      {
        path: '$.schemaVersion',
        message: 'is 4, this app knows up to 3: made by a newer version of Ebbline; update the app to restore it',
      },
    ]);
    expect(parseBackup(newer, { maxSchemaVersion: 4 }).ok).toBe(true);
    const later = good.replace('"ebbline.backup/1"', '"ebbline.backup/2"');
    expect(problemsOf(parseBackup(later, { maxSchemaVersion: 3 }))[0]!.message).toMatch(
      /newer version of Ebbline; update the app/,
    );
  });

  it('missing tables, wrong types and unknown tables, each with its path', () => {
    const doc = JSON.parse(good);
    delete doc.tables.anchors;
    doc.tables.settings = { key: 'x' };
    doc.tables.transactions[1] = 'not a record';
    doc.tables.somethingNew = [];
    doc.checksum.value = 'ABC';
    const problems = problemsOf(parseBackup(JSON.stringify(doc), { maxSchemaVersion: 3 }));
    expect(problems.map((p) => p.path)).toEqual([
      '$.checksum.value',
      '$.tables.transactions[1]',
      '$.tables.anchors',
      '$.tables.settings',
      '$.tables.somethingNew',
    ]);
  });

  it('numbers too large to be kept exactly', () => {
    // 2^53 + 1 in a hand-edited file is read as 2^53 by JSON.parse: its value is already lost.
    const text = good.replace(String(Number.MAX_SAFE_INTEGER), '9007199254740993');
    expect(text).not.toBe(good);
    expect(problemsOf(parseBackup(text, { maxSchemaVersion: 3 }))).toEqual([
      {
        path: '$.tables.transactions[1].amount',
        message: '9007199254740992 is too large to be kept exactly (limit ±9007199254740991)',
      },
    ]);
  });

  it('accepts a UTF-8 byte-order mark and lists at most 50 problems', () => {
    expect(parseBackup('\uFEFF' + good, { maxSchemaVersion: 3 }).ok).toBe(true);
    const doc = JSON.parse(good);
    doc.tables.transactions = Array.from({ length: 80 }, () => 1);
    const problems = problemsOf(parseBackup(JSON.stringify(doc), { maxSchemaVersion: 3 }));
    expect(problems).toHaveLength(51);
    expect(problems[50]!.message).toMatch(/and \d+ more problems/);
  });
});

describe('round trip, property', () => {
  it('any tables of JSON records come back deep-equal', () => {
    const scalar = fc.oneof(
      // Any code point (astral ones and lone surrogates included); cheaper than unit 'binary'.
      fc.string({ unit: fc.integer({ min: 0, max: 0x10ffff }).map((cp) => String.fromCodePoint(cp)), maxLength: 6 }),
      fc.integer({ min: Number.MIN_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER }),
      fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e15, max: 1e15 }).map((x) => (x === 0 ? 0 : x)),
      fc.boolean(),
      fc.constant(null),
    );
    const value = fc.letrec<{ v: unknown }>((tie) => ({
      v: fc.oneof(
        { depthSize: 'small' },
        scalar,
        fc.array(tie('v'), { maxLength: 4 }),
        fc.dictionary(fc.string({ maxLength: 6 }), tie('v'), { maxKeys: 3 }),
      ),
    })).v;
    const record = fc.dictionary(fc.string({ maxLength: 6 }), value, { maxKeys: 4 });
    const tables = fc.record(Object.fromEntries(BACKUP_TABLES.map((t) => [t, fc.array(record, { maxLength: 3 })])));
    fc.assert(
      fc.property(tables, (t) => {
        const r = parseBackup(createBackup(t as BackupTables, meta), { maxSchemaVersion: 3 });
        expect(r.ok).toBe(true);
        if (r.ok) expect(r.backup.tables).toEqual(t);
      }),
      { numRuns: 60, seed: 20261102 },
    );
  });
});
