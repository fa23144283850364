/**
 * The window's side of the engine worker: promise-based calls with progress callbacks and
 * cancellation. Cancelling terminates the worker (a running forecast cannot be interrupted
 * any other way without slowing its hot loops); calls of other screens that were waiting
 * in it are sent again to a fresh worker, so one screen's Cancel never fails another's call.
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
  /** The request, kept to send it again after another call's cancellation. */
  request: { id: number; method: MethodName; params: unknown };
  /** Removes the abort listener once the call is settled. */
  cleanup(): void;
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
    pending.cleanup();
    if (reply.type === 'result') pending.resolve(reply.value);
    else pending.reject(new EngineCallError(reply.error));
  }

  #failAll(error: Error): void {
    for (const p of this.#pending.values()) {
      p.cleanup();
      p.reject(error);
    }
    this.#pending.clear();
    this.#worker?.terminate();
    this.#worker = null;
  }

  /** Cancels call `id`: stops the worker and sends the other waiting calls to a new one. */
  #cancel(id: number): void {
    const pending = this.#pending.get(id);
    if (!pending) return;
    this.#pending.delete(id);
    pending.cleanup();
    pending.reject(new CancelledError());
    this.#worker?.terminate();
    this.#worker = null;
    if (this.#pending.size === 0) return;
    const worker = this.#ensureWorker();
    for (const p of this.#pending.values()) worker.postMessage(p.request);
  }

  /** Calls an engine method in the worker. Rejects with CancelledError when the signal aborts. */
  call<M extends MethodName>(method: M, params: ParamsOf<M>, options: CallOptions = {}): Promise<ResultOf<M>> {
    const { signal, onProgress } = options;
    if (signal?.aborted) return Promise.reject(new CancelledError());
    const worker = this.#ensureWorker();
    const id = this.#nextId++;
    return new Promise<ResultOf<M>>((resolve, reject) => {
      const onAbort = () => this.#cancel(id);
      const request = { id, method, params };
      this.#pending.set(id, {
        resolve: resolve as (v: unknown) => void,
        reject,
        onProgress,
        request,
        cleanup: () => signal?.removeEventListener('abort', onAbort),
      });
      signal?.addEventListener('abort', onAbort, { once: true });
      worker.postMessage(request);
    });
  }
}

let client: EngineClient | undefined;

/** The window's one engine client. */
export function engineClient(): EngineClient {
  client ??= new EngineClient();
  return client;
}
