/**
 * The window's side of the engine worker: promise-based calls with progress callbacks and
 * cancellation. Cancelling terminates the worker (a running forecast cannot be interrupted
 * any other way without slowing its hot loops) and the next call starts a new one.
 */
import type { MethodName, ParamsOf, ResultOf, WorkerError, WorkerReply } from './protocol';

export class EngineCallError extends Error {
  readonly code: string | undefined;
  constructor(error: WorkerError) {
    super(error.message);
    this.name = 'EngineCallError';
    this.code = error.code;
  }
}

export class CancelledError extends Error {
  constructor() {
    super('cancelled');
    this.name = 'CancelledError';
  }
}

interface Pending {
  resolve(value: unknown): void;
  reject(error: Error): void;
  onProgress?: (share: number, label: string) => void;
}

export interface CallOptions {
  onProgress?: (share: number, label: string) => void;
  signal?: AbortSignal;
}

export class EngineClient {
  #worker: Worker | null = null;
  #nextId = 1;
  #pending = new Map<number, Pending>();

  #ensureWorker(): Worker {
    if (this.#worker) return this.#worker;
    const worker = new Worker(new URL('./engine.worker.ts', import.meta.url), {
      type: 'module',
      name: 'ebbline-engine',
    });
    worker.onmessage = (event: MessageEvent<WorkerReply>) => this.#receive(event.data);
    worker.onerror = (event) => {
      event.preventDefault();
      this.#failAll(new EngineCallError({ message: `the engine stopped: ${event.message || 'unknown error'}` }));
    };
    this.#worker = worker;
    return worker;
  }

  #receive(reply: WorkerReply): void {
    const pending = this.#pending.get(reply.id);
    if (!pending) return;
    if (reply.type === 'progress') {
      pending.onProgress?.(reply.share, reply.label);
      return;
    }
    this.#pending.delete(reply.id);
    if (reply.type === 'result') pending.resolve(reply.value);
    else pending.reject(new EngineCallError(reply.error));
  }

  #failAll(error: Error): void {
    for (const p of this.#pending.values()) p.reject(error);
    this.#pending.clear();
    this.#worker?.terminate();
    this.#worker = null;
  }

  /** Calls an engine method in the worker. Rejects with CancelledError when the signal aborts. */
  call<M extends MethodName>(method: M, params: ParamsOf<M>, options: CallOptions = {}): Promise<ResultOf<M>> {
    const { signal, onProgress } = options;
    if (signal?.aborted) return Promise.reject(new CancelledError());
    const worker = this.#ensureWorker();
    const id = this.#nextId++;
    return new Promise<ResultOf<M>>((resolve, reject) => {
      this.#pending.set(id, { resolve: resolve as (v: unknown) => void, reject, onProgress });
      signal?.addEventListener('abort', () => this.#failAll(new CancelledError()), { once: true });
      worker.postMessage({ id, method, params });
    });
  }
}

let client: EngineClient | undefined;

/** The window's one engine client. */
export function engineClient(): EngineClient {
  client ??= new EngineClient();
  return client;
}
