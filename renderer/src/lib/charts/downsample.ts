/**
 * Fewer points for a chart that cannot show them all: a line of 1,100 daily values in a
 * 300-pixel panel draws several values per pixel column, and Chart.js would stroke every
 * one. Min–max bucketing keeps, for each of `maxPoints / 2` equal index ranges, the lowest
 * and the highest value in their original order, plus the first and last point, so spikes
 * (a large receipt) and dips stay visible — an average would flatten them.
 */

export interface XY {
  readonly x: number;
  readonly y: number;
}

/**
 * Min–max downsampling of points sorted by x.
 *
 * @param points sorted by x; never mutated.
 * @param maxPoints most points returned, at least 4 (fewer points are returned unchanged).
 * @returns at most `maxPoints` points, a subset of the input in x order, always with the
 *   first and last point and every bucket's extremes.
 * @throws RangeError when maxPoints < 4.
 * @example downsampleMinMax(daily, 200).length // ≤ 200
 * Complexity: O(n).
 */
export function downsampleMinMax(points: readonly XY[], maxPoints: number): XY[] {
  if (!(maxPoints >= 4)) throw new RangeError(`maxPoints must be at least 4, got ${maxPoints}`);
  const n = points.length;
  if (n <= maxPoints) return points.slice();
  const first = points[0] as XY;
  const last = points[n - 1] as XY;
  const buckets = Math.floor((maxPoints - 2) / 2);
  const inner = n - 2;
  const out: XY[] = [first];
  for (let b = 0; b < buckets; b++) {
    const from = 1 + Math.floor((b * inner) / buckets);
    const to = 1 + Math.floor(((b + 1) * inner) / buckets); // exclusive
    if (to <= from) continue;
    let lo = from;
    let hi = from;
    for (let i = from + 1; i < to; i++) {
      const y = (points[i] as XY).y;
      if (y < (points[lo] as XY).y) lo = i;
      if (y > (points[hi] as XY).y) hi = i;
    }
    if (lo === hi) out.push(points[lo] as XY);
    else if (lo < hi) out.push(points[lo] as XY, points[hi] as XY);
    else out.push(points[hi] as XY, points[lo] as XY);
  }
  out.push(last);
  return out;
}
