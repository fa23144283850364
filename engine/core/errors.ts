/**
 * Stable error codes thrown by the engine when a precondition fails. Callers switch on
 * `code`, never on the message text.
 */
export type EngineErrorCode =
  | 'INVALID_DATE'
  | 'INVALID_AMOUNT'
  | 'UNKNOWN_CURRENCY'
  | 'NOT_ENOUGH_DATA'
  | 'INVALID_ARGUMENT'
  | 'INVALID_PLAN'
  | 'INPUT_TOO_LARGE';

/**
 * The engine's one error type. It carries a stable `code` and plain data, so it survives
 * the worker boundary as `{ name, code, message }`.
 *
 * @example
 * throw new EngineError('NOT_ENOUGH_DATA', 'STL needs at least two full periods');
 */
export class EngineError extends Error {
  readonly code: EngineErrorCode;
  constructor(code: EngineErrorCode, message: string) {
    super(message);
    this.name = 'EngineError';
    this.code = code;
  }
}
