import { EngineError } from '../../engine/core/errors';

/** The `code` of the EngineError a call throws, 'not an EngineError' for other errors, or 'none'. */
export function errorCode(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    return e instanceof EngineError ? e.code : 'not an EngineError';
  }
  return 'none';
}
