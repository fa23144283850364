/**
 * MacKinnon's response surfaces for the Dickey–Fuller τ statistic (one I(1) series, N = 1):
 * approximate p-values (MacKinnon 1994, 1996) and finite-sample critical values (MacKinnon
 * 2010). The coefficients are those of statsmodels 0.13.5, statsmodels/tsa/adfvalues.py.
 */
import { EngineError } from '../core/errors';
import { normalCdf } from './distributions';

/** The deterministic terms of the Dickey–Fuller regression: a constant, or a constant and a linear trend. */
export type DickeyFullerDeterministic = 'constant' | 'constantTrend';

/** Critical values of τ at the 1%, 5% and 10% levels: reject a unit root when τ is below them. */
export interface DickeyFullerCriticalValues {
  readonly p01: number;
  readonly p05: number;
  readonly p10: number;
}

interface PValueSurface {
  /** τ above this gives p = 1. */
  readonly max: number;
  /** τ below this gives p = 0. */
  readonly min: number;
  /** τ ≤ star uses the small-p polynomial, τ > star the large-p one. */
  readonly star: number;
  /** Φ(Σ c_i τ^i) coefficients, constant first, already scaled. */
  readonly small: readonly number[];
  readonly large: readonly number[];
}

// MacKinnon (1994), Tables 3 and 4, N = 1, as tau_*_smallp / tau_*_largep in statsmodels; the
// small-p τ² coefficient is scaled by 1e-2, the large-p τ, τ², τ³ ones by 1e-1, 1e-1, 1e-2.
const P_VALUE_SURFACES: Record<DickeyFullerDeterministic, PValueSurface> = {
  constant: {
    max: 2.74,
    min: -18.83,
    star: -1.61,
    small: [2.1659, 1.4412, 3.8269e-2],
    large: [1.7339, 9.3202e-1, -1.2745e-1, -1.0368e-2],
  },
  constantTrend: {
    max: 0.7,
    min: -16.18,
    star: -2.89,
    small: [3.2512, 1.6047, 4.9588e-2],
    large: [2.5261, 6.1654e-1, -3.7956e-1, -6.0285e-2],
  },
};

// MacKinnon (2010), Table 2, N = 1: β∞, β1, β2, β3 of c(T) = β∞ + β1/T + β2/T² + β3/T³ at 1%, 5%, 10%.
const CRITICAL_SURFACES: Record<DickeyFullerDeterministic, readonly (readonly number[])[]> = {
  constant: [
    [-3.43035, -6.5393, -16.786, -79.433],
    [-2.86154, -2.8903, -4.234, -40.04],
    [-2.56677, -1.5384, -2.809, 0],
  ],
  constantTrend: [
    [-3.95877, -9.0531, -28.428, -134.155],
    [-3.41049, -4.3904, -9.036, -45.374],
    [-3.12705, -2.5856, -3.925, -22.38],
  ],
};

function polynomial(coefficients: readonly number[], x: number): number {
  let value = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) value = value * x + (coefficients[i] as number);
  return value;
}

/**
 * Approximate p-value of a Dickey–Fuller τ statistic from MacKinnon's response surfaces:
 * p = Φ(γ₀ + γ₁τ + γ₂τ² [+ γ₃τ³]), one polynomial for the left tail and one for the rest,
 * 0 below and 1 above the range the surfaces were fitted on (MacKinnon 1994, J. Business and
 * Economic Statistics 12(2), 167–176; MacKinnon 1996, J. Applied Econometrics 11(6),
 * 601–618). Same value as statsmodels `mackinnonp(tau, regression, N=1)`.
 *
 * @throws EngineError INVALID_ARGUMENT when tau is not finite.
 * @example mackinnonPValue(-2.86154, 'constant') // ≈ 0.05
 */
export function mackinnonPValue(tau: number, deterministic: DickeyFullerDeterministic): number {
  if (!Number.isFinite(tau)) throw new EngineError('INVALID_ARGUMENT', `mackinnonPValue: tau is ${tau}`);
  const s = P_VALUE_SURFACES[deterministic];
  if (tau > s.max) return 1;
  if (tau < s.min) return 0;
  return normalCdf(polynomial(tau <= s.star ? s.small : s.large, tau));
}

/**
 * Finite-sample critical values of the Dickey–Fuller τ statistic for a regression on `nobs`
 * observations: c(T) = β∞ + β1/T + β2/T² + β3/T³ (MacKinnon 2010, Queen's Economics
 * Department Working Paper 1227, Table 2). Same values as statsmodels
 * `mackinnoncrit(N=1, regression, nobs)`.
 *
 * @throws EngineError INVALID_ARGUMENT unless nobs is a positive integer.
 * @example mackinnonCriticalValues(95, 'constant').p05 // −2.8925…
 */
export function mackinnonCriticalValues(
  nobs: number,
  deterministic: DickeyFullerDeterministic,
): DickeyFullerCriticalValues {
  if (!Number.isInteger(nobs) || nobs < 1) {
    throw new EngineError('INVALID_ARGUMENT', `mackinnonCriticalValues: nobs must be a positive integer, got ${nobs}`);
  }
  const [c01, c05, c10] = CRITICAL_SURFACES[deterministic].map((b) => polynomial(b, 1 / nobs)) as [
    number,
    number,
    number,
  ];
  return { p01: c01, p05: c05, p10: c10 };
}
