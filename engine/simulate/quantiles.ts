/**
 * Sample quantiles of large unsorted samples without a full sort: the order statistics
 * needed are found together by one multiple-rank quickselect (Hoare 1961, "Algorithm 65:
 * Find", recursing only into the parts that hold a wanted rank). Quantiles follow Hyndman and Fan (1996)
 * definition 7, R's default: h = (n − 1)p, x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]).
 */
import { EngineError } from '../core/errors';

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i] as number;
  a[i] = a[j] as number;
  a[j] = t;
}

/** Sorts a short range `a[lo..hi]` by insertion. */
function insertionSort(a: Float64Array, lo: number, hi: number): void {
  for (let i = lo + 1; i <= hi; i++) {
    const v = a[i] as number;
    let j = i - 1;
    while (j >= lo && (a[j] as number) > v) {
      a[j + 1] = a[j] as number;
      j--;
    }
    a[j + 1] = v;
  }
}

/** Where the last {@link partition} ended: its right part starts here. */
let rightStart = 0;

/**
 * Hoare partition of `a[lo..hi]` around the median of three: afterwards a[lo..j] ≤ pivot,
 * a[j+1..i−1] = pivot and a[i..hi] ≥ pivot. Returns j; i is left in `rightStart`.
 */
function partition(a: Float64Array, lo: number, hi: number): number {
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
  rightStart = i;
  return j;
}

/**
 * Rearranges `a[lo..hi]` so that a[k] is the value a full sort would put there, everything
 * left of it ≤ a[k] and everything right of it ≥ a[k]. Expected O(hi − lo).
 */
export function selectInPlace(a: Float64Array, k: number, lo = 0, hi = a.length - 1): void {
  while (hi > lo) {
    if (hi - lo < 16) {
      insertionSort(a, lo, hi);
      return;
    }
    const j = partition(a, lo, hi);
    const i = rightStart;
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/**
 * Rearranges `a[lo..hi]` so that every rank in `ranks[rlo..rhi]` (ascending, inside lo..hi)
 * holds the value a full sort would put there. One partition serves all the ranks on both
 * of its sides (multiple selection, e.g. Alsuwaiyel 2001), so seven quantiles cost a few
 * passes over the sample instead of one quickselect each. Expected O((hi − lo) · log ranks).
 */
function selectRanks(a: Float64Array, lo: number, hi: number, ranks: Int32Array, rlo: number, rhi: number): void {
  while (rlo <= rhi && hi > lo) {
    if (hi - lo < 16) {
      insertionSort(a, lo, hi);
      return;
    }
    const j = partition(a, lo, hi);
    const i = rightStart;
    // Ranks ≤ j are on the left, ranks ≥ i on the right, those between hold the pivot.
    let leftEnd = rlo - 1;
    while (leftEnd < rhi && (ranks[leftEnd + 1] as number) <= j) leftEnd++;
    let firstRight = leftEnd + 1;
    while (firstRight <= rhi && (ranks[firstRight] as number) < i) firstRight++;
    // Recurse into the side with fewer elements, loop on the other.
    if (j - lo < hi - i) {
      if (leftEnd >= rlo) selectRanks(a, lo, j, ranks, rlo, leftEnd);
      lo = i;
      rlo = firstRight;
    } else {
      if (firstRight <= rhi) selectRanks(a, i, hi, ranks, firstRight, rhi);
      hi = j;
      rhi = leftEnd;
    }
  }
}

/**
 * Type-7 quantiles of `sample` at ascending `levels`, written to `out`. `scratch` (same
 * length as the sample) is overwritten; `sample` is not touched. The result depends only on
 * the order statistics, so it is the same number a full sort gives.
 *
 * @throws EngineError INVALID_ARGUMENT for an empty sample or levels outside [0, 1] or not ascending.
 * @example quantilesInto(Float64Array.of(3, 1, 2), [0.5], new Float64Array(3), new Float64Array(1)) // out[0] = 2
 * Complexity: expected O(n · log levels).
 */
export function quantilesInto(
  sample: Float64Array,
  levels: readonly number[],
  scratch: Float64Array,
  out: Float64Array,
): void {
  const n = sample.length;
  if (n === 0) throw new EngineError('INVALID_ARGUMENT', 'quantiles of an empty sample');
  const ranks = new Int32Array(2 * levels.length);
  let count = 0;
  let previous = -Infinity;
  for (let q = 0; q < levels.length; q++) {
    const p = levels[q] as number;
    if (!(p >= 0 && p <= 1) || p < previous) {
      throw new EngineError('INVALID_ARGUMENT', `quantile levels must be ascending in [0, 1], got ${p}`);
    }
    previous = p;
    const h = (n - 1) * p;
    const k = Math.floor(h);
    if (count === 0 || (ranks[count - 1] as number) < k) ranks[count++] = k;
    if (h > k && k + 1 < n && (ranks[count - 1] as number) < k + 1) ranks[count++] = k + 1;
  }
  scratch.set(sample);
  selectRanks(scratch, 0, n - 1, ranks, 0, count - 1);
  for (let q = 0; q < levels.length; q++) {
    const p = levels[q] as number;
    const h = (n - 1) * p;
    const k = Math.floor(h);
    const low = scratch[k] as number;
    let value = low;
    if (h > k && k + 1 < n) value = low + (h - k) * ((scratch[k + 1] as number) - low);
    out[q] = value;
  }
}

/** Type-7 quantile of a sample (convenience; copies). @example quantile([1, 2, 3, 4], 0.5) // 2.5 */
export function quantile(sample: ArrayLike<number>, p: number): number {
  const a = Float64Array.from(sample as ArrayLike<number>);
  const out = new Float64Array(1);
  quantilesInto(a, [p], new Float64Array(a.length), out);
  return out[0] as number;
}
