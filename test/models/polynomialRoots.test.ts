import { describe, expect, it } from 'vitest';
import { maxRootModulus, polynomialRoots, rootsInsideRadius } from '../../engine/models/polynomialRoots';
import { createRng } from '../../engine/core/random';
import { EngineError } from '../../engine/core/errors';
import { expectAllClose } from '../helpers/expectAllClose';

/** Product of two polynomials given by ascending coefficients. */
function multiply(a: number[], b: number[]): number[] {
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  a.forEach((x, i) => b.forEach((y, j) => (out[i + j] = (out[i + j] as number) + x * y)));
  return out;
}

function sortedModuli(c: number[]): number[] {
  const { re, im } = polynomialRoots(c);
  return Array.from(re, (r, i) => Math.hypot(r, im[i] as number)).sort((a, b) => a - b);
}

describe('polynomialRoots', () => {
  it('finds the roots of (z − 1)(z − 2)(z + 0.5) = z³ − 2.5z² + 0.5z + 1', () => {
    const { re, im } = polynomialRoots([1, 0.5, -2.5, 1]);
    const order = Array.from(re.keys()).sort((a, b) => (re[a] as number) - (re[b] as number));
    expectAllClose(
      order.map((k) => re[k] as number),
      [-0.5, 1, 2],
      1e-13,
      're',
    );
    expectAllClose(
      order.map((k) => im[k] as number),
      [0, 0, 0],
      1e-13,
      'im',
    );
  });

  it('finds complex roots: z² + 1 has ±i; z⁸ − 1 has eight roots of modulus 1', () => {
    expectAllClose(sortedModuli([1, 0, 1]), [1, 1], 1e-14);
    expectAllClose(sortedModuli([-1, 0, 0, 0, 0, 0, 0, 0, 1]), new Array(8).fill(1), 1e-13);
  });

  it('handles leading and trailing zero coefficients', () => {
    // 0 + 0·z + 2z² − 2z³ + 0·z⁴ → roots 0, 0, 1
    expectAllClose(sortedModuli([0, 0, 2, -2, 0]), [0, 0, 1], 1e-14);
  });

  it('resolves a root just inside the unit circle from one just outside (as the admissibility test needs)', () => {
    expect(maxRootModulus([-(1 - 1e-9), 1])).toBeLessThan(1);
    expect(maxRootModulus([-(1 + 1e-9), 1]) > 1 + 1e-10).toBe(true);
    // (z − 0.999999999)(z − 0.3)(z + 0.6)(z² + 0.25)
    const c = multiply(multiply(multiply([-0.999999999, 1], [-0.3, 1]), [0.6, 1]), [0.25, 0, 1]);
    expect(maxRootModulus(c)).toBeLessThan(1);
    expect(maxRootModulus(c)).toBeGreaterThan(0.9999999);
  });

  it('refuses the zero polynomial and non-finite coefficients', () => {
    expect(() => polynomialRoots([0, 0])).toThrow(EngineError);
    expect(() => polynomialRoots([1, NaN])).toThrow(EngineError);
  });
});

describe('rootsInsideRadius (Schur–Cohn)', () => {
  it('agrees with the largest root modulus on random polynomials away from the circle', () => {
    const rng = createRng(17);
    let checked = 0;
    for (let trial = 0; trial < 2000; trial++) {
      const degree = 2 + rng.nextInt(12);
      const c = Array.from({ length: degree + 1 }, () => rng.normal());
      c[degree] = 1;
      const max = maxRootModulus(c);
      if (Math.abs(max - 1) < 1e-6) continue;
      expect(rootsInsideRadius(c, 1), `trial ${trial}, max |root| ${max}`).toBe(max < 1);
      checked++;
    }
    expect(checked).toBeGreaterThan(1900);
  });

  it('keeps a root exactly at 1 inside a radius of 1 + 1e−10 (the seasonal ETS case β = 0, φ = 1)', () => {
    // ETS(A,N,A), m = 7, α = 0.3, γ = 0.01: the characteristic polynomial has the root z = 1.
    const alpha = 0.3;
    const gamma = 0.01;
    const c = [1 - alpha - gamma, gamma - 1, 0, 0, 0, 0, 0, alpha - 1, 1];
    expectAllClose([maxRootModulus(c)], [1], 1e-12);
    expect(rootsInsideRadius(c, 1 + 1e-10)).toBe(true);
    expect(rootsInsideRadius(c, 1 - 1e-10)).toBe(false);
  });

  it('counts a root on the circle as outside and refuses a bad radius', () => {
    expect(rootsInsideRadius([-1, 1], 1)).toBe(false);
    expect(rootsInsideRadius([-0.5, 1], 1)).toBe(true);
    expect(() => rootsInsideRadius([1, 1], 0)).toThrow(EngineError);
  });
});
