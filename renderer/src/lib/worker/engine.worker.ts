/// <reference lib="webworker" />
/**
 * The engine worker: runs imports, decompositions and forecasts off the window's thread so
 * the window never freezes. One request at a time; cancellation terminates the worker and
 * the client starts a fresh one.
 */
import { engineMethods } from './methods';
import type { WorkerReply, WorkerRequest } from './protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: WorkerReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<WorkerRequest>) => {
  const { id, method, params } = event.data;
  const impl = engineMethods[method] as
    ((p: unknown, c: { progress(s: number, l: string): void }) => Promise<unknown>) | undefined;
  if (!impl) {
    post({
      id,
      type: 'error',
      error: { code: 'INVALID_ARGUMENT', message: `unknown engine method "${String(method)}"` },
    });
    return;
  }
  let lastProgress = 0;
  try {
    const value = await impl(params, {
      progress(share, label) {
        const now = performance.now();
        if (share < 1 && now - lastProgress < 50) return; // at most 20 updates a second
        lastProgress = now;
        post({ id, type: 'progress', share, label });
      },
    });
    post({ id, type: 'result', value });
  } catch (e) {
    const error = e as { code?: unknown; message?: unknown };
    post({
      id,
      type: 'error',
      error: { code: typeof error.code === 'string' ? error.code : undefined, message: String(error.message ?? e) },
    });
  }
};
