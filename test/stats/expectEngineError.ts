import { expect } from 'vitest';
import { EngineError, type EngineErrorCode } from '../../engine/core/errors';

/** Asserts that `fn` throws an EngineError with `code`. */
export function expectEngineError(fn: () => unknown, code: EngineErrorCode): void {
  let thrown: unknown;
  try {
    fn();
  } catch (e) {
    thrown = e;
  }
  expect(thrown, `expected EngineError ${code}`).toBeInstanceOf(EngineError);
  expect((thrown as EngineError).code).toBe(code);
}
