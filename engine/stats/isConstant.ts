/**
 * Whether a series is constant to within rounding, by the rule forecast's `is.constant` uses.
 */
import type { SeriesInput } from './requireFiniteSeries';

/** √(double epsilon), R's default tolerance of `all.equal`. */
const ALL_EQUAL_TOLERANCE = 1.4901161193847656e-8;

/**
 * True when every value of `y` equals the first to within R's `all.equal` tolerance: over
 * the values that differ from y₀, the mean absolute difference divided by their mean
 * absolute value (or undivided when that mean is below the tolerance) is at most
 * √ε ≈ 1.49e-8. This is `forecast:::is.constant`, which `ndiffs` and `nsdiffs` use to stop
 * differencing. An empty or one-value series counts as constant.
 *
 * @example isConstant([5, 5, 5]) // true
 * @example isConstant([1e6, 1e6 + 1e-4]) // true (relative difference 1e-10)
 * @example isConstant([1, 2]) // false
 */
export function isConstant(y: SeriesInput): boolean {
  const first = y[0] as number;
  let differing = 0;
  let absoluteDifference = 0;
  let absoluteValue = 0;
  for (let i = 1; i < y.length; i++) {
    const v = y[i] as number;
    if (v === first) continue;
    differing++;
    absoluteDifference += Math.abs(v - first);
    absoluteValue += Math.abs(v);
  }
  if (differing === 0) return true;
  let difference = absoluteDifference / differing;
  const scale = absoluteValue / differing;
  if (Number.isFinite(scale) && scale > ALL_EQUAL_TOLERANCE) difference /= scale;
  return difference <= ALL_EQUAL_TOLERANCE;
}
