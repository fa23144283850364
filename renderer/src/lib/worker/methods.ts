/**
 * The engine methods the worker offers. Each one takes plain data and a context for
 * progress, and returns plain data. They run inside the worker, never on the window's
 * thread.
 *
 * Methods that need the ledger take the stored files (`StoredFiles`: the workspace's import
 * results in import order) and rebuild it with `buildLedger`, exactly as the CLI does for
 * the same files. The worker keeps the last stored files and their ledger by revision, so
 * the window sends the files (a structured clone of every entry) only when the worker does
 * not have them: a call with `{ revision }` alone fails with code `STORED_FILES_NEEDED`,
 * and the caller repeats it with the files. The Outlook and Patterns methods live in
 * ./analysisMethods.ts and are spread in here.
 *
 * Imports are relative, not `@engine/…`, so Vitest (which has no aliases) can load this file.
 */
import { importStatement, type UnreadableFile } from '../../../../engine/import/registry';
import { detectCsvLayout, type CsvLayoutDetection } from '../../../../engine/import/csv';
import { declaredEncoding, decodeStatementBytes } from '../../../../engine/import/decode';
import type { ImportOptions, ImportResult } from '../../../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../../../engine/ledger/buildLedger';
import type { SeriesScope } from '../../../../engine/ledger/dailySeries';
import type { Ledger } from '../../../../engine/ledger/types';
import { historyFromLedger, type ForecastHistory } from '../../../../engine/forecast/history';
import { detectRecurringFlows, type DetectedRecurringFlow } from '../../../../engine/recurring/detectRecurringFlows';
import { analysisMethods } from './analysisMethods';
import { scenarioMethods } from './scenarioMethods';
import { contentHash } from './contentHash';
import type { MethodContext } from './protocol';

export interface ImportFileInput {
  readonly name: string;
  readonly bytes: Uint8Array;
  readonly options?: Omit<ImportOptions, 'fileName'>;
}

/** One file as read: the importer's result, plus the CSV layout evidence for a mapping preview. */
export interface ParsedFile {
  readonly name: string;
  readonly size: number;
  /** SHA-256 of the bytes (hex). */
  readonly contentHash: string;
  readonly result: ImportResult | UnreadableFile;
  /** For CSV files: what detection decided (columns, date format, separators, sign style). */
  readonly csv?: CsvLayoutDetection;
}

/** Recurring flows of one currency scope and the history they were found in. */
export interface RecurringFlowsResult {
  readonly currency: string;
  readonly start: string;
  readonly asOf: string;
  readonly flows: readonly DetectedRecurringFlow[];
}

/**
 * The workspace's stored files as a method parameter: `revision` names them (it changes
 * whenever a file is added or removed); `files` may be left out when the worker has them.
 */
export interface StoredFiles {
  readonly revision: string;
  readonly files?: readonly LedgerInputFile[];
}

/** Error code of a call whose stored files the worker does not have (send them). */
export const STORED_FILES_NEEDED = 'STORED_FILES_NEEDED';

let kept: { revision: string; files: readonly LedgerInputFile[]; ledger: Ledger | null } | null = null;

function storedFiles(stored: StoredFiles): readonly LedgerInputFile[] {
  if (stored.files) {
    if (kept?.revision !== stored.revision) kept = { revision: stored.revision, files: stored.files, ledger: null };
    return stored.files;
  }
  if (kept?.revision === stored.revision) return kept.files;
  throw Object.assign(new Error('the engine needs the stored files again'), { code: STORED_FILES_NEEDED });
}

function storedLedger(stored: StoredFiles, context: MethodContext): Ledger {
  const files = storedFiles(stored);
  if (kept?.revision === stored.revision && kept.ledger) return kept.ledger;
  context.progress(0, 'Building the ledger');
  const ledger = buildLedger(files);
  if (kept?.revision === stored.revision) kept.ledger = ledger;
  return ledger;
}

export const engineMethods = {
  ...analysisMethods,
  ...scenarioMethods,

  /** Parses statement files; the caller decides whether to store them (all or nothing). */
  async parseStatements(params: { files: readonly ImportFileInput[] }, context: MethodContext): Promise<ParsedFile[]> {
    const results: ParsedFile[] = [];
    const total = params.files.reduce((sum, f) => sum + f.bytes.length, 0) || 1;
    let done = 0;
    for (const f of params.files) {
      context.progress(done / total, `Reading ${f.name}`);
      const options: ImportOptions = { ...f.options, fileName: f.name };
      const result = importStatement(f.bytes, options);
      let csv: CsvLayoutDetection | undefined;
      if (result.format === 'csv') {
        const { text } = decodeStatementBytes(f.bytes, declaredEncoding(f.bytes));
        csv = detectCsvLayout(text, options);
      }
      results.push({
        name: f.name,
        size: f.bytes.length,
        contentHash: await contentHash(f.bytes),
        result,
        ...(csv ? { csv } : {}),
      });
      done += f.bytes.length;
    }
    context.progress(1, 'Read all files');
    return results;
  },

  /**
   * The ledger of the stored files followed by `extra` files (an import's new files), in
   * that order, or of `files` when given instead (the CLI's `buildLedger`).
   */
  async buildLedger(
    params: { stored?: StoredFiles; extra?: readonly LedgerInputFile[]; files?: readonly LedgerInputFile[] },
    context: MethodContext,
  ): Promise<Ledger> {
    let ledger: Ledger;
    if (params.files) {
      context.progress(0, 'Building the ledger');
      ledger = buildLedger(params.files);
    } else if (params.stored && (params.extra?.length ?? 0) === 0) {
      ledger = storedLedger(params.stored, context);
    } else {
      const base = params.stored ? storedFiles(params.stored) : [];
      context.progress(0, 'Building the ledger');
      ledger = buildLedger([...base, ...(params.extra ?? [])]);
    }
    context.progress(1, 'Ledger built');
    return ledger;
  },

  /**
   * The forecast history of a scope (engine/forecast/history.ts), built from the stored
   * files through `buildLedger` + `historyFromLedger`, as the CLI does.
   */
  async forecastHistory(
    params: { stored: StoredFiles; scope: SeriesScope; asOf?: string },
    context: MethodContext,
  ): Promise<ForecastHistory> {
    const ledger = storedLedger(params.stored, context);
    context.progress(0.6, 'Collecting the history');
    const history = historyFromLedger(ledger, params.scope, params.asOf);
    context.progress(1, 'History ready');
    return history;
  },

  /** Recurring flows of a scope, detected exactly as the forecast detects them. */
  async recurringFlows(
    params: { stored: StoredFiles; scope: SeriesScope },
    context: MethodContext,
  ): Promise<RecurringFlowsResult> {
    const ledger = storedLedger(params.stored, context);
    context.progress(0.4, 'Collecting the history');
    const history = historyFromLedger(ledger, params.scope);
    context.progress(0.6, 'Finding recurring flows');
    const flows = detectRecurringFlows(
      history.entries.map((e) => ({
        id: e.id,
        date: e.date,
        amount: e.amount,
        description: e.description,
        counterparty: e.counterparty,
      })),
      { asOf: history.asOf },
    );
    context.progress(1, 'Recurring flows found');
    return { currency: history.currency, start: history.start, asOf: history.asOf, flows };
  },
};

export type EngineMethods = {
  [K in keyof typeof engineMethods]: (
    params: Parameters<(typeof engineMethods)[K]>[0],
  ) => ReturnType<(typeof engineMethods)[K]>;
};
