/**
 * How many ordinary differences make a series stationary, decided by repeated KPSS tests as
 * forecast's `ndiffs` does.
 */
import { EngineError } from '../core/errors';
import { diff } from './diff';
import { isConstant } from './isConstant';
import { kpssTest, type KpssNull } from './kpss';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** Options of {@link ndiffs}. */
export interface NdiffsOptions {
  /** Significance level of each KPSS test, within [0.01, 0.10] (the range of the KPSS table). Default 0.05. */
  readonly alpha?: number;
  /** Stationarity around a level (default) or a linear trend. */
  readonly type?: KpssNull;
  /** Most differences to take. Default 2. */
  readonly maxD?: number;
}

/**
 * Number of first differences d (0 ≤ d ≤ maxD) after which the KPSS test no longer rejects
 * stationarity at level alpha: test y; while the p-value is below alpha, difference once
 * more and test again (Hyndman and Khandakar 2008, J. Statistical Software 27(3), §3.2; KPSS
 * as in {@link kpssTest} with truncation lag trunc(3√n/13)). Matches R's
 * `forecast::ndiffs(y, alpha, test = "kpss", type)`, including its stops: a series that is
 * constant (by {@link isConstant}) needs no further difference, and a differenced series too
 * short to test (fewer than 3 values, or no variation left) ends the search where it is.
 *
 * O(n · √n · maxD).
 *
 * @throws EngineError INVALID_ARGUMENT for non-finite values, alpha outside [0.01, 0.1] or a
 *   maxD that is not a non-negative integer; NOT_ENOUGH_DATA for an empty series.
 * @example ndiffs(airPassengers) // 1
 */
export function ndiffs(y: SeriesInput, options: NdiffsOptions = {}): number {
  const alpha = options.alpha ?? 0.05;
  const type = options.type ?? 'level';
  const maxD = options.maxD ?? 2;
  requireFiniteSeries(y, 1, 'ndiffs');
  if (!(alpha >= 0.01 && alpha <= 0.1)) {
    throw new EngineError('INVALID_ARGUMENT', `ndiffs: alpha must be within [0.01, 0.1], got ${alpha}`);
  }
  if (!Number.isInteger(maxD) || maxD < 0) {
    throw new EngineError('INVALID_ARGUMENT', `ndiffs: maxD must be a non-negative integer, got ${maxD}`);
  }
  let x: SeriesInput = y;
  let d = 0;
  if (isConstant(x)) return 0;
  let rejectsStationarity = kpssRejects(x, type, alpha);
  while (rejectsStationarity && d < maxD) {
    d++;
    x = diff(x); // x has ≥ 3 values here: kpssTest rejected on it
    if (isConstant(x)) return d;
    rejectsStationarity = kpssRejects(x, type, alpha);
  }
  return d;
}

function kpssRejects(x: SeriesInput, type: KpssNull, alpha: number): boolean {
  try {
    const lag = Math.trunc((3 * Math.sqrt(x.length)) / 13);
    return kpssTest(x, { null: type, lags: lag }).pValue < alpha;
  } catch (e) {
    // forecast::ndiffs treats a test that cannot run as "no further difference".
    if (e instanceof EngineError && e.code === 'NOT_ENOUGH_DATA') return false;
    throw e;
  }
}
