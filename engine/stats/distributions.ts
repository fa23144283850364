/**
 * The few distribution functions the series tests need: log-gamma, the regularised
 * incomplete gamma functions, the chi-square distribution and the standard normal
 * distribution and quantile. Checked against R's lgamma, pgamma, pchisq, pnorm and qnorm
 * (test/fixtures/stats/distributions.json).
 */
import { EngineError } from '../core/errors';

const LOG_SQRT_2PI = 0.9189385332046727; // ½ ln(2π)
const EPSILON = 1e-16;
const TINY = 1e-300;
const MAX_ITERATIONS = 100_000;
const STIRLING_MIN = 15;

/**
 * ln Γ(x) for x > 0: Stirling's series with eight Bernoulli terms (Abramowitz and Stegun
 * 1964, 6.1.40) for x ≥ 15, shifted up by the recurrence Γ(x + 1) = xΓ(x) below that.
 * Absolute error below about 5e-14 over (0, ∞).
 *
 * @throws EngineError INVALID_ARGUMENT when x is not a positive finite number.
 * @example logGamma(5) // ln 24 = 3.1780538303479458
 */
export function logGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) {
    throw new EngineError('INVALID_ARGUMENT', `logGamma needs a positive finite argument, got ${x}`);
  }
  let shift = 0;
  let product = 1;
  let z = x;
  while (z < STIRLING_MIN) {
    product *= z;
    z += 1;
  }
  if (product !== 1) shift = Math.log(product);
  const inv = 1 / z;
  const inv2 = inv * inv;
  // B_2k / (2k (2k − 1) z^(2k−1)) for k = 1..8.
  const series =
    inv *
    (1 / 12 +
      inv2 *
        (-1 / 360 +
          inv2 *
            (1 / 1260 +
              inv2 *
                (-1 / 1680 +
                  inv2 * (1 / 1188 + inv2 * (-691 / 360360 + inv2 * (1 / 156 + inv2 * (-3617 / 122400))))))));
  return (z - 0.5) * Math.log(z) - z + LOG_SQRT_2PI + series - shift;
}

function checkGammaArguments(a: number, x: number, what: string): void {
  if (!(a > 0) || !Number.isFinite(a)) {
    throw new EngineError('INVALID_ARGUMENT', `${what}: shape must be positive and finite, got ${a}`);
  }
  if (!(x >= 0) || Number.isNaN(x)) {
    throw new EngineError('INVALID_ARGUMENT', `${what}: x must be non-negative, got ${x}`);
  }
}

/** exp(−x + a ln x − ln Γ(a)), the factor in front of both expansions. */
function gammaPrefactor(a: number, x: number): number {
  return Math.exp(-x + a * Math.log(x) - logGamma(a));
}

/** P(a, x) by its power series; converges quickly for x < a + 1 (Press et al., gser). */
function lowerGammaSeries(a: number, x: number): number {
  let ap = a;
  let term = 1 / a;
  let sum = term;
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    ap += 1;
    term *= x / ap;
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * EPSILON) return sum * gammaPrefactor(a, x);
  }
  throw new EngineError('INVALID_ARGUMENT', `incomplete gamma series did not converge for a = ${a}, x = ${x}`);
}

/** Q(a, x) by its continued fraction, modified Lentz method; for x ≥ a + 1 (Press et al., gcf). */
function upperGammaFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_ITERATIONS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) return h * gammaPrefactor(a, x);
  }
  throw new EngineError('INVALID_ARGUMENT', `incomplete gamma fraction did not converge for a = ${a}, x = ${x}`);
}

/**
 * Regularised lower incomplete gamma function P(a, x) = γ(a, x)/Γ(a), the CDF of a
 * Gamma(shape a, scale 1) variable at x: the power series for x < a + 1, one minus the
 * continued fraction otherwise (Press, Teukolsky, Vetterling and Flannery, Numerical
 * Recipes, 2nd ed. 1992, §6.2). Iterations grow like √a.
 *
 * @throws EngineError INVALID_ARGUMENT when a ≤ 0 or x < 0 (or either is NaN).
 * @example regularizedGammaP(1, 1) // 1 − e⁻¹ = 0.6321205588285577
 */
export function regularizedGammaP(a: number, x: number): number {
  checkGammaArguments(a, x, 'regularizedGammaP');
  if (x === 0) return 0;
  if (x === Infinity) return 1;
  return x < a + 1 ? lowerGammaSeries(a, x) : 1 - upperGammaFraction(a, x);
}

/**
 * Regularised upper incomplete gamma function Q(a, x) = 1 − P(a, x), computed directly
 * (not as 1 − P) so that tiny upper-tail probabilities keep their relative precision
 * (Press et al. 1992, §6.2). Iterations grow like √a.
 *
 * @throws EngineError INVALID_ARGUMENT when a ≤ 0 or x < 0 (or either is NaN).
 * @example regularizedGammaQ(1, 1) // e⁻¹ = 0.36787944117144233
 */
export function regularizedGammaQ(a: number, x: number): number {
  checkGammaArguments(a, x, 'regularizedGammaQ');
  if (x === 0) return 1;
  if (x === Infinity) return 0;
  return x < a + 1 ? 1 - lowerGammaSeries(a, x) : upperGammaFraction(a, x);
}

function checkDegreesOfFreedom(df: number, what: string): void {
  if (!(df > 0) || !Number.isFinite(df)) {
    throw new EngineError('INVALID_ARGUMENT', `${what}: degrees of freedom must be positive, got ${df}`);
  }
}

/**
 * Chi-square CDF P(X ≤ x) with `df` degrees of freedom: P(df/2, x/2). Like R's
 * `pchisq(x, df)`.
 *
 * @throws EngineError INVALID_ARGUMENT when df ≤ 0 or x is NaN; x < 0 gives 0.
 * @example chiSquareCdf(3.841458820694124, 1) // 0.95
 */
export function chiSquareCdf(x: number, df: number): number {
  checkDegreesOfFreedom(df, 'chiSquareCdf');
  if (Number.isNaN(x)) throw new EngineError('INVALID_ARGUMENT', 'chiSquareCdf: x is NaN');
  return x <= 0 ? 0 : regularizedGammaP(df / 2, x / 2);
}

/**
 * Chi-square upper tail P(X > x) with `df` degrees of freedom: Q(df/2, x/2), accurate
 * also where it is far below machine epsilon. Like R's `pchisq(x, df, lower.tail = FALSE)`.
 *
 * @throws EngineError INVALID_ARGUMENT when df ≤ 0 or x is NaN; x < 0 gives 1.
 * @example chiSquareSurvival(1.5166667, 2) // 0.4684465 (Ljung–Box of 1..5 at lag 2)
 */
export function chiSquareSurvival(x: number, df: number): number {
  checkDegreesOfFreedom(df, 'chiSquareSurvival');
  if (Number.isNaN(x)) throw new EngineError('INVALID_ARGUMENT', 'chiSquareSurvival: x is NaN');
  return x <= 0 ? 1 : regularizedGammaQ(df / 2, x / 2);
}

/**
 * Standard normal CDF Φ(x) through the error function as an incomplete gamma function,
 * erf(z) = P(½, z²) (Abramowitz and Stegun 1964, 6.5.16 and 7.1.2): Φ(x) = ½Q(½, x²/2)
 * for x < 0 and 1 − ½Q(½, x²/2) for x ≥ 0, so the lower tail keeps full relative precision
 * down to about x = −37. Like R's `pnorm(x)`.
 *
 * @throws EngineError INVALID_ARGUMENT when x is NaN.
 * @example normalCdf(1.959963984540054) // 0.975
 */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) throw new EngineError('INVALID_ARGUMENT', 'normalCdf: x is NaN');
  if (x === 0) return 0.5;
  const half = 0.5 * regularizedGammaQ(0.5, 0.5 * x * x);
  return x < 0 ? half : 1 - half;
}

// Wichura (1988), Algorithm AS 241 (PPND16), Applied Statistics 37(3), 477–484. The published
// coefficients have 20 digits; each is written as the shortest decimal of the same double.
const AS241_A = [
  3.3871328727963665, 133.14166789178438, 1971.5909503065513, 13731.69376550946, 45921.95393154987, 67265.7709270087,
  33430.57558358813, 2509.0809287301227,
];
const AS241_B = [
  1, 42.31333070160091, 687.1870074920579, 5394.196021424751, 21213.794301586597, 39307.89580009271, 28729.085735721943,
  5226.495278852854,
];
const AS241_C = [
  1.4234371107496835, 4.630337846156546, 5.769497221460691, 3.6478483247632045, 1.2704582524523684, 0.2417807251774506,
  0.022723844989269184, 0.0007745450142783414,
];
const AS241_D = [
  1, 2.053191626637759, 1.6763848301838038, 0.6897673349851, 0.14810397642748008, 0.015198666563616457,
  0.0005475938084995345, 1.0507500716444169e-9,
];
const AS241_E = [
  6.657904643501103, 5.463784911164114, 1.7848265399172913, 0.29656057182850487, 0.026532189526576124,
  0.0012426609473880784, 0.000027115555687434876, 2.0103343992922881e-7,
];
const AS241_F = [
  1, 0.599832206555888, 0.1369298809227358, 0.014875361290850615, 0.0007868691311456133, 0.000018463183175100548,
  1.421511758316446e-7, 2.0442631033899397e-15,
];

function polynomial(coefficients: readonly number[], x: number): number {
  let value = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) value = value * x + (coefficients[i] as number);
  return value;
}

/**
 * Standard normal quantile Φ⁻¹(p) by Wichura's rational approximations (Algorithm AS 241,
 * PPND16, Applied Statistics 37(3), 1988), accurate to about 1 part in 10¹⁶, the method
 * behind R's `qnorm(p)`.
 *
 * @throws EngineError INVALID_ARGUMENT unless 0 < p < 1 (the quantiles at 0 and 1 are infinite).
 * @example normalQuantile(0.975) // 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) {
    throw new EngineError('INVALID_ARGUMENT', `normalQuantile needs 0 < p < 1, got ${p}`);
  }
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (q * polynomial(AS241_A, r)) / polynomial(AS241_B, r);
  }
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  let value: number;
  if (r <= 5) {
    r -= 1.6;
    value = polynomial(AS241_C, r) / polynomial(AS241_D, r);
  } else {
    r -= 5;
    value = polynomial(AS241_E, r) / polynomial(AS241_F, r);
  }
  return q < 0 ? -value : value;
}
