/**
 * Central prediction intervals of a Gaussian predictive distribution.
 */
import { checkLevels, type PredictionInterval } from './forecastTypes';
import { normalQuantile } from '../stats/distributions';

/**
 * Intervals point ± z·sd with z = Φ⁻¹((1 + level)/2), the form of Hyndman and
 * Athanasopoulos, FPP3 section 5.5 (and R forecast's `qnorm(0.5 + level/200)`).
 *
 * @param point per-step predictive mean.
 * @param sd per-step predictive standard deviation (≥ 0), same length.
 * @param levels coverage levels in (0, 1).
 * @throws EngineError INVALID_ARGUMENT for levels outside (0, 1).
 * @example gaussianIntervals(Float64Array.of(10), Float64Array.of(1), [0.95])[0].upper[0] // 11.959963984540054
 */
export function gaussianIntervals(
  point: Float64Array,
  sd: Float64Array,
  levels: readonly number[] | undefined,
): PredictionInterval[] {
  return checkLevels(levels).map((level) => {
    const z = normalQuantile(0.5 + level / 2);
    const lower = new Float64Array(point.length);
    const upper = new Float64Array(point.length);
    for (let h = 0; h < point.length; h++) {
      const half = z * (sd[h] as number);
      lower[h] = (point[h] as number) - half;
      upper[h] = (point[h] as number) + half;
    }
    return { level, lower, upper };
  });
}
