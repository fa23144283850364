/**
 * Input checks shared by the series statistics: every statistic takes a plain readonly
 * array or typed array of finite numbers and refuses anything else with a stable code.
 */
import { EngineError } from '../core/errors';

/** A numeric series as the statistics accept it: a readonly array or a typed array. Never mutated. */
export type SeriesInput = ArrayLike<number>;

/**
 * Checks that `y` holds at least `minLength` finite numbers.
 *
 * @param y the series
 * @param minLength the fewest observations the caller needs
 * @param what the statistic's name, used in the message
 * @throws EngineError NOT_ENOUGH_DATA when `y` is shorter than `minLength`;
 *   INVALID_ARGUMENT when an element is NaN or infinite.
 * @example requireFiniteSeries([1, 2, 3], 2, 'acf') // passes
 */
export function requireFiniteSeries(y: SeriesInput, minLength: number, what: string): void {
  if (y.length < minLength) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `${what} needs at least ${minLength} observation${minLength === 1 ? '' : 's'}, got ${y.length}`,
    );
  }
  for (let i = 0; i < y.length; i++) {
    if (!Number.isFinite(y[i])) {
      throw new EngineError('INVALID_ARGUMENT', `${what}: element ${i} is ${String(y[i])}, expected a finite number`);
    }
  }
}

/**
 * Checks that `value` is an integer within [min, max].
 *
 * @throws EngineError INVALID_ARGUMENT otherwise.
 * @example requireInteger(7, 1, 365, 'lag') // passes
 */
export function requireInteger(value: number, min: number, max: number, what: string): void {
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new EngineError('INVALID_ARGUMENT', `${what} must be an integer in [${min}, ${max}], got ${value}`);
  }
}
