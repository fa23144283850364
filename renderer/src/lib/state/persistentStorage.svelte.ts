/**
 * Asks the browser to keep Ebbline's data (`navigator.storage.persist()`, Storage Standard
 * §4.4) and says in one line what it answered. Without persistence a browser may clear the
 * data when the disk runs low; the status line says so plainly.
 */

export type PersistenceStatus = 'checking' | 'persistent' | 'best-effort' | 'unsupported';

/** The navigator.storage subset used here (injectable for tests). */
export interface StorageManagerLike {
  persisted?(): Promise<boolean>;
  persist?(): Promise<boolean>;
  estimate?(): Promise<{ usage?: number; quota?: number }>;
}

function megabytes(bytes: number): string {
  return bytes >= 1e9 ? `${(bytes / 1e9).toFixed(1)} GB` : `${Math.max(0.1, bytes / 1e6).toFixed(1)} MB`;
}

export class PersistentStorage {
  #manager: StorageManagerLike | undefined;
  #status = $state<PersistenceStatus>('checking');
  #usage = $state<{ usage: number; quota: number } | null>(null);

  constructor(manager?: StorageManagerLike) {
    this.#manager = manager ?? (typeof navigator === 'undefined' ? undefined : navigator.storage);
  }

  get status(): PersistenceStatus {
    return this.#status;
  }

  /** The status line. */
  get text(): string {
    const used = this.#usage
      ? ` Using ${megabytes(this.#usage.usage)} of ${megabytes(this.#usage.quota)} available.`
      : '';
    switch (this.#status) {
      case 'checking':
        return 'Storage: checking…';
      case 'persistent':
        return `Storage: kept on this computer until you delete it.${used}`;
      case 'best-effort':
        return `Storage: the browser did not grant persistent storage, so it may clear Ebbline's data when the disk runs low. Keep your statement files.${used}`;
      case 'unsupported':
        return "Storage: this browser cannot promise to keep Ebbline's data; keep your statement files.";
    }
  }

  /** Asks once for persistent storage (a no-op when already granted). */
  async request(): Promise<PersistenceStatus> {
    const m = this.#manager;
    if (!m?.persist) {
      this.#status = 'unsupported';
      return this.#status;
    }
    try {
      const already = (await m.persisted?.()) ?? false;
      const granted = already || (await m.persist());
      this.#status = granted ? 'persistent' : 'best-effort';
    } catch {
      this.#status = 'best-effort';
    }
    await this.refreshUsage();
    return this.#status;
  }

  /** Re-reads how much storage is used (after an import). */
  async refreshUsage(): Promise<void> {
    try {
      const e = await this.#manager?.estimate?.();
      if (e && typeof e.usage === 'number' && typeof e.quota === 'number')
        this.#usage = { usage: e.usage, quota: e.quota };
    } catch {
      // An estimate is a courtesy; leave it out.
    }
  }
}
