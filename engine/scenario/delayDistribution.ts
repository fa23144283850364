/**
 * An empirical distribution of payment delays in whole days (days after the due date;
 * negative = early), how to draw from it, and the uniform range of whole days that a plan
 * item's `delayDays` can hold in its place.
 *
 * The plan schema (`ebbline.plan/1`) spreads a delay uniformly over min..max with min ≥ 0.
 * uniformDelayRange matches the uniform's mean and variance to the observed delays (early
 * payments counted as on time, since a plan item cannot pay before its date); when that
 * would need a negative minimum, the range starts at 0 and keeps the mean only.
 */
import { EngineError } from '../core/errors';
import type { Rng } from '../core/random';

/** Distinct whole-day delays, ascending, with their shares (summing to 1). */
export interface DelayDistribution {
  readonly offsets: readonly number[];
  readonly weights: readonly number[];
}

/** Longest delay a plan item accepts (plan.ts). */
export const MAX_PLAN_DELAY = 365;

/**
 * The empirical distribution of observed delays.
 * @throws EngineError INVALID_ARGUMENT for no observations or a delay that is not a whole number.
 * @example delayDistributionOf([3, 3, 10]) // { offsets: [3, 10], weights: [2/3, 1/3] }
 * Complexity: O(n log n).
 */
export function delayDistributionOf(days: readonly number[]): DelayDistribution {
  if (days.length === 0) throw new EngineError('INVALID_ARGUMENT', 'a delay distribution needs at least one delay');
  const counts = new Map<number, number>();
  for (const d of days) {
    if (!Number.isInteger(d)) throw new EngineError('INVALID_ARGUMENT', `delays are whole days, got ${d}`);
    counts.set(d, (counts.get(d) ?? 0) + 1);
  }
  const offsets = [...counts.keys()].sort((a, b) => a - b);
  return { offsets, weights: offsets.map((o) => (counts.get(o) as number) / days.length) };
}

/**
 * The uniform distribution over whole days min..max as a DelayDistribution.
 * @throws EngineError INVALID_ARGUMENT unless min ≤ max are whole numbers.
 * @example uniformDelays(0, 2) // { offsets: [0, 1, 2], weights: [1/3, 1/3, 1/3] }
 */
export function uniformDelays(min: number, max: number): DelayDistribution {
  if (!Number.isInteger(min) || !Number.isInteger(max) || max < min) {
    throw new EngineError('INVALID_ARGUMENT', `expected whole days min ≤ max, got ${min}..${max}`);
  }
  const offsets: number[] = [];
  for (let d = min; d <= max; d++) offsets.push(d);
  return { offsets, weights: offsets.map(() => 1 / offsets.length) };
}

/**
 * Mean and standard deviation of a delay distribution (population form).
 * @example delayMoments(delayDistributionOf([0, 10])) // { mean: 5, sd: 5 }
 */
export function delayMoments(dist: DelayDistribution): { mean: number; sd: number } {
  let mean = 0;
  for (let i = 0; i < dist.offsets.length; i++) mean += (dist.offsets[i] as number) * (dist.weights[i] as number);
  let v = 0;
  for (let i = 0; i < dist.offsets.length; i++)
    v += (dist.weights[i] as number) * ((dist.offsets[i] as number) - mean) ** 2;
  return { mean, sd: Math.sqrt(v) };
}

/**
 * The whole-day range min..max (0 ≤ min ≤ max ≤ 365) for a plan item's `delayDays`:
 * the discrete uniform with the mean and variance of the delays clamped at 0
 * (variance of the uniform on a..b: ((b − a + 1)² − 1) / 12).
 * @example uniformDelayRange(delayDistributionOf([10, 20, 30])) // { min: 6, max: 34 } (mean 20; sd 8.4 against 8.2)
 */
export function uniformDelayRange(dist: DelayDistribution): { min: number; max: number } {
  const clamped = {
    offsets: dist.offsets.map((o) => Math.min(MAX_PLAN_DELAY, Math.max(0, o))),
    weights: dist.weights,
  };
  const { mean, sd } = delayMoments(clamped);
  // The nearest whole-day ranges around the exact match; keep the one closest in mean and sd.
  const exact = Math.sqrt(12 * sd * sd + 1) - 1;
  let best = { min: 0, max: 0, error: Infinity };
  for (let width = Math.max(0, Math.floor(exact) - 1); width <= Math.ceil(exact) + 1; width++) {
    for (const min of [Math.floor(mean - width / 2), Math.ceil(mean - width / 2)]) {
      if (min < 0) continue;
      const sdU = Math.sqrt(((width + 1) ** 2 - 1) / 12);
      const error = Math.abs(min + width / 2 - mean) + Math.abs(sdU - sd);
      if (error < best.error - 1e-12) best = { min: min || 0, max: min + width, error };
    }
  }
  let { min, max } = best;
  if (best.error === Infinity) {
    // Matching the spread would need a negative minimum: start at 0 and keep the mean.
    min = 0;
    max = Math.round(2 * mean);
  }
  max = Math.min(MAX_PLAN_DELAY, Math.max(min, max));
  return { min, max };
}

/**
 * Draws one delay from the distribution (inverse of the cumulative shares).
 * @example sampleDelay(delayDistributionOf([0, 5]), createRng(1)) // 0 or 5
 */
export function sampleDelay(dist: DelayDistribution, rng: Rng): number {
  const u = rng.nextFloat();
  let run = 0;
  for (let i = 0; i < dist.offsets.length; i++) {
    run += dist.weights[i] as number;
    if (u < run) return dist.offsets[i] as number;
  }
  return dist.offsets[dist.offsets.length - 1] as number;
}
