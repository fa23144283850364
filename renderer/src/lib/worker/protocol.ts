/**
 * Messages between the window and the engine worker. Requests name a method of
 * `EngineMethods`; the worker answers with progress messages and then one result or one
 * error. Everything is plain data (structured clone), typed arrays included.
 */
import type { EngineMethods } from './methods';

export type MethodName = keyof EngineMethods;
export type ParamsOf<M extends MethodName> = Parameters<EngineMethods[M]>[0];
export type ResultOf<M extends MethodName> = Awaited<ReturnType<EngineMethods[M]>>;

export interface WorkerRequest<M extends MethodName = MethodName> {
  readonly id: number;
  readonly method: M;
  readonly params: ParamsOf<M>;
}

/** An error as it crosses the boundary: the engine's stable code when there is one. */
export interface WorkerError {
  readonly code?: string;
  readonly message: string;
}

export type WorkerReply =
  | { readonly id: number; readonly type: 'progress'; readonly share: number; readonly label: string }
  | { readonly id: number; readonly type: 'result'; readonly value: unknown }
  | { readonly id: number; readonly type: 'error'; readonly error: WorkerError };

/** What a method receives besides its parameters. */
export interface MethodContext {
  /** Reports progress (0..1) with a short label for the progress bar. */
  progress(share: number, label: string): void;
}
