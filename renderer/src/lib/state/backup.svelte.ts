/**
 * The backup panel's state: export the open workspace as one `ebbline.backup/1` file, and
 * restore a file as a NEW workspace after the person has seen what it will create. A
 * damaged or newer file is refused with the reason and changes nothing. The rules live in
 * components/backup/workspaceBackup.ts (tested with fake-indexeddb); this class adds the
 * steps, the messages and the host's file dialogs.
 */
import { RegistryDb } from '../db/WorkspaceDb';
import type { Backup, BackupProblem } from '@engine/backup/backupFormat';
import {
  checkBackupFile,
  describeContents,
  exportWorkspace,
  restoreAsNewWorkspace,
} from '../../components/backup/workspaceBackup';
import { storageError } from '../db/applyLedgerChange';
import type { HostBridge, PickedFile } from '../host/hostBridge';
import type { WorkspaceState } from './workspace.svelte';

export type BackupStep = 'idle' | 'exporting' | 'checking' | 'confirm' | 'restoring';

/** A checked file waiting for the person's confirmation. */
export interface PendingRestore {
  readonly fileName: string;
  readonly backup: Backup;
  /** What will be created, one phrase per kind of record. */
  readonly contents: readonly string[];
  /** The new workspace's name (free). */
  readonly name: string;
}

export interface BackupStateOptions {
  readonly registry?: RegistryDb;
}

export class BackupState {
  readonly #workspace: WorkspaceState;
  readonly #host: HostBridge;
  #registry: RegistryDb | undefined;

  #step = $state<BackupStep>('idle');
  #message = $state<string | null>(null);
  #error = $state<string | null>(null);
  #problems = $state.raw<readonly BackupProblem[]>([]);
  #pending = $state.raw<PendingRestore | null>(null);

  constructor(workspace: WorkspaceState, host: HostBridge, options: BackupStateOptions = {}) {
    this.#workspace = workspace;
    this.#host = host;
    this.#registry = options.registry;
  }

  get step(): BackupStep {
    return this.#step;
  }
  get busy(): boolean {
    return this.#step === 'exporting' || this.#step === 'checking' || this.#step === 'restoring';
  }
  /** The last success, in words. */
  get message(): string | null {
    return this.#message;
  }
  /** Why the last step failed or a file was refused. */
  get error(): string | null {
    return this.#error;
  }
  /** A refused file's problems with their places in the file. */
  get problems(): readonly BackupProblem[] {
    return this.#problems;
  }
  get pending(): PendingRestore | null {
    return this.#pending;
  }

  #clear(): void {
    this.#message = null;
    this.#error = null;
    this.#problems = [];
  }

  /** Writes the open workspace to a file the person chooses. */
  async exportBackup(): Promise<void> {
    const db = this.#workspace.db;
    const name = this.#workspace.currentName;
    if (!db || !name) {
      this.#error = 'Open a workspace first.';
      return;
    }
    this.#clear();
    this.#step = 'exporting';
    try {
      const file = await exportWorkspace(db, { workspace: name });
      const saved = await this.#host.saveFile(file.fileName, file.text, {
        name: 'Ebbline backup',
        extensions: ['json'],
      });
      if (saved) {
        this.#message = `Backup of “${name}” saved as ${file.fileName}: ${describeContents(file.counts).slice(0, 3).join(', ')} and everything else in it.`;
      }
    } catch (error) {
      this.#error = `The backup was not written: ${(error as Error).message}`;
    } finally {
      this.#step = 'idle';
    }
  }

  /** Asks the host for a file (desktop dialog; in a browser the panel's file input calls checkFile). */
  async chooseFile(): Promise<void> {
    this.#clear();
    const file = await this.#host.pickFile({
      title: 'Restore a workspace backup',
      name: 'Ebbline backup',
      extensions: ['json'],
    });
    if (file) await this.checkFile(file);
  }

  /** Checks a chosen file; on success waits for confirm(). Nothing is written. */
  async checkFile(file: PickedFile): Promise<void> {
    this.#clear();
    this.#pending = null;
    this.#step = 'checking';
    try {
      const check = checkBackupFile(file.bytes, file.name);
      if (!check.ok) {
        this.#error = check.message;
        this.#problems = check.problems;
        return;
      }
      const base = check.backup.workspace.trim() || 'Restored workspace';
      this.#pending = {
        fileName: file.name,
        backup: check.backup,
        contents: describeContents(check.counts),
        name: this.#workspace.freeName(`${base} (restored ${check.backup.createdOn})`),
      };
    } finally {
      this.#step = this.#pending ? 'confirm' : 'idle';
    }
  }

  /** Restores the confirmed file as a new workspace and opens it. */
  async confirm(): Promise<void> {
    const pending = this.#pending;
    if (!pending) return;
    this.#clear();
    this.#step = 'restoring';
    let entry;
    try {
      this.#registry ??= new RegistryDb();
      entry = await restoreAsNewWorkspace(pending.backup, { name: pending.name, registry: this.#registry });
      this.#pending = null;
    } catch (error) {
      this.#error = `Nothing was restored: ${storageError(error).message}`;
      this.#step = 'confirm';
      return;
    }
    const restored = `Restored “${pending.backup.workspace}” from ${pending.fileName} as the new workspace “${entry.name}”`;
    try {
      await this.#workspace.init();
      await this.#workspace.switchTo(entry.id);
      this.#message = `${restored}, now open.`;
    } catch (error) {
      this.#message = `${restored}; open it from the list (${(error as Error).message}).`;
    } finally {
      this.#step = 'idle';
    }
  }

  cancel(): void {
    this.#pending = null;
    this.#step = 'idle';
  }

  dismiss(): void {
    this.#clear();
  }
}
