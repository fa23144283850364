/**
 * All complex roots of a real polynomial, for the admissibility test of seasonal ETS
 * models (the roots of their characteristic polynomial must lie inside the unit circle).
 */
import { EngineError } from '../core/errors';

/** Roots as parallel arrays of real and imaginary parts. */
export interface PolynomialRoots {
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/**
 * Roots of c[0] + c[1]·z + … + c[d]·z^d (ascending coefficients, as R's `polyroot`), by
 * the Aberth–Ehrlich simultaneous iteration (Aberth 1973, Mathematics of Computation
 * 27(122); Ehrlich 1967), started on a circle of Fujiwara's root bound, followed by one Newton
 * polish per root on the original polynomial. Cubic convergence for simple roots; a
 * double root is found to about √ε relative accuracy, as with any method.
 *
 * Leading zero coefficients are dropped; zero roots from trailing zero coefficients are
 * returned exactly.
 *
 * Complexity: O(d²) per sweep, usually fewer than 30 sweeps.
 *
 * @throws EngineError INVALID_ARGUMENT when every coefficient is zero or one is not finite.
 * @example polynomialRoots([-2, 1]) // { re: [2], im: [0] }
 */
export function polynomialRoots(coefficients: ArrayLike<number>): PolynomialRoots {
  let top = coefficients.length - 1;
  for (let i = 0; i <= top; i++) {
    if (!Number.isFinite(coefficients[i])) {
      throw new EngineError('INVALID_ARGUMENT', `polynomial coefficient ${i} is not finite`);
    }
  }
  while (top >= 0 && coefficients[top] === 0) top--;
  if (top < 0) throw new EngineError('INVALID_ARGUMENT', 'the zero polynomial has no defined roots');
  let low = 0;
  while (coefficients[low] === 0) low++;
  const zeroRoots = low;
  const degree = top - low;
  const re = new Float64Array(degree + zeroRoots);
  const im = new Float64Array(degree + zeroRoots);
  if (degree === 0) return { re, im };
  // Monic coefficients a[0..degree], a[degree] = 1.
  const lead = coefficients[top] as number;
  const a = new Float64Array(degree + 1);
  for (let k = 0; k <= degree; k++) a[k] = (coefficients[low + k] as number) / lead;
  if (degree === 1) {
    re[0] = -(a[0] as number);
    return { re, im };
  }
  // Fujiwara's bound: every root has |z| ≤ 2·max_k |a_k|^{1/(d−k)} (a_0 halved).
  let radius = 0;
  for (let k = 0; k < degree; k++) {
    const ak = Math.abs(a[k] as number) / (k === 0 ? 2 : 1);
    radius = Math.max(radius, Math.pow(ak, 1 / (degree - k)));
  }
  radius *= 2;
  for (let k = 0; k < degree; k++) {
    const angle = (2 * Math.PI * k) / degree + 0.4;
    re[k] = radius * Math.cos(angle);
    im[k] = radius * Math.sin(angle);
  }
  const evaluate = (xr: number, xi: number, out: Float64Array): void => {
    // Horner for p and p' at x = xr + i·xi.
    let pr = 1;
    let pi = 0;
    let dr = 0;
    let di = 0;
    for (let k = degree - 1; k >= 0; k--) {
      const ndr = dr * xr - di * xi + pr;
      const ndi = dr * xi + di * xr + pi;
      dr = ndr;
      di = ndi;
      const npr = pr * xr - pi * xi + (a[k] as number);
      const npi = pr * xi + pi * xr;
      pr = npr;
      pi = npi;
    }
    out[0] = pr;
    out[1] = pi;
    out[2] = dr;
    out[3] = di;
  };
  const pd = new Float64Array(4);
  for (let sweep = 0; sweep < 500; sweep++) {
    let moved = 0;
    for (let k = 0; k < degree; k++) {
      const zr = re[k] as number;
      const zi = im[k] as number;
      evaluate(zr, zi, pd);
      const [pr, pi, dr, di] = pd as unknown as [number, number, number, number];
      if (pr === 0 && pi === 0) continue;
      // ratio = p / p'
      const dd = dr * dr + di * di;
      if (dd === 0) continue;
      const rr = (pr * dr + pi * di) / dd;
      const ri = (pi * dr - pr * di) / dd;
      // sum over j ≠ k of 1/(z_k − z_j)
      let sr = 0;
      let si = 0;
      for (let j = 0; j < degree; j++) {
        if (j === k) continue;
        const ur = zr - (re[j] as number);
        const ui = zi - (im[j] as number);
        const uu = ur * ur + ui * ui;
        if (uu === 0) continue;
        sr += ur / uu;
        si += -ui / uu;
      }
      // w = ratio / (1 − ratio·sum)
      const br = 1 - (rr * sr - ri * si);
      const bi = -(rr * si + ri * sr);
      const bb = br * br + bi * bi;
      const wr = bb === 0 ? rr : (rr * br + ri * bi) / bb;
      const wi = bb === 0 ? ri : (ri * br - rr * bi) / bb;
      re[k] = zr - wr;
      im[k] = zi - wi;
      const size = Math.hypot(wr, wi) / Math.max(1e-300, Math.hypot(zr, zi));
      if (size > moved) moved = size;
    }
    if (moved < 4e-16) break;
  }
  // One Newton step per root on the original polynomial.
  for (let k = 0; k < degree; k++) {
    evaluate(re[k] as number, im[k] as number, pd);
    const [pr, pi, dr, di] = pd as unknown as [number, number, number, number];
    const dd = dr * dr + di * di;
    if (dd > 0) {
      re[k] = (re[k] as number) - (pr * dr + pi * di) / dd;
      im[k] = (im[k] as number) - (pi * dr - pr * di) / dd;
    }
  }
  return { re, im };
}

/**
 * The largest modulus among the roots of c[0] + c[1]·z + … + c[d]·z^d.
 *
 * @throws EngineError INVALID_ARGUMENT as {@link polynomialRoots}.
 * @example maxRootModulus([2, -3, 1]) // 2 (roots 1 and 2)
 */
export function maxRootModulus(coefficients: ArrayLike<number>): number {
  const { re, im } = polynomialRoots(coefficients);
  let max = 0;
  for (let k = 0; k < re.length; k++) max = Math.max(max, Math.hypot(re[k] as number, im[k] as number));
  return max;
}
