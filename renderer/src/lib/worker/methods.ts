/**
 * The engine methods the worker offers. Each one takes plain data and a context for
 * progress, and returns plain data. They run inside the worker, never on the window's
 * thread.
 */
import { importStatement } from '@engine/import/registry';
import type { ImportOptions } from '@engine/import/types';
import type { MethodContext } from './protocol';

export interface ImportFileInput {
  readonly name: string;
  readonly bytes: Uint8Array;
  readonly options?: Omit<ImportOptions, 'fileName'>;
}

export const engineMethods = {
  /** Parses statement files; the caller decides whether to store them (all or nothing). */
  async parseStatements(params: { files: readonly ImportFileInput[] }, context: MethodContext) {
    const results = [];
    for (let i = 0; i < params.files.length; i++) {
      const f = params.files[i]!;
      context.progress(i / params.files.length, `Reading ${f.name}`);
      results.push(importStatement(f.bytes, { ...f.options, fileName: f.name }));
    }
    context.progress(1, 'Read all files');
    return results;
  },
};

export type EngineMethods = {
  [K in keyof typeof engineMethods]: (
    params: Parameters<(typeof engineMethods)[K]>[0],
  ) => ReturnType<(typeof engineMethods)[K]>;
};
