/**
 * The parameter space of the additive ETS models, as forecast::ets restricts it:
 *
 * - "usual" bounds (Hyndman et al. 2008, section 10.1): each parameter in [lower, upper]
 *   with 0 < β ≤ α and 0 < γ ≤ 1 − α, and φ in [0.8, 0.98] by default;
 * - "admissible" bounds (Hyndman et al. 2008, chapter 10; Hyndman, Akram and Archibald 2008,
 *   "The admissible parameter space for exponential smoothing models", Annals of the
 *   Institute of Statistical Mathematics 60(2)): the model is forecastable, i.e. the
 *   discount matrix has all eigenvalues inside the unit circle. For seasonal models this is
 *   checked, as forecast does, through the roots of the characteristic polynomial
 *   φ(1−α−γ) + (α+β−αφ+γ−1)z + (α+β−αφ)(z² + … + z^{m−1}) + (α+β−φ)z^m + z^{m+1}
 *   (all of modulus below 1 + 1e−10, decided by the Schur–Cohn test rather than by finding
 *   the roots as forecast does: the same criterion, without iteration), after the
 *   closed-form necessary conditions.
 */
import { rootsInsideRadius } from './polynomialRoots';
import type { EtsBounds } from './etsModel';

/** forecast::ets's default lower limits for [α, β, γ, φ]. */
export const DEFAULT_LOWER: readonly [number, number, number, number] = [1e-4, 1e-4, 1e-4, 0.8];
/** forecast::ets's default upper limits for [α, β, γ, φ]. */
export const DEFAULT_UPPER: readonly [number, number, number, number] = [0.9999, 0.9999, 0.9999, 0.98];

/** Parameter values to test; null where the model lacks the component. */
export interface EtsParameterValues {
  readonly alpha: number;
  readonly beta: number | null;
  readonly gamma: number | null;
  readonly phi: number | null;
}

/** Which parameters are being estimated (only those are held to the usual bounds). */
export interface EtsEstimated {
  readonly alpha: boolean;
  readonly beta: boolean;
  readonly gamma: boolean;
  readonly phi: boolean;
}

/**
 * Coefficients of the characteristic polynomial, one array per period, reused: the test runs
 * at every likelihood evaluation of a seasonal fit, and every entry is written before use.
 */
const coefficientScratch: Float64Array[] = [];

/**
 * True when the parameters lie in forecast::ets's admissible region for period m.
 *
 * Complexity: O(m²) for seasonal models (Schur–Cohn test), O(1) otherwise.
 *
 * @example etsAdmissible({ alpha: 0.5, beta: null, gamma: null, phi: null }, 1) // true
 */
export function etsAdmissible(p: EtsParameterValues, period: number): boolean {
  const phi = p.phi ?? 1;
  if (phi < 0 || phi > 1 + 1e-8) return false;
  const alpha = p.alpha;
  if (p.gamma === null) {
    if (alpha < 1 - 1 / phi || alpha > 1 + 1 / phi) return false;
    if (p.beta !== null && (p.beta < alpha * (phi - 1) || p.beta > (1 + phi) * (2 - alpha))) return false;
    return true;
  }
  const m = period;
  if (m <= 1) return true;
  const beta = p.beta ?? 0;
  const gamma = p.gamma;
  if (gamma < Math.max(1 - 1 / phi - alpha, 0) || gamma > 1 + 1 / phi - alpha) return false;
  if (alpha < 1 - 1 / phi - (gamma * (1 - m + phi + phi * m)) / (2 * phi * m)) return false;
  if (beta < -(1 - phi) * (gamma / m + alpha)) return false;
  const c = (coefficientScratch[m] ??= new Float64Array(m + 2));
  c[0] = phi * (1 - alpha - gamma);
  c[1] = alpha + beta - alpha * phi + gamma - 1;
  for (let k = 2; k < m; k++) c[k] = alpha + beta - alpha * phi;
  c[m] = alpha + beta - phi;
  c[m + 1] = 1;
  return rootsInsideRadius(c, 1 + 1e-10);
}

/**
 * forecast's parameter check: the usual bounds for the estimated parameters (when bounds
 * is 'usual' or 'both') and admissibility of all of them (when 'admissible' or 'both').
 *
 * @example etsParametersAllowed({ alpha: 0.3, beta: 0.1, gamma: null, phi: null }, { alpha: true, beta: true, gamma: false, phi: false }, DEFAULT_LOWER, DEFAULT_UPPER, 'both', 1) // true
 */
export function etsParametersAllowed(
  p: EtsParameterValues,
  estimated: EtsEstimated,
  lower: readonly number[],
  upper: readonly number[],
  bounds: EtsBounds,
  period: number,
): boolean {
  if (bounds !== 'admissible') {
    if (estimated.alpha && (p.alpha < (lower[0] as number) || p.alpha > (upper[0] as number))) return false;
    if (estimated.beta && p.beta !== null) {
      if (p.beta < (lower[1] as number) || p.beta > p.alpha || p.beta > (upper[1] as number)) return false;
    }
    if (estimated.phi && p.phi !== null && (p.phi < (lower[3] as number) || p.phi > (upper[3] as number))) return false;
    if (estimated.gamma && p.gamma !== null) {
      if (p.gamma < (lower[2] as number) || p.gamma > 1 - p.alpha || p.gamma > (upper[2] as number)) return false;
    }
  }
  if (bounds !== 'usual' && !etsAdmissible(p, period)) return false;
  return true;
}
