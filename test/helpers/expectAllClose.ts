import { expect } from 'vitest';

/**
 * Asserts that two numeric arrays agree element by element within `tol`, measured
 * relative to max(1, |expected|) so values near zero are compared absolutely.
 * Reports the first index that differs.
 */
export function expectAllClose(
  actual: ArrayLike<number>,
  expected: ArrayLike<number>,
  tol: number,
  label = 'value',
): void {
  expect(actual.length, `${label}: length`).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i] as number;
    const e = expected[i] as number;
    const scale = Math.max(1, Math.abs(e));
    if (!(Math.abs(a - e) <= tol * scale)) {
      expect.fail(`${label}[${i}]: got ${a}, expected ${e} (tolerance ${tol} relative)`);
    }
  }
}

/** Scalar form of expectAllClose. */
export function expectClose(actual: number, expected: number, tol: number, label = 'value'): void {
  expectAllClose([actual], [expected], tol, label);
}
