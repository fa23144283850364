/**
 * First day each simulated path falls below a threshold, from the raw balance paths. The
 * simulation records first crossings of its own threshold; this gives them for any other
 * line (a cushion, an overdraft limit) from the same paths, without simulating again.
 */
import { EngineError } from '../core/errors';

/** What firstCrossingDays reads of simulated paths (engine/simulate SimulatedPaths fits). */
export interface BalancePaths {
  readonly paths: number;
  readonly horizon: number;
  /** End-of-day balances, day-major: `balances[d * paths + p]`. */
  readonly balances: Float64Array;
}

/**
 * Day offset (0 = the first forecast day) on which each path's end-of-day balance is first
 * below `threshold`, −1 when it never is within the horizon.
 *
 * @throws EngineError INVALID_ARGUMENT when `balances` is not paths × horizon long or the
 *   threshold is not finite.
 * @example firstCrossingDays(run.sim, 500000) // Int32Array, one entry per path
 * Complexity: O(paths · horizon), one pass in memory order.
 */
export function firstCrossingDays(sim: BalancePaths, threshold: number): Int32Array {
  const { paths, horizon, balances } = sim;
  if (!Number.isFinite(threshold)) throw new EngineError('INVALID_ARGUMENT', 'threshold must be a finite amount');
  if (!Number.isInteger(paths) || !Number.isInteger(horizon) || paths < 1 || horizon < 1) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `paths and horizon must be whole numbers ≥ 1, got ${paths} and ${horizon}`,
    );
  }
  if (balances.length !== paths * horizon) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `balances hold ${balances.length} values, expected paths × horizon = ${paths * horizon}`,
    );
  }
  const first = new Int32Array(paths).fill(-1);
  let open = paths;
  for (let d = 0; d < horizon && open > 0; d++) {
    const row = d * paths;
    for (let p = 0; p < paths; p++) {
      if ((first[p] as number) < 0 && (balances[row + p] as number) < threshold) {
        first[p] = d;
        open--;
      }
    }
  }
  return first;
}
