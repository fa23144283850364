/**
 * Writes a workspace backup (`ebbline.backup/1`, engine/backup/backupFormat.ts) from the
 * workspace's tables. The output is deterministic: the same tables and meta give the same
 * bytes (records with sorted keys, tables in the declared order, one record per line so a
 * large file stays readable and diffable).
 */
import { isCalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import {
  BACKUP_SCHEMA,
  BACKUP_TABLES,
  CHECKSUM_ALGORITHM,
  type BackupMeta,
  type BackupTableOptions,
  type BackupTables,
} from './backupFormat';
import { canonicalJson, childPath, unstorable } from './canonicalJson';
import { sha256Hex } from './sha256';

function checkMeta(meta: BackupMeta): void {
  if (!Number.isSafeInteger(meta.schemaVersion) || meta.schemaVersion < 1) {
    throw new EngineError('INVALID_ARGUMENT', `schemaVersion must be a whole number ≥ 1, got ${meta.schemaVersion}`);
  }
  if (typeof meta.createdOn !== 'string' || !isCalendarDate(meta.createdOn)) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `createdOn must be a calendar date YYYY-MM-DD, got ${String(meta.createdOn)}`,
    );
  }
  if (typeof meta.workspace !== 'string') throw new EngineError('INVALID_ARGUMENT', 'workspace must be text');
  if (meta.app !== undefined && typeof meta.app !== 'string') {
    throw new EngineError('INVALID_ARGUMENT', 'app must be text when given');
  }
}

/**
 * @param tables every table named in `options.tables` (default BACKUP_TABLES), each an
 *   array of plain JSON objects; pass [] for an empty table.
 * @returns the backup file's text.
 * @throws EngineError INVALID_ARGUMENT for a missing or unknown table, a record that is not
 *   a plain object, a value that JSON cannot keep exactly (path named), or bad meta.
 * @example
 * const text = createBackup({ accounts: [], statements: [], statementResults: [], transactions: [],
 *   anchors: [], recurring: [], csvMappings: [], scenarios: [], settings: [] },
 *   { schemaVersion: 3, createdOn: '2026-11-02', workspace: 'Tessellate Ceramics' });
 * Complexity: O(size) to serialise and hash, plus sorting each record's keys.
 */
export function createBackup(tables: BackupTables, meta: BackupMeta, options: BackupTableOptions = {}): string {
  checkMeta(meta);
  const names = options.tables ?? BACKUP_TABLES;
  const known = new Set(names);
  for (const name of Object.keys(tables)) {
    if (!known.has(name)) {
      throw new EngineError('INVALID_ARGUMENT', `"${name}" is not a table of this workspace (${names.join(', ')})`);
    }
  }
  const lines = new Map<string, string[]>();
  for (const name of names) {
    const records = (tables as Record<string, unknown>)[name];
    const path = childPath('$.tables', name);
    if (records === undefined)
      throw new EngineError('INVALID_ARGUMENT', `${path} is missing; pass [] for an empty table`);
    if (!Array.isArray(records)) throw new EngineError('INVALID_ARGUMENT', `${path} must be an array of records`);
    lines.set(
      name,
      records.map((r, i) => {
        const p = childPath(path, i);
        if (r === null || typeof r !== 'object' || Array.isArray(r)) {
          throw new EngineError('INVALID_ARGUMENT', `${p} must be a record (a JSON object)`);
        }
        const problem = unstorable(r);
        if (problem) throw new EngineError('INVALID_ARGUMENT', `${p} ${problem}`);
        return canonicalJson(r, p);
      }),
    );
  }
  // Canonical form of the document without its checksum: members in code-unit order.
  const tablesCanonical =
    '{' +
    [...names]
      .sort()
      .map((n) => `${JSON.stringify(n)}:[${(lines.get(n) as string[]).join(',')}]`)
      .join(',') +
    '}';
  const members: [string, string][] = [
    ['createdOn', JSON.stringify(meta.createdOn)],
    ['schema', JSON.stringify(BACKUP_SCHEMA)],
    ['schemaVersion', JSON.stringify(meta.schemaVersion)],
    ['tables', tablesCanonical],
    ['workspace', JSON.stringify(meta.workspace)],
  ];
  if (meta.app !== undefined) members.unshift(['app', JSON.stringify(meta.app)]);
  const canonical = '{' + members.map(([k, v]) => `${JSON.stringify(k)}:${v}`).join(',') + '}';
  const checksum = sha256Hex(canonical);

  const out: string[] = ['{'];
  out.push(`  "schema": ${JSON.stringify(BACKUP_SCHEMA)},`);
  out.push(`  "schemaVersion": ${JSON.stringify(meta.schemaVersion)},`);
  out.push(`  "createdOn": ${JSON.stringify(meta.createdOn)},`);
  out.push(`  "workspace": ${JSON.stringify(meta.workspace)},`);
  if (meta.app !== undefined) out.push(`  "app": ${JSON.stringify(meta.app)},`);
  out.push(`  "checksum": { "algorithm": ${JSON.stringify(CHECKSUM_ALGORITHM)}, "value": "${checksum}" },`);
  out.push('  "tables": {');
  names.forEach((name, t) => {
    const records = lines.get(name) as string[];
    const comma = t < names.length - 1 ? ',' : '';
    if (records.length === 0) {
      out.push(`    ${JSON.stringify(name)}: []${comma}`);
      return;
    }
    out.push(`    ${JSON.stringify(name)}: [`);
    records.forEach((r, i) => out.push(`      ${r}${i < records.length - 1 ? ',' : ''}`));
    out.push(`    ]${comma}`);
  });
  out.push('  }');
  out.push('}');
  return out.join('\n') + '\n';
}
