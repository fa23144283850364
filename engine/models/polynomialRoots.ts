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
 * Complexity: O(d²) per sweep, usually fewer than 20 sweeps.
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
  let previousMoved = Infinity;
  for (let sweep = 0; sweep < 500; sweep++) {
    let moved = 0;
    for (let k = 0; k < degree; k++) {
      const zr = re[k] as number;
      const zi = im[k] as number;
      evaluate(zr, zi, pd);
      const pr = pd[0] as number;
      const pi = pd[1] as number;
      const dr = pd[2] as number;
      const di = pd[3] as number;
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
      const size = Math.sqrt((wr * wr + wi * wi) / Math.max(1e-300, zr * zr + zi * zi));
      if (size > moved) moved = size;
    }
    // Converged, or rounding noise: corrections no longer shrink once they are tiny.
    if (moved < 1e-15 || (moved < 1e-11 && moved >= previousMoved)) break;
    previousMoved = moved;
  }
  // One Newton step per root on the original polynomial.
  for (let k = 0; k < degree; k++) {
    evaluate(re[k] as number, im[k] as number, pd);
    const pr = pd[0] as number;
    const pi = pd[1] as number;
    const dr = pd[2] as number;
    const di = pd[3] as number;
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
  for (let k = 0; k < re.length; k++) {
    const r = re[k] as number;
    const i = im[k] as number;
    max = Math.max(max, Math.sqrt(r * r + i * i));
  }
  return max;
}

/**
 * Work space of rootsInsideRadius (the polynomial and its reduction), grown when needed and
 * reused: the ETS admissibility test calls it at every likelihood evaluation. Every entry is
 * written before it is read.
 */
let schurScratch = new Float64Array(0);

/**
 * True when every root of c[0] + c[1]·z + … + c[d]·z^d has modulus below `radius`, by the
 * Schur–Cohn test (Henrici 1974, Applied and Computational Complex Analysis, vol. 1,
 * section 6.8): with q(w) = p(radius·w), all roots lie in the unit disk iff |q_0| < |q_d| and
 * the reduced polynomial (q_d·q(w) − q_0·q*(w))/w of degree d − 1 has the same property.
 * Exact apart from rounding and free of iteration, so much cheaper than finding the roots;
 * a root on the circle counts as outside.
 *
 * Complexity: O(d²).
 *
 * @throws EngineError INVALID_ARGUMENT as {@link polynomialRoots}, or for a radius ≤ 0.
 * @example rootsInsideRadius([2, -3, 1], 1.5) // false (roots 1 and 2)
 */
export function rootsInsideRadius(coefficients: ArrayLike<number>, radius: number): boolean {
  if (!(radius > 0) || !Number.isFinite(radius)) {
    throw new EngineError('INVALID_ARGUMENT', `radius must be positive and finite, got ${radius}`);
  }
  let degree = coefficients.length - 1;
  for (let i = 0; i <= degree; i++) {
    if (!Number.isFinite(coefficients[i])) {
      throw new EngineError('INVALID_ARGUMENT', `polynomial coefficient ${i} is not finite`);
    }
  }
  while (degree >= 0 && coefficients[degree] === 0) degree--;
  if (degree < 0) throw new EngineError('INVALID_ARGUMENT', 'the zero polynomial has no defined roots');
  if (schurScratch.length < 2 * (degree + 1)) schurScratch = new Float64Array(2 * (degree + 1));
  const q = schurScratch.subarray(0, degree + 1);
  let power = 1;
  for (let k = 0; k <= degree; k++) {
    q[k] = (coefficients[k] as number) * power;
    power *= radius;
  }
  const next = schurScratch.subarray(degree + 1, 2 * (degree + 1));
  for (let d = degree; d > 0; d--) {
    const q0 = q[0] as number;
    const qd = q[d] as number;
    if (Math.abs(q0) >= Math.abs(qd)) return false;
    let scale = 0;
    for (let k = 0; k < d; k++) {
      const v = qd * (q[k + 1] as number) - q0 * (q[d - 1 - k] as number);
      next[k] = v;
      scale = Math.max(scale, Math.abs(v));
    }
    // Rescale so repeated products neither overflow nor underflow.
    for (let k = 0; k < d; k++) q[k] = (next[k] as number) / scale;
  }
  return true;
}
