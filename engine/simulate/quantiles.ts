/**
 * Sample quantiles of large unsorted samples without a full sort: the order statistics
 * needed are found by repeated quickselect (Hoare 1961, "Algorithm 65: Find"), each on the
 * part of the array right of the previous one. Quantiles follow Hyndman and Fan (1996)
 * definition 7, R's default: h = (n − 1)p, x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]).
 */
import { EngineError } from '../core/errors';

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i] as number;
  a[i] = a[j] as number;
  a[j] = t;
}

/**
 * Rearranges `a[lo..hi]` so that a[k] is the value a full sort would put there, everything
 * left of it ≤ a[k] and everything right of it ≥ a[k]. Expected O(hi − lo).
 */
export function selectInPlace(a: Float64Array, k: number, lo = 0, hi = a.length - 1): void {
  while (hi > lo) {
    if (hi - lo < 16) {
      for (let i = lo + 1; i <= hi; i++) {
        const v = a[i] as number;
        let j = i - 1;
        while (j >= lo && (a[j] as number) > v) {
          a[j + 1] = a[j] as number;
          j--;
        }
        a[j + 1] = v;
      }
      return;
    }
    const mid = (lo + hi) >>> 1;
    if ((a[mid] as number) < (a[lo] as number)) swap(a, mid, lo);
    if ((a[hi] as number) < (a[lo] as number)) swap(a, hi, lo);
    if ((a[hi] as number) < (a[mid] as number)) swap(a, hi, mid);
    const pivot = a[mid] as number;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while ((a[i] as number) < pivot) i++;
      while ((a[j] as number) > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/**
 * Type-7 quantiles of `sample` at ascending `levels`, written to `out`. `scratch` (same
 * length as the sample) is overwritten; `sample` is not touched.
 *
 * @throws EngineError INVALID_ARGUMENT for an empty sample or levels outside [0, 1] or not ascending.
 * @example quantilesInto(Float64Array.of(3, 1, 2), [0.5], new Float64Array(3), new Float64Array(1)) // out[0] = 2
 * Complexity: expected O(n · levels).
 */
export function quantilesInto(
  sample: Float64Array,
  levels: readonly number[],
  scratch: Float64Array,
  out: Float64Array,
): void {
  const n = sample.length;
  if (n === 0) throw new EngineError('INVALID_ARGUMENT', 'quantiles of an empty sample');
  scratch.set(sample);
  let left = 0;
  let previous = -Infinity;
  for (let q = 0; q < levels.length; q++) {
    const p = levels[q] as number;
    if (!(p >= 0 && p <= 1) || p < previous) {
      throw new EngineError('INVALID_ARGUMENT', `quantile levels must be ascending in [0, 1], got ${p}`);
    }
    previous = p;
    const h = (n - 1) * p;
    const k = Math.floor(h);
    selectInPlace(scratch, k, left, n - 1);
    const low = scratch[k] as number;
    let value = low;
    if (h > k && k + 1 < n) {
      // The next order statistic is the minimum of what lies right of k.
      let next = Infinity;
      for (let i = k + 1; i < n; i++) if ((scratch[i] as number) < next) next = scratch[i] as number;
      value = low + (h - k) * (next - low);
    }
    out[q] = value;
    left = k;
  }
}

/** Type-7 quantile of a sample (convenience; copies). @example quantile([1, 2, 3, 4], 0.5) // 2.5 */
export function quantile(sample: ArrayLike<number>, p: number): number {
  const a = Float64Array.from(sample as ArrayLike<number>);
  const out = new Float64Array(1);
  quantilesInto(a, [p], new Float64Array(a.length), out);
  return out[0] as number;
}
