/**
 * One import, from picked files to stored rows: read every file in the worker (progress,
 * Cancel), show a preview (format, account, period, entries, duplicates, balances,
 * problems; the CSV mapping with controls to correct it), then store everything in one
 * transaction. Files with errors are listed problem by problem and nothing is stored while
 * any included file has one. The preview's ledger is built over every stored file plus the
 * new ones, so what is stored is exactly the CLI's ledger of the same files.
 */
import { formatProblem } from '../../../../engine/cli/formatProblem';
import { hasErrors, type ImportResult } from '../../../../engine/import/types';
import type { FileAccountReport, Ledger, LedgerAccount } from '../../../../engine/ledger/types';
import type { CsvMapping } from '../../../../engine/import/csv';
import { newStatementRecord, WorkspaceChangedError, type FileToStore } from '../db/applyLedgerChange';
import type { CsvMappingRecord, StatementImportOptions, StatementRecord } from '../db/records';
import type { PickedFile } from '../host/hostBridge';
import { uniqueFileName } from '../import/uniqueFileName';
import { CancelledError, engineClient, type EngineClient } from '../worker/engineClient';
import type { ParsedFile } from '../worker/methods';
import type { WorkspaceState } from './workspace.svelte';

export type ImportPhase = 'idle' | 'reading' | 'preview' | 'storing';

/** Where a CSV file's mapping came from. */
export type MappingSource = 'detected' | 'remembered' | 'edited';

export interface PendingFile {
  /** Stable key within the session. */
  readonly key: number;
  /** Name the user's file had. */
  readonly originalName: string;
  /** Name it is stored and reported under (unique in the workspace). */
  readonly name: string;
  readonly bytes: Uint8Array;
  readonly options: StatementImportOptions;
  readonly mappingSource: MappingSource;
  readonly parsed: ParsedFile;
  /** A stored file with the same content (this one is left out). */
  readonly sameAsStored: StatementRecord | null;
  /** An earlier file of this batch with the same content (this one is left out). */
  readonly sameAsInBatch: string | null;
  /** Left out by the user. */
  readonly leftOut: boolean;
}

/** One row of a file's preview: what it contributes to one account. */
export interface PreviewAccountRow extends FileAccountReport {
  readonly label: string;
  readonly name: string;
}

export interface LedgerPreview {
  readonly ledger: Ledger;
  readonly basedOn: readonly string[];
  readonly nextSeq: number;
  readonly byFile: ReadonlyMap<string, readonly PreviewAccountRow[]>;
}

function accountLabel(a: LedgerAccount): string {
  return a.identifiers[0] ?? a.name;
}

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;
}

/** Strips Svelte proxies and undefined fields so options clone across the worker boundary. */
function plainOptions(options: StatementImportOptions): StatementImportOptions {
  return JSON.parse(JSON.stringify(options)) as StatementImportOptions;
}

export class ImportSession {
  #workspace: WorkspaceState;
  #engine: Pick<EngineClient, 'call'> | undefined;

  #phase = $state<ImportPhase>('idle');
  #progress = $state({ share: 0, label: '' });
  #files = $state.raw<PendingFile[]>([]);
  #preview = $state.raw<LedgerPreview | null>(null);
  #ledgerError = $state<string | null>(null);
  #storeError = $state<string | null>(null);
  #message = $state<string | null>(null);
  #controller: AbortController | null = null;
  #nextKey = 1;
  /** The workspace the files in the preview belong to. */
  #workspaceId = $state<string | null>(null);

  #included = $derived(this.#files.filter((f) => !f.leftOut && !f.sameAsStored && !f.sameAsInBatch));
  #problemLines = $derived(
    this.#included.flatMap((f) => f.parsed.result.problems.filter((p) => p.severity === 'error').map(formatProblem)),
  );

  constructor(workspace: WorkspaceState, engine?: Pick<EngineClient, 'call'>) {
    this.#workspace = workspace;
    this.#engine = engine;
  }

  get phase(): ImportPhase {
    return this.#phase;
  }
  get progress(): { readonly share: number; readonly label: string } {
    return this.#progress;
  }
  get files(): readonly PendingFile[] {
    return this.#files;
  }
  /** The workspace the files being read or previewed belong to. */
  get workspaceId(): string | null {
    return this.#workspaceId;
  }
  /** Files that would be stored. */
  get included(): readonly PendingFile[] {
    return this.#included;
  }
  /** Every error of the included files as `FILE:LINE: message` / `FILE: element PATH: message`. */
  get problemLines(): readonly string[] {
    return this.#problemLines;
  }
  get preview(): LedgerPreview | null {
    return this.#preview;
  }
  /** Why the files, though each reads cleanly, cannot build a ledger together. */
  get ledgerError(): string | null {
    return this.#ledgerError;
  }
  /** Why storing failed (nothing was stored); the preview and its choices are kept. */
  get storeError(): string | null {
    return this.#storeError;
  }
  /** The outcome of the last import or cancel, for the status line. */
  get message(): string | null {
    return this.#message;
  }
  get busy(): boolean {
    return this.#phase === 'reading' || this.#phase === 'storing';
  }
  get canConfirm(): boolean {
    return (
      this.#phase === 'preview' &&
      this.#included.length > 0 &&
      this.#problemLines.length === 0 &&
      this.#preview !== null &&
      this.#ledgerError === null
    );
  }

  #client(): Pick<EngineClient, 'call'> {
    this.#engine ??= engineClient();
    return this.#engine;
  }

  #onProgress = (share: number, label: string): void => {
    this.#progress = { share, label };
  };

  /**
   * Reads `picked` (added to the files already in the preview) and shows the preview.
   * With `autoConfirm` (the demo), stores at once when nothing is wrong.
   */
  async add(picked: readonly PickedFile[], options: { autoConfirm?: boolean } = {}): Promise<void> {
    if (picked.length === 0 || this.busy) return;
    if (!this.#workspace.db) {
      this.#message = 'Open or create a workspace first, then import its statements.';
      return;
    }
    if (this.#files.length > 0 && this.#workspaceId !== this.#workspace.currentId) this.#reset();
    this.#workspaceId = this.#workspace.currentId;
    this.#message = null;
    this.#storeError = null;
    this.#phase = 'reading';
    this.#progress = { share: 0, label: 'Reading files' };
    const controller = new AbortController();
    this.#controller = controller;
    try {
      const remembered = await this.#workspace.csvMappings();
      const taken = new Set([...this.#workspace.statements.map((s) => s.fileName), ...this.#files.map((f) => f.name)]);
      const names = picked.map((p) => {
        const name = uniqueFileName(p.name, taken);
        taken.add(name);
        return name;
      });
      const parsed = await this.#client().call(
        'parseStatements',
        { files: picked.map((p, i) => ({ name: names[i] as string, bytes: p.bytes })) },
        { signal: controller.signal, onProgress: this.#onProgress },
      );
      const added: PendingFile[] = [];
      for (let i = 0; i < parsed.length; i++) {
        let file = parsed[i] as ParsedFile;
        let fileOptions: StatementImportOptions = {};
        let source: MappingSource = 'detected';
        const memory = file.csv?.fingerprint ? remembered.get(file.csv.fingerprint) : undefined;
        if (memory) {
          fileOptions = {
            csvMapping: memory.mapping,
            ...(memory.currency ? { currency: memory.currency } : {}),
            ...(memory.account ? { account: memory.account } : {}),
          };
          source = 'remembered';
          const [again] = await this.#client().call(
            'parseStatements',
            {
              files: [{ name: file.name, bytes: (picked[i] as PickedFile).bytes, options: plainOptions(fileOptions) }],
            },
            { signal: controller.signal },
          );
          if (again) file = again;
        }
        added.push({
          key: this.#nextKey++,
          originalName: (picked[i] as PickedFile).name,
          name: file.name,
          bytes: (picked[i] as PickedFile).bytes,
          options: fileOptions,
          mappingSource: source,
          parsed: file,
          sameAsStored: null,
          sameAsInBatch: null,
          leftOut: false,
        });
      }
      this.#files = this.#markSameContent([...this.#files, ...added]);
      await this.#buildPreview(controller.signal);
      this.#phase = 'preview';
      if (options.autoConfirm && this.canConfirm) await this.confirm();
    } catch (error) {
      this.#failRead(error);
    } finally {
      if (this.#controller === controller) this.#controller = null;
    }
  }

  #failRead(error: unknown): void {
    if (error instanceof CancelledError) {
      this.#reset();
      this.#message = 'Import cancelled. Nothing was stored.';
      return;
    }
    this.#phase = this.#files.length > 0 ? 'preview' : 'idle';
    this.#ledgerError = (error as Error).message;
  }

  #markSameContent(files: PendingFile[]): PendingFile[] {
    const stored = new Map(this.#workspace.statements.map((s) => [s.contentHash, s]));
    const seen = new Map<string, string>();
    return files.map((f) => {
      const hash = f.parsed.contentHash;
      const sameAsStored = stored.get(hash) ?? null;
      const sameAsInBatch = seen.get(hash) ?? null;
      if (!seen.has(hash)) seen.set(hash, f.name);
      return { ...f, sameAsStored, sameAsInBatch: sameAsInBatch === f.name ? null : sameAsInBatch };
    });
  }

  async #buildPreview(signal?: AbortSignal): Promise<void> {
    this.#preview = null;
    this.#ledgerError = null;
    const included = this.#included;
    if (included.length === 0 || included.some((f) => hasErrors(f.parsed.result))) return;
    const extra = included.map((f) => ({ file: f.name, result: f.parsed.result as ImportResult }));
    this.#progress = { share: 0.9, label: 'Matching accounts and removing duplicates' };
    try {
      const { value: ledger, ids } = await this.#workspace.withStoredFiles((stored) =>
        this.#client().call('buildLedger', { stored, extra }, { signal, onProgress: this.#onProgress }),
      );
      const accounts = new Map(ledger.accounts.map((a) => [a.id, a]));
      const byFile = new Map<string, PreviewAccountRow[]>();
      for (const report of ledger.files) {
        byFile.set(
          report.file,
          report.accounts.map((a) => {
            const account = accounts.get(a.accountId);
            return { ...a, label: account ? accountLabel(account) : a.accountId, name: account?.name ?? a.accountId };
          }),
        );
      }
      const nextSeq = this.#workspace.statements.reduce((m, r) => Math.max(m, r.seq), 0) + 1;
      this.#preview = { ledger, basedOn: ids, nextSeq, byFile };
    } catch (error) {
      if (error instanceof CancelledError) throw error;
      this.#ledgerError = `These files cannot be put together: ${(error as Error).message}`;
    }
  }

  /** Reads one file again with other options (CSV mapping, currency, account name). */
  async reread(key: number, options: StatementImportOptions, source: MappingSource = 'edited'): Promise<void> {
    const file = this.#files.find((f) => f.key === key);
    if (!file || this.busy) return;
    this.#phase = 'reading';
    this.#storeError = null;
    this.#progress = { share: 0, label: `Reading ${file.name} again` };
    const controller = new AbortController();
    this.#controller = controller;
    try {
      const clean = plainOptions(options);
      const [parsed] = await this.#client().call(
        'parseStatements',
        { files: [{ name: file.name, bytes: file.bytes, options: clean }] },
        { signal: controller.signal, onProgress: this.#onProgress },
      );
      if (!parsed) throw new Error('the engine returned nothing');
      this.#files = this.#files.map((f) =>
        f.key === key ? { ...f, parsed, options: clean, mappingSource: source } : f,
      );
      await this.#buildPreview(controller.signal);
      this.#phase = 'preview';
    } catch (error) {
      this.#failRead(error);
    } finally {
      if (this.#controller === controller) this.#controller = null;
    }
  }

  /** Leaves a file out of (or takes it back into) this import. */
  async setLeftOut(key: number, leftOut: boolean): Promise<void> {
    if (this.busy) return;
    this.#files = this.#markSameContent(this.#files.map((f) => (f.key === key ? { ...f, leftOut } : f)));
    this.#phase = 'reading';
    try {
      await this.#buildPreview();
    } finally {
      this.#phase = this.#files.length > 0 ? 'preview' : 'idle';
    }
  }

  /** Cancels reading (nothing is stored), or discards the preview. */
  cancel(): void {
    if (this.#phase === 'reading') {
      this.#controller?.abort();
      return;
    }
    if (this.#phase === 'preview') {
      this.#reset();
      this.#message = 'Import discarded. Nothing was stored.';
    }
  }

  #reset(): void {
    this.#files = [];
    this.#preview = null;
    this.#ledgerError = null;
    this.#storeError = null;
    this.#phase = 'idle';
    this.#progress = { share: 0, label: '' };
  }

  /**
   * Stores the included files and the rebuilt ledger in one transaction. On failure
   * nothing is stored and the preview, with every choice made in it, stays.
   */
  async confirm(): Promise<void> {
    const preview = this.#preview;
    if (!this.canConfirm || !preview) return;
    if (this.#workspaceId !== this.#workspace.currentId) {
      this.#reset();
      this.#message = 'Another workspace was opened meanwhile, so nothing was stored. Import the files again.';
      return;
    }
    this.#phase = 'storing';
    this.#storeError = null;
    this.#progress = { share: 0.95, label: 'Storing' };
    const now = new Date().toISOString();
    const included = this.#included;
    const add: FileToStore[] = included.map((f, i) => {
      const result = f.parsed.result as ImportResult;
      return {
        result,
        record: newStatementRecord({
          id: newId(),
          fileName: f.name,
          format: result.format,
          importedAt: now,
          seq: preview.nextSeq + i,
          size: f.parsed.size,
          contentHash: f.parsed.contentHash,
          options: f.options,
        }),
      };
    });
    const csvMappings: CsvMappingRecord[] = [];
    for (const f of included) {
      const fingerprint = f.parsed.csv?.fingerprint;
      if (!fingerprint || f.mappingSource !== 'edited') continue;
      const mapping = f.options.csvMapping ?? (f.parsed.csv?.mapping as CsvMapping | undefined);
      if (!mapping) continue;
      csvMappings.push({
        fingerprint,
        mapping,
        ...(f.options.currency ? { currency: f.options.currency } : {}),
        ...(f.options.account ? { account: f.options.account } : {}),
        savedAt: now,
      });
    }
    try {
      await this.#workspace.applyChange({
        basedOn: preview.basedOn,
        add,
        remove: [],
        ledger: preview.ledger,
        csvMappings,
      });
      const entries = add.reduce(
        (n, f) => n + (preview.byFile.get(f.record.fileName) ?? []).reduce((m, a) => m + a.entries, 0),
        0,
      );
      const duplicates = add.reduce(
        (n, f) => n + (preview.byFile.get(f.record.fileName) ?? []).reduce((m, a) => m + a.duplicates, 0),
        0,
      );
      const skipped = this.#files.length - included.length;
      this.#reset();
      this.#message =
        `Stored ${add.length} file${add.length === 1 ? '' : 's'}: ${entries.toLocaleString()} entr${entries === 1 ? 'y' : 'ies'}` +
        (duplicates > 0 ? `, ${duplicates.toLocaleString()} duplicate${duplicates === 1 ? '' : 's'} left out` : '') +
        (skipped > 0 ? `; ${skipped} file${skipped === 1 ? '' : 's'} not imported` : '') +
        '.';
    } catch (error) {
      this.#phase = 'preview';
      if (error instanceof WorkspaceChangedError) {
        this.#storeError = error.message;
        await this.#buildPreview().catch(() => undefined);
      } else {
        this.#storeError = (error as Error).message;
      }
    }
  }

  /** Clears the status message. */
  dismissMessage(): void {
    this.#message = null;
  }
}
