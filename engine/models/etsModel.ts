/**
 * Types of Ebbline's ETS models: the additive-error exponential smoothing state space
 * models of Hyndman, Koehler, Ord and Snyder (2008), Forecasting with Exponential
 * Smoothing, Springer, class 1 (additive error, no/additive/damped trend, no/additive
 * season): ETS(A,N,N), (A,A,N), (A,Ad,N), (A,N,A), (A,A,A), (A,Ad,A). In innovations form
 * (FPP3 section 8.7, Hyndman and Athanasopoulos):
 *
 *   y_t = ℓ_{t−1} + φ b_{t−1} + s_{t−m} + ε_t
 *   ℓ_t = ℓ_{t−1} + φ b_{t−1} + α ε_t
 *   b_t = φ b_{t−1} + β ε_t
 *   s_t = s_{t−m} + γ ε_t,      ε_t ~ N(0, σ²) independent.
 *
 * (β here is forecast's β = α·β* of the smoothing form; φ = 1 for an undamped trend.)
 *
 * State vectors follow R forecast's layout: [ℓ, b (when there is a trend), s_1 … s_m
 * (when seasonal)] where s_1 is the most recent seasonal state and s_m the oldest, the one
 * the next observation uses.
 */
import { EngineError } from '../core/errors';

/** Trend component: none, additive, additive damped. */
export type EtsTrend = 'N' | 'A' | 'Ad';
/** Seasonal component: none or additive. */
export type EtsSeason = 'N' | 'A';

/** Which model of the family, and its seasonal period (1 when non-seasonal). */
export interface EtsSpec {
  readonly error: 'A';
  readonly trend: EtsTrend;
  readonly season: EtsSeason;
  readonly period: number;
}

/** Smoothing parameters; null where the model has no such component. */
export interface EtsParameters {
  readonly alpha: number;
  readonly beta: number | null;
  readonly gamma: number | null;
  readonly phi: number | null;
}

/** How the smoothing parameters are restricted during estimation (forecast's `bounds`). */
export type EtsBounds = 'usual' | 'admissible' | 'both';

/** What to fit: the model, and optionally parameters held fixed. */
export interface EtsConfig {
  readonly error?: 'A';
  readonly trend: EtsTrend;
  readonly season: EtsSeason;
  /** Seasonal period m (required and 2..24 when season is 'A'). */
  readonly period?: number;
  /** Fix α (and likewise β, γ, φ) instead of estimating it. */
  readonly alpha?: number;
  readonly beta?: number;
  readonly gamma?: number;
  readonly phi?: number;
  /** Parameter space. Default 'both' (usual and admissible), as forecast::ets. */
  readonly bounds?: EtsBounds;
  /** Lower limits for [α, β, γ, φ]. Default [1e−4, 1e−4, 1e−4, 0.8]. */
  readonly lower?: readonly [number, number, number, number];
  /** Upper limits for [α, β, γ, φ]. Default [0.9999, 0.9999, 0.9999, 0.98]. */
  readonly upper?: readonly [number, number, number, number];
  /** Nelder–Mead evaluation limit per optimiser run. Default 2000, as forecast::ets. */
  readonly maxEvaluations?: number;
  /**
   * 'forecast': forecast::ets's optimisation exactly (one Nelder–Mead run in the raw
   * parameters). 'refined' (default): the same run, then Nelder–Mead restarted from its
   * optimum with the initial states centred and scaled by the data's spread, until a restart
   * no longer improves the likelihood (at most 3 restarts). forecast's run takes its simplex
   * step from the largest parameter, so its result depends on the units of the data (cents
   * or euros); the restarts remove most of that dependence and never lower the likelihood.
   */
  readonly optimizer?: 'forecast' | 'refined';
}

/** A fitted ETS model: plain data, safe to post to a worker or store. */
export interface FittedEts {
  readonly kind: 'ets';
  readonly spec: EtsSpec;
  /** e.g. 'ETS(A,Ad,N)'. */
  readonly method: string;
  readonly parameters: EtsParameters;
  /** Initial state x_0 (forecast layout, all m seasonal states). */
  readonly initialState: Float64Array;
  /** States x_0 … x_n, row-major, `stateWidth` values per row. */
  readonly states: Float64Array;
  readonly stateWidth: number;
  /** x_n, the state forecasts start from. */
  readonly lastState: Float64Array;
  /** One-step errors ε_t = y_t − ŷ_{t|t−1}. */
  readonly residuals: Float64Array;
  /** One-step fitted values ŷ_{t|t−1}. */
  readonly fitted: Float64Array;
  readonly n: number;
  readonly sse: number;
  /**
   * forecast::ets's log-likelihood, −½·n·log(SSE): the concentrated Gaussian likelihood
   * without its constant terms. The full Gaussian log-likelihood at σ̂² = SSE/n is
   * `gaussianLoglik`; the two differ by a constant for a given n, so model ranking agrees.
   */
  readonly loglik: number;
  /** −(n/2)·(log(2π·SSE/n) + 1). */
  readonly gaussianLoglik: number;
  /** AIC = −2·loglik + 2k, with k = estimated parameters + initial states + 1 (σ²), as forecast::ets. */
  readonly aic: number;
  /** AICc = AIC + 2k(k + 1)/(n − k − 1); +Infinity when n − k − 1 = 0 (as forecast). */
  readonly aicc: number;
  readonly bic: number;
  /** Number k used in the information criteria. */
  readonly informationParameters: number;
  /** σ² = SSE/(n − p), p = smoothing parameters + free initial states (forecast::ets). */
  readonly sigma2: number;
  /** SSE/n. */
  readonly mse: number;
  /**
   * True when the series was constant (to within R's all.equal tolerance) and forecast's
   * fit for that case was returned: ETS(A,N,N), α = 0.99999, ℓ0 = y0 (exactly constant:
   * σ² = 0 and criteria −Infinity).
   */
  readonly constant: boolean;
  /**
   * Optimiser outcome (null when nothing was estimated): total likelihood evaluations, the
   * status of forecast's run (0 converged, 1 evaluation limit, 10 degenerate simplex) and the
   * number of refining restarts that improved the fit.
   */
  readonly optimizer: {
    readonly evaluations: number;
    readonly status: 0 | 1 | 10;
    readonly strategy: 'forecast' | 'refined';
    readonly improvingRestarts: number;
  } | null;
}

/**
 * The model name in the taxonomy of Hyndman et al. (2008), e.g. `ETS(A,Ad,A)`.
 *
 * @example etsMethodName({ error: 'A', trend: 'Ad', season: 'N', period: 1 }) // 'ETS(A,Ad,N)'
 */
export function etsMethodName(spec: EtsSpec): string {
  return `ETS(${spec.error},${spec.trend},${spec.season})`;
}

/**
 * Length of the state vector: 1 (level) + 1 (trend) + m (season).
 *
 * @example etsStateWidth({ error: 'A', trend: 'A', season: 'A', period: 7 }) // 9
 */
export function etsStateWidth(spec: EtsSpec): number {
  return 1 + (spec.trend === 'N' ? 0 : 1) + (spec.season === 'A' ? spec.period : 0);
}

/** Largest seasonal period the ETS models accept (forecast::ets's limit). */
export const MAX_ETS_PERIOD = 24;

/**
 * Builds and checks an {@link EtsSpec} from a configuration.
 *
 * @throws EngineError INVALID_ARGUMENT for an unknown component, a seasonal model without an
 *   integer period in 2..24, or a non-seasonal one with a period below 1.
 * @example etsSpec({ trend: 'A', season: 'A', period: 12 }).period // 12
 */
export function etsSpec(config: Pick<EtsConfig, 'error' | 'trend' | 'season' | 'period'>): EtsSpec {
  const error = config.error ?? 'A';
  if (error !== 'A')
    throw new EngineError('INVALID_ARGUMENT', `only additive errors are supported, got ${String(error)}`);
  if (config.trend !== 'N' && config.trend !== 'A' && config.trend !== 'Ad') {
    throw new EngineError('INVALID_ARGUMENT', `trend must be 'N', 'A' or 'Ad', got ${String(config.trend)}`);
  }
  if (config.season !== 'N' && config.season !== 'A') {
    throw new EngineError('INVALID_ARGUMENT', `season must be 'N' or 'A', got ${String(config.season)}`);
  }
  if (config.season === 'A') {
    const m = config.period;
    if (m === undefined || !Number.isInteger(m) || m < 2 || m > MAX_ETS_PERIOD) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        `a seasonal ETS model needs an integer period from 2 to ${MAX_ETS_PERIOD}, got ${String(m)}; ` +
          'longer periods belong to the decomposition + ETS model',
      );
    }
    return { error, trend: config.trend, season: 'A', period: m };
  }
  return { error, trend: config.trend, season: 'N', period: 1 };
}
