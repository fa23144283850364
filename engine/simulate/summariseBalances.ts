/**
 * Turns simulated balance paths into what people read: per-day mean and quantile bands,
 * the chance of being below the threshold on a day (`pBelow`) and of having been below it
 * on any day so far (`pCrossed`), when a shortfall first happens, and which flows drive it.
 */
import { quantilesInto } from './quantiles';
import type { SimulatedPaths } from './simulateBalances';
import { QUANTILE_LEVELS, type BalanceSummary, type FlowComponent, type ShortfallDriver } from './types';

/** How many drivers the summary keeps. */
export const MAX_DRIVERS = 5;

/**
 * Summarises simulated paths.
 *
 * `firstCrossing.pq` is the first day offset by which a share q of ALL paths has fallen
 * below the threshold, so it agrees with `pCrossed`: p50 is null when fewer than half the
 * paths ever cross. Drivers compare each component's horizon total between crossing and
 * other paths; they are empty when either group is empty.
 *
 * @example summariseBalances(simulateBalances(input), input.threshold, input.components).pCrossed
 * Complexity: O(horizon · paths · quantile levels) expected.
 */
export function summariseBalances(
  sim: SimulatedPaths,
  threshold: number,
  components: readonly FlowComponent[],
): BalanceSummary {
  const { paths: n, horizon: h, balances, firstCrossing, totals } = sim;
  const mean = new Float64Array(h);
  const quantiles = QUANTILE_LEVELS.map(() => new Float64Array(h));
  const pBelow = new Float64Array(h);
  const pCrossed = new Float64Array(h);
  const scratch = new Float64Array(n);
  const q = new Float64Array(QUANTILE_LEVELS.length);
  for (let d = 0; d < h; d++) {
    const day = balances.subarray(d * n, (d + 1) * n);
    let sum = 0;
    let below = 0;
    for (let p = 0; p < n; p++) {
      const b = day[p] as number;
      sum += b;
      if (b < threshold) below++;
    }
    mean[d] = sum / n;
    pBelow[d] = below / n;
    quantilesInto(day, QUANTILE_LEVELS, scratch, q);
    for (let k = 0; k < QUANTILE_LEVELS.length; k++) (quantiles[k] as Float64Array)[d] = q[k] as number;
  }
  const firstByDay = new Int32Array(h);
  let crossedPaths = 0;
  for (let p = 0; p < n; p++) {
    const f = firstCrossing[p] as number;
    if (f >= 0) {
      firstByDay[f] = (firstByDay[f] as number) + 1;
      crossedPaths++;
    }
  }
  let run = 0;
  for (let d = 0; d < h; d++) {
    run += firstByDay[d] as number;
    pCrossed[d] = run / n;
  }
  const firstDay = (share: number): number | null => {
    for (let d = 0; d < h; d++) if ((pCrossed[d] as number) >= share) return d;
    return null;
  };
  const final = h > 0 ? (pCrossed[h - 1] as number) : 0;
  return {
    horizon: h,
    paths: n,
    mean,
    quantiles,
    pBelow,
    pCrossed,
    firstCrossing: { p10: firstDay(0.1), p50: firstDay(0.5), p90: firstDay(0.9) },
    drivers: shortfallDrivers(totals, firstCrossing, components, crossedPaths),
    standardError: Math.sqrt((final * (1 - final)) / n),
  };
}

function shortfallDrivers(
  totals: Float64Array,
  firstCrossing: Int32Array,
  components: readonly FlowComponent[],
  crossedPaths: number,
): ShortfallDriver[] {
  const n = firstCrossing.length;
  const nc = components.length;
  if (crossedPaths === 0 || crossedPaths === n || nc === 0) return [];
  const drivers: ShortfallDriver[] = [];
  for (let c = 0; c < nc; c++) {
    let inCrossing = 0;
    let otherwise = 0;
    for (let p = 0; p < n; p++) {
      const t = totals[p * nc + c] as number;
      if ((firstCrossing[p] as number) >= 0) inCrossing += t;
      else otherwise += t;
    }
    const meanIn = inCrossing / crossedPaths;
    const meanOut = otherwise / (n - crossedPaths);
    const component = components[c] as FlowComponent;
    drivers.push({
      key: component.key,
      label: component.label,
      difference: meanIn - meanOut,
      meanInCrossing: meanIn,
      meanOtherwise: meanOut,
    });
  }
  return drivers
    .filter((d) => d.difference < 0)
    .sort((a, b) => a.difference - b.difference || (a.key < b.key ? -1 : 1))
    .slice(0, MAX_DRIVERS);
}
