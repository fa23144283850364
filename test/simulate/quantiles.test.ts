import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quantile, quantilesInto, selectInPlace } from '../../engine/simulate/quantiles';

/** Reference: definition 7 of Hyndman and Fan (1996), computed on a full sort. */
function type7(sample: readonly number[], p: number): number {
  const s = [...sample].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const k = Math.floor(h);
  const lo = s[k] as number;
  const hi = s[Math.min(k + 1, s.length - 1)] as number;
  return lo + (h - k) * (hi - lo);
}

describe('quantiles', () => {
  it('matches R quantile(type = 7) on a small sample', () => {
    // Source: R 4.2.2 quantile(c(1, 2, 3, 4), c(0.1, 0.5, 0.9)) = 1.3, 2.5, 3.7 (Hyndman and Fan 1996, definition 7)
    expect(quantile([4, 1, 3, 2], 0.1)).toBeCloseTo(1.3, 12);
    expect(quantile([4, 1, 3, 2], 0.5)).toBeCloseTo(2.5, 12);
    expect(quantile([4, 1, 3, 2], 0.9)).toBeCloseTo(3.7, 12);
  });

  it('agrees with a full sort for any sample and ascending levels', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e9, max: 1e9, noNaN: true }), { minLength: 1, maxLength: 300 }),
        fc.uniqueArray(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 7 }),
        (sample, levels) => {
          const sorted = [...levels].sort((a, b) => a - b);
          const data = Float64Array.from(sample);
          const copy = Float64Array.from(sample);
          const out = new Float64Array(sorted.length);
          quantilesInto(data, sorted, new Float64Array(data.length), out);
          sorted.forEach((p, i) => expect(out[i]).toBeCloseTo(type7(sample, p), 6));
          expect(Array.from(data)).toEqual(Array.from(copy)); // input untouched
        },
      ),
    );
  });

  it('gives exactly the full-sort value, ties and tiny samples included', () => {
    // The multiple-rank selection must reproduce the definition it replaced bit for bit:
    // sort, x[k] when h is whole, else x[k] + (h − k)(x[k+1] − x[k]).
    // Source: Hyndman and Fan (1996), "Sample quantiles in statistical packages", definition 7.
    const exact = (sample: readonly number[], p: number): number => {
      const s = [...sample].sort((a, b) => a - b);
      const h = (s.length - 1) * p;
      const k = Math.floor(h);
      const lo = s[k] as number;
      return h > k && k + 1 < s.length ? lo + (h - k) * ((s[k + 1] as number) - lo) : lo;
    };
    const levels = [0, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 1];
    fc.assert(
      fc.property(
        fc.oneof(
          fc.array(fc.integer({ min: -3, max: 3 }), { minLength: 1, maxLength: 12 }),
          fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 400 }),
          // +0 turns −0 into 0: a sort and a selection may place −0 and 0 differently.
          fc.array(
            fc.double({ min: -1e9, max: 1e9, noNaN: true }).map((x) => x + 0),
            { minLength: 1, maxLength: 400 },
          ),
        ),
        (sample) => {
          const out = new Float64Array(levels.length);
          quantilesInto(Float64Array.from(sample), levels, new Float64Array(sample.length), out);
          levels.forEach((p, i) => expect(out[i]).toBe(exact(sample, p)));
        },
      ),
      { numRuns: 500 },
    );
  });

  it('selects the k-th order statistic with everything partitioned around it', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 200 }),
        fc.nat(),
        (xs, seed) => {
          const a = Float64Array.from(xs);
          const k = seed % a.length;
          selectInPlace(a, k);
          const sorted = [...xs].sort((x, y) => x - y);
          expect(a[k]).toBe(sorted[k]);
          for (let i = 0; i < k; i++) expect(a[i]).toBeLessThanOrEqual(a[k] as number);
          for (let i = k + 1; i < a.length; i++) expect(a[i]).toBeGreaterThanOrEqual(a[k] as number);
        },
      ),
    );
  });

  it('refuses an empty sample and descending levels', () => {
    expect(() => quantile([], 0.5)).toThrow(/empty/);
    expect(() => quantilesInto(Float64Array.of(1, 2), [0.9, 0.1], new Float64Array(2), new Float64Array(2))).toThrow(
      /ascending/,
    );
  });
});
