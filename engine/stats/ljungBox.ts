/**
 * Ljung–Box portmanteau test for remaining autocorrelation.
 */
import { EngineError } from '../core/errors';
import { acf } from './acf';
import { chiSquareSurvival } from './distributions';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';

/** Options of {@link ljungBox}. */
export interface LjungBoxOptions {
  /** Number of autocorrelations pooled, h ≥ 1 and h < n. */
  readonly lag: number;
  /** Number of parameters fitted to obtain `y` when `y` are model residuals (0 for raw data); df = lag − fitdf. Default 0. */
  readonly fitdf?: number;
}

/** Result of {@link ljungBox}. */
export interface LjungBoxResult {
  /** Q = n(n + 2) Σ_{k=1}^{h} r_k² / (n − k). */
  readonly statistic: number;
  /** Degrees of freedom of the reference chi-square, lag − fitdf. */
  readonly df: number;
  /** Upper-tail chi-square probability P(χ²_df > Q); small values mean autocorrelation remains. */
  readonly pValue: number;
  /** The lag h used. */
  readonly lag: number;
  /** Number of observations. */
  readonly n: number;
}

/**
 * Ljung–Box test that the first `lag` autocorrelations of `y` are jointly zero (Ljung and
 * Box 1978, Biometrika 65(2), 297–303): Q = n(n + 2) Σ_{k=1}^{h} r_k²/(n − k) with r_k from
 * {@link acf}, compared with χ² on h − fitdf degrees of freedom. Same statistic and p-value
 * as R's `Box.test(y, lag, type = "Ljung-Box", fitdf)`; the p-value is computed as an upper
 * tail directly, so it stays accurate where R's `1 − pchisq` rounds to 0.
 *
 * O(n · lag).
 *
 * @throws EngineError NOT_ENOUGH_DATA when lag ≥ n or the series is constant;
 *   INVALID_ARGUMENT for non-finite values, a lag that is not a positive integer, or
 *   fitdf that is negative, not an integer or ≥ lag.
 * @example ljungBox([1, 2, 3, 4, 5], { lag: 2 }) // { statistic: 1.5166667, df: 2, pValue: 0.4684465, … }
 */
export function ljungBox(y: SeriesInput, options: LjungBoxOptions): LjungBoxResult {
  const { lag } = options;
  const fitdf = options.fitdf ?? 0;
  requireFiniteSeries(y, 1, 'ljungBox');
  if (!Number.isInteger(lag) || lag < 1) {
    throw new EngineError('INVALID_ARGUMENT', `ljungBox: lag must be an integer ≥ 1, got ${lag}`);
  }
  if (!Number.isInteger(fitdf) || fitdf < 0 || fitdf >= lag) {
    throw new EngineError('INVALID_ARGUMENT', `ljungBox: fitdf must be an integer in [0, lag), got ${fitdf}`);
  }
  const n = y.length;
  if (lag >= n) {
    throw new EngineError('NOT_ENOUGH_DATA', `ljungBox: lag ${lag} needs more than ${lag} observations, got ${n}`);
  }
  const r = acf(y, lag);
  let sum = 0;
  for (let k = 1; k <= lag; k++) {
    const rk = r[k] as number;
    sum += (rk * rk) / (n - k);
  }
  const statistic = n * (n + 2) * sum;
  const df = lag - fitdf;
  return { statistic, df, pValue: chiSquareSurvival(statistic, df), lag, n };
}
