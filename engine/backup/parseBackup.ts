/**
 * Reads a workspace backup file and refuses it as a whole when anything is wrong, before
 * anything is written: the app restores only from `{ ok: true }`. Pure: it reads the text
 * and returns data, nothing else.
 *
 * Refused: text that is not JSON, a document that is not `ebbline.backup/1`, one made by a
 * newer version of Ebbline (a `schemaVersion` above what this app knows, or a later backup
 * schema), missing or unknown tables, tables that are not arrays of JSON objects, numbers
 * too large to be kept exactly, malformed meta, and a checksum that does not match the
 * content (a damaged or edited file). Every problem is listed with its JSON path (at most
 * MAX_PROBLEMS), so the message can say what is wrong, not only that something is.
 */
import { isCalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import {
  BACKUP_SCHEMA,
  BACKUP_TABLES,
  CHECKSUM_ALGORITHM,
  type Backup,
  type BackupProblem,
  type BackupTableOptions,
  type BackupTables,
} from './backupFormat';
import { canonicalJson, childPath, unstorable } from './canonicalJson';
import { sha256Hex } from './sha256';

/** Most problems listed; a note says how many more there were. */
export const MAX_PROBLEMS = 50;

export type BackupParse =
  { readonly ok: true; readonly backup: Backup } | { readonly ok: false; readonly problems: readonly BackupProblem[] };

export interface ParseBackupOptions extends BackupTableOptions {
  /** The newest workspace database schema version this app can restore. */
  readonly maxSchemaVersion: number;
}

const NEWER = 'made by a newer version of Ebbline; update the app to restore it';

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** Collects values JSON.parse gave but that cannot be kept exactly (numbers beyond 2^53). */
function checkValues(value: unknown, path: string, add: (path: string, message: string) => boolean): boolean {
  if (typeof value === 'number') {
    const problem = unstorable(value);
    return problem ? add(path, problem) : true;
  }
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) if (!checkValues(value[i], childPath(path, i), add)) return false;
  } else if (isRecord(value)) {
    for (const k of Object.keys(value)) if (!checkValues(value[k], childPath(path, k), add)) return false;
  }
  return true;
}

/**
 * @throws EngineError INVALID_ARGUMENT when maxSchemaVersion is not a whole number ≥ 1
 *   (a programming error, not a damaged file).
 * @example
 * const r = parseBackup(text, { maxSchemaVersion: 3 });
 * if (!r.ok) showProblems(r.problems); else restore(r.backup.tables);
 * Complexity: O(size) to parse, check and hash.
 */
export function parseBackup(text: string, options: ParseBackupOptions): BackupParse {
  if (!Number.isSafeInteger(options.maxSchemaVersion) || options.maxSchemaVersion < 1) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `maxSchemaVersion must be a whole number ≥ 1, got ${options.maxSchemaVersion}`,
    );
  }
  const problems: BackupProblem[] = [];
  let more = 0;
  const add = (path: string, message: string): boolean => {
    if (problems.length < MAX_PROBLEMS) problems.push({ path, message });
    else more++;
    return problems.length < MAX_PROBLEMS;
  };
  const refuse = (): BackupParse => ({
    ok: false,
    problems: more > 0 ? [...problems, { path: '$', message: `and ${more} more problems` }] : problems,
  });

  let doc: unknown;
  try {
    doc = JSON.parse(typeof text === 'string' ? text.replace(/^\uFEFF/, '') : '');
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    add('$', `the file is damaged or not a backup: it is not valid JSON (${detail})`);
    return refuse();
  }
  if (!isRecord(doc)) {
    add('$', `expected a JSON object with "schema": "${BACKUP_SCHEMA}"`);
    return refuse();
  }
  if (doc.schema !== BACKUP_SCHEMA) {
    const later = typeof doc.schema === 'string' && /^ebbline\.backup\/\d+$/.test(doc.schema);
    add(
      '$.schema',
      later
        ? `is ${JSON.stringify(doc.schema)}: ${NEWER}`
        : `found ${JSON.stringify(doc.schema)}, expected "${BACKUP_SCHEMA}": not an Ebbline backup`,
    );
    return refuse();
  }
  const version = doc.schemaVersion;
  if (!Number.isSafeInteger(version) || (version as number) < 1) {
    add('$.schemaVersion', `found ${JSON.stringify(version)}, expected a whole number ≥ 1`);
  } else if ((version as number) > options.maxSchemaVersion) {
    add('$.schemaVersion', `is ${version as number}, this app knows up to ${options.maxSchemaVersion}: ${NEWER}`);
    return refuse();
  }
  if (typeof doc.createdOn !== 'string' || !isCalendarDate(doc.createdOn)) {
    add('$.createdOn', `found ${JSON.stringify(doc.createdOn)}, expected a calendar date YYYY-MM-DD`);
  }
  if (typeof doc.workspace !== 'string') add('$.workspace', `found ${JSON.stringify(doc.workspace)}, expected text`);
  if (doc.app !== undefined && typeof doc.app !== 'string')
    add('$.app', `found ${JSON.stringify(doc.app)}, expected text`);

  const checksum = doc.checksum;
  let stated: string | null = null;
  if (!isRecord(checksum) || checksum.algorithm !== CHECKSUM_ALGORITHM) {
    add('$.checksum', `expected { "algorithm": "${CHECKSUM_ALGORITHM}", "value": "<64 hex digits>" }`);
  } else if (typeof checksum.value !== 'string' || !/^[0-9a-f]{64}$/.test(checksum.value)) {
    add('$.checksum.value', 'expected 64 lower-case hex digits');
  } else stated = checksum.value;

  const names = options.tables ?? BACKUP_TABLES;
  const tables = doc.tables;
  if (!isRecord(tables)) {
    add('$.tables', 'expected an object with one array of records per table');
  } else {
    const known = new Set(names);
    for (const name of names) {
      const path = childPath('$.tables', name);
      const records = tables[name];
      if (records === undefined) {
        add(path, 'is missing: the file is incomplete');
        continue;
      }
      if (!Array.isArray(records)) {
        add(path, `expected an array of records, found ${records === null ? 'null' : typeof records}`);
        continue;
      }
      for (let i = 0; i < records.length; i++) {
        const r: unknown = records[i];
        if (!isRecord(r)) {
          if (
            !add(
              childPath(path, i),
              `expected a record (a JSON object), found ${Array.isArray(r) ? 'an array' : r === null ? 'null' : typeof r}`,
            )
          )
            break;
        } else if (!checkValues(r, childPath(path, i), add)) break;
      }
    }
    for (const name of Object.keys(tables)) {
      if (!known.has(name)) add(childPath('$.tables', name), 'is not a table this version of Ebbline knows');
    }
  }

  if (stated !== null) {
    const { checksum: _ignored, ...content } = doc;
    let actual: string | null;
    try {
      actual = sha256Hex(canonicalJson(content));
    } catch {
      actual = null; // an unstorable value, already reported above
    }
    if (actual !== null && actual !== stated) {
      add('$.checksum.value', 'does not match the content: the file was damaged or changed after it was made');
    }
  }
  if (problems.length > 0) return refuse();
  const backup: Backup = {
    schema: BACKUP_SCHEMA,
    schemaVersion: version as number,
    createdOn: doc.createdOn as string,
    workspace: doc.workspace as string,
    ...(doc.app !== undefined ? { app: doc.app as string } : {}),
    checksum: stated as string,
    tables: tables as BackupTables,
  };
  return { ok: true, backup };
}
