import { describe, expect, it } from 'vitest';
import { leastSquares } from '../../engine/stats/leastSquares';
import { expectAllClose, expectClose } from '../helpers/expectAllClose';
import { expectEngineError } from './expectEngineError';

describe('leastSquares', () => {
  it('fits a line exactly through collinear points', () => {
    const fit = leastSquares([Float64Array.of(1, 1, 1), Float64Array.of(1, 2, 3)], [1, 3, 5]);
    expectAllClose(fit.coefficients, [-1, 2], 1e-14);
    expect(fit.rss).toBeLessThan(1e-28);
  });

  it('gives the textbook simple-regression standard errors', () => {
    // Closed form for y on (1, x): se(b) = s/√Sxx, se(a) = s √(1/n + x̄²/Sxx), s² = RSS/(n − 2).
    const x = [1, 2, 3, 4, 5, 6];
    const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2];
    const n = x.length;
    const xBar = x.reduce((a, b) => a + b) / n;
    const yBar = y.reduce((a, b) => a + b) / n;
    const sxx = x.reduce((s, xi) => s + (xi - xBar) ** 2, 0);
    const sxy = x.reduce((s, xi, i) => s + (xi - xBar) * ((y[i] as number) - yBar), 0);
    const b = sxy / sxx;
    const a = yBar - b * xBar;
    const rss = y.reduce((s, yi, i) => s + (yi - a - b * (x[i] as number)) ** 2, 0);
    const s2 = rss / (n - 2);
    const fit = leastSquares([new Float64Array(n).fill(1), Float64Array.from(x)], y);
    expectAllClose(fit.coefficients, [a, b], 1e-13);
    expectClose(fit.rss, rss, 1e-12);
    expectAllClose(fit.standardErrors, [Math.sqrt(s2 * (1 / n + xBar ** 2 / sxx)), Math.sqrt(s2 / sxx)], 1e-12);
    expectAllClose(
      fit.residuals,
      y.map((yi, i) => yi - a - b * (x[i] as number)),
      1e-12,
    );
  });

  it('refuses collinear designs, too few rows and mismatched lengths', () => {
    const ones = new Float64Array(5).fill(1);
    const twos = new Float64Array(5).fill(2);
    expectEngineError(() => leastSquares([ones, twos], [1, 2, 3, 4, 5]), 'NOT_ENOUGH_DATA');
    expectEngineError(() => leastSquares([ones.subarray(0, 2), Float64Array.of(1, 2)], [1, 2]), 'NOT_ENOUGH_DATA');
    expectEngineError(() => leastSquares([ones], [1, 2, 3]), 'INVALID_ARGUMENT');
    expectEngineError(() => leastSquares([], [1, 2, 3]), 'INVALID_ARGUMENT');
  });

  it('leaves the design and response untouched', () => {
    const x = Float64Array.of(1, 2, 3, 4);
    const y = Float64Array.of(2, 1, 4, 3);
    leastSquares([new Float64Array(4).fill(1), x], y);
    expect(Array.from(x)).toEqual([1, 2, 3, 4]);
    expect(Array.from(y)).toEqual([2, 1, 4, 3]);
  });
});
