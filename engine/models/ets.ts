/**
 * Estimation of the additive ETS models by maximum likelihood, as R forecast 8.20's
 * `ets(y, model = …, opt.crit = "lik", bounds = "both")` does it (Hyndman, Koehler, Ord
 * and Snyder 2008, chapter 5; Hyndman, Koehler, Snyder and Grose 2002, IJF 18(3)):
 *
 * - the criterion is the concentrated Gaussian likelihood: minimise n·log(SSE) over the
 *   smoothing parameters and the initial state together (σ² concentrated out);
 * - the optimiser is Nelder–Mead (engine/models/nelderMead.ts) from forecast's starting
 *   values: α = l + 0.2(u − l)/m, β = l + 0.1(min(u, α) − l), γ = l + 0.05(min(u, 1 − α) − l),
 *   φ = l + 0.99(u − l), and the `initstate` heuristic (engine/models/etsInitialStates.ts);
 *   points outside the usual or admissible region score +Infinity;
 * - the seasonal states are constrained to sum to zero (the last one is implied), so a
 *   model estimates m − 1 of them;
 * - by default ('refined') Nelder–Mead is then restarted from forecast's optimum in scaled
 *   coordinates (see EtsConfig.optimizer), which makes the fit nearly independent of the
 *   units of the data; optimizer: 'forecast' reproduces forecast::ets's result exactly.
 */
import { EngineError } from '../core/errors';
import { checkFinite, type Series } from './forecastTypes';
import {
  etsMethodName,
  etsSpec,
  etsStateWidth,
  type EtsBounds,
  type EtsConfig,
  type EtsParameters,
  type EtsSpec,
  type FittedEts,
} from './etsModel';
import { etsFilter, etsSse } from './etsRecursions';
import { etsInitialStates } from './etsInitialStates';
import { accurateMean } from './classicalDecomposition';
import { DEFAULT_LOWER, DEFAULT_UPPER, etsParametersAllowed, type EtsEstimated } from './etsParameterSpace';
import { nelderMead } from './nelderMead';
import { isConstant } from '../stats/isConstant';

/** Number of values in the full initial state that are free (the last seasonal one is implied). */
function freeStateCount(spec: EtsSpec): number {
  return 1 + (spec.trend === 'N' ? 0 : 1) + (spec.season === 'A' ? spec.period - 1 : 0);
}

/**
 * Appends the implied last seasonal state (−Σ of the others) to a free initial state, read
 * from `free` at `offset` on (an offset rather than a subarray: this runs at every
 * likelihood evaluation, and a subarray is an allocation).
 */
function completeState(spec: EtsSpec, free: ArrayLike<number>, offset: number, out: Float64Array): void {
  const width = etsStateWidth(spec);
  const freeCount = freeStateCount(spec);
  let sum = 0;
  const base = spec.trend === 'N' ? 1 : 2;
  for (let j = 0; j < freeCount; j++) {
    const v = free[offset + j] as number;
    out[j] = v;
    if (j >= base) sum += v;
  }
  if (spec.season === 'A') out[width - 1] = -sum;
}

interface Assembled {
  readonly y: Series;
  readonly spec: EtsSpec;
  readonly parameters: EtsParameters;
  readonly initialState: Float64Array;
  /** Estimated smoothing parameters + free initial states (forecast's length(par) before optimising). */
  readonly estimatedCount: number;
  /** Smoothing parameters held fixed. */
  readonly fixedCount: number;
  readonly optimizer: FittedEts['optimizer'];
}

/** Computes states, errors and the information criteria of a fully specified model. */
function summarise(a: Assembled): FittedEts {
  const { y, spec, parameters, initialState } = a;
  const n = y.length;
  const run = etsFilter(y, spec, parameters, initialState);
  const lik = n * Math.log(run.sse);
  const k = a.estimatedCount + 1;
  const aic = lik + 2 * k;
  const bic = lik + Math.log(n) * k;
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity;
  const sigmaDf = n - (a.estimatedCount + a.fixedCount);
  const width = run.width;
  return {
    kind: 'ets',
    spec,
    method: etsMethodName(spec),
    parameters,
    initialState: Float64Array.from(initialState),
    states: run.states,
    stateWidth: width,
    lastState: run.states.slice(n * width, (n + 1) * width),
    residuals: run.residuals,
    fitted: run.fitted,
    n,
    sse: run.sse,
    loglik: -0.5 * lik,
    gaussianLoglik: -(n / 2) * (Math.log((2 * Math.PI * run.sse) / n) + 1),
    aic,
    aicc,
    bic,
    informationParameters: k,
    sigma2: run.sse / sigmaDf,
    mse: run.sse / n,
    constant: false,
    optimizer: a.optimizer,
  };
}

/**
 * The fit forecast::ets returns for a constant series (equal to within R's all.equal
 * tolerance): simple exponential smoothing with α = 0.99999 started at the first value.
 * For an exactly constant series the errors are zero, σ² = 0, the log-likelihood is
 * +Infinity and the information criteria are −Infinity.
 */
function constantFit(y: Series): FittedEts {
  const spec: EtsSpec = { error: 'A', trend: 'N', season: 'N', period: 1 };
  const fit = summarise({
    y,
    spec,
    parameters: { alpha: 0.99999, beta: null, gamma: null, phi: null },
    initialState: Float64Array.of(y[0] as number),
    estimatedCount: 2,
    fixedCount: 0,
    optimizer: null,
  });
  return { ...fit, constant: true };
}

function checkFixed(name: string, value: number | undefined, present: boolean): void {
  if (value === undefined) return;
  if (!present) throw new EngineError('INVALID_ARGUMENT', `${name} was given for a model without that component`);
  if (!Number.isFinite(value)) throw new EngineError('INVALID_ARGUMENT', `${name} must be finite, got ${value}`);
}

/**
 * Fits one model; `enforceShortSeries` adds forecast's rule for an explicitly chosen model
 * (n must exceed the parameter count + 4). Exported for autoEts, which, like forecast's
 * model search, applies only the rule that fewer values must be estimated than n − 1.
 *
 * @throws EngineError as {@link fitEts}.
 * @example estimateEts(y, { trend: 'A', season: 'N' }, false)
 */
export function estimateEts(y: Series, config: EtsConfig, enforceShortSeries: boolean): FittedEts {
  checkFinite(y, 'y');
  const spec = etsSpec(config);
  const n = y.length;
  if (n === 0) throw new EngineError('NOT_ENOUGH_DATA', 'an ETS model needs data');
  if (isConstant(y)) return constantFit(y);
  const hasTrend = spec.trend !== 'N';
  const damped = spec.trend === 'Ad';
  const seasonal = spec.season === 'A';
  const m = seasonal ? spec.period : 1;
  checkFixed('beta', config.beta, hasTrend);
  checkFixed('gamma', config.gamma, seasonal);
  checkFixed('phi', config.phi, damped);
  checkFixed('alpha', config.alpha, true);
  if (enforceShortSeries) {
    const npars = 2 + (hasTrend ? 2 : 0) + (seasonal ? m : 0) + (damped ? 1 : 0);
    if (n <= npars + 4) {
      throw new EngineError('NOT_ENOUGH_DATA', `${etsMethodName(spec)} needs more than ${npars + 4} values, got ${n}`);
    }
  }
  const bounds: EtsBounds = config.bounds ?? 'both';
  const lower = [...(config.lower ?? DEFAULT_LOWER)];
  const upper = [...(config.upper ?? DEFAULT_UPPER)];
  // Narrow the limits around fixed parameters, as forecast's etsmodel does.
  if (config.alpha !== undefined) {
    upper[1] = Math.min(config.alpha, upper[1] as number);
    upper[2] = Math.min(1 - config.alpha, upper[2] as number);
  }
  if (config.beta !== undefined) lower[0] = Math.max(config.beta, lower[0] as number);
  if (config.gamma !== undefined) upper[0] = Math.min(1 - config.gamma, upper[0] as number);

  // Starting values (forecast's initparam); its own copy of the limits.
  const startLower = [...lower];
  const startUpper = [...upper];
  if (bounds === 'admissible') {
    for (let i = 0; i < 3; i++) {
      startLower[i] = 0;
      startUpper[i] = 0.001;
    }
  } else if (lower.some((l, i) => l > (upper[i] as number))) {
    throw new EngineError('INVALID_ARGUMENT', 'inconsistent parameter limits: a lower limit exceeds its upper limit');
  }
  const lo = (i: number): number => startLower[i] as number;
  const hi = (i: number): number => startUpper[i] as number;
  let alpha = config.alpha ?? lo(0) + (0.2 * (hi(0) - lo(0))) / m;
  if (config.alpha === undefined && (alpha > 1 || alpha < 0)) alpha = lo(0) + 0.002;
  let beta: number | null = null;
  if (hasTrend) {
    if (config.beta !== undefined) beta = config.beta;
    else {
      startUpper[1] = Math.min(hi(1), alpha);
      beta = lo(1) + 0.1 * (hi(1) - lo(1));
      if (beta < 0 || beta > alpha) beta = alpha - 0.001;
    }
  }
  let gamma: number | null = null;
  if (seasonal) {
    if (config.gamma !== undefined) gamma = config.gamma;
    else {
      startUpper[2] = Math.min(hi(2), 1 - alpha);
      gamma = lo(2) + 0.05 * (hi(2) - lo(2));
      if (gamma < 0 || gamma > 1 - alpha) gamma = 1 - alpha - 0.001;
    }
  }
  let phi: number | null = null;
  if (damped) {
    if (config.phi !== undefined) phi = config.phi;
    else {
      phi = lo(3) + 0.99 * (hi(3) - lo(3));
      if (phi < 0 || phi > 1) phi = hi(3) - 0.001;
    }
  }
  const estimated: EtsEstimated = {
    alpha: config.alpha === undefined,
    beta: hasTrend && config.beta === undefined,
    gamma: seasonal && config.gamma === undefined,
    phi: damped && config.phi === undefined,
  };
  const present: EtsEstimated = { alpha: true, beta: hasTrend, gamma: seasonal, phi: damped };
  if (!etsParametersAllowed({ alpha, beta, gamma, phi }, present, lower, upper, bounds, m)) {
    throw new EngineError('INVALID_ARGUMENT', `${etsMethodName(spec)}: parameters out of range`);
  }
  const fixedCount =
    Number(config.alpha !== undefined) +
    Number(hasTrend && config.beta !== undefined) +
    Number(seasonal && config.gamma !== undefined) +
    Number(damped && config.phi !== undefined);

  const startState = etsInitialStates(y, spec.trend, spec.season, m);
  const start: number[] = [];
  if (estimated.alpha) start.push(alpha);
  if (estimated.beta) start.push(beta as number);
  if (estimated.gamma) start.push(gamma as number);
  if (estimated.phi) start.push(phi as number);
  const parameterCount = start.length;
  start.push(...startState);
  const np = start.length;
  if (np >= n - 1) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `${etsMethodName(spec)} has ${np} values to estimate from ${n} observations`,
    );
  }

  const width = etsStateWidth(spec);
  const fullState = new Float64Array(width);
  const ring = new Float64Array(Math.max(1, m));
  const read = (x: ArrayLike<number>): { a: number; b: number | null; g: number | null; p: number | null } => {
    let j = 0;
    const a = estimated.alpha ? (x[j++] as number) : alpha;
    const b = estimated.beta ? (x[j++] as number) : beta;
    const g = estimated.gamma ? (x[j++] as number) : gamma;
    const p = estimated.phi ? (x[j] as number) : phi;
    return { a, b, g, p };
  };
  const objective = (x: Float64Array): number => {
    const { a, b, g, p } = read(x);
    if (!etsParametersAllowed({ alpha: a, beta: b, gamma: g, phi: p }, estimated, lower, upper, bounds, m)) {
      return Infinity;
    }
    completeState(spec, x, parameterCount, fullState);
    const sse = etsSse(y, spec, a, b ?? 0, g ?? 0, p ?? 1, fullState, ring);
    let lik = n * Math.log(sse);
    if (Number.isNaN(lik)) return Infinity;
    if (lik < -1e10) lik = -1e10; // a perfect fit: keep the optimiser's arithmetic finite
    return lik;
  };
  const maxEvaluations = config.maxEvaluations ?? 2000;
  const strategy = config.optimizer ?? 'refined';
  const result = nelderMead(objective, start, { maxEvaluations });
  let bestX = result.x;
  let bestValue = result.value;
  let evaluations = result.evaluations;
  let improvingRestarts = 0;
  if (strategy === 'refined') {
    // Restart in coordinates where every initial state is (value − centre)/spread, so the
    // simplex step (a tenth of the largest coordinate) suits the smoothing parameters too.
    const centre = accurateMean(y);
    let spread = 0;
    for (let t = 0; t < n; t++) spread += Math.abs((y[t] as number) - centre);
    spread = spread / n || 1;
    const levelIndex = parameterCount;
    const toScaled = (x: Float64Array): Float64Array =>
      x.map((v, i) => (i < parameterCount ? v : (i === levelIndex ? v - centre : v) / spread));
    const raw = new Float64Array(np);
    const fromScaled = (u: Float64Array): Float64Array => {
      for (let i = 0; i < np; i++) {
        const v = u[i] as number;
        raw[i] = i < parameterCount ? v : i === levelIndex ? v * spread + centre : v * spread;
      }
      return raw;
    };
    const scaledObjective = (u: Float64Array): number => objective(fromScaled(u));
    // A second start: forecast's starting point, in the scaled coordinates.
    const fresh = nelderMead(scaledObjective, toScaled(Float64Array.from(start)), { maxEvaluations });
    evaluations += fresh.evaluations;
    if (fresh.value < bestValue) {
      bestX = Float64Array.from(fromScaled(fresh.x));
      bestValue = fresh.value;
      improvingRestarts++;
    }
    for (let restart = 0; restart < 2; restart++) {
      const again = nelderMead(scaledObjective, toScaled(bestX), { maxEvaluations });
      evaluations += again.evaluations;
      const improvement = bestValue - again.value;
      if (!(improvement > 0)) break;
      bestX = Float64Array.from(fromScaled(again.x));
      bestValue = again.value;
      improvingRestarts++;
      if (improvement <= 1e-8 * Math.abs(bestValue)) break;
    }
  }
  const best = read(bestX);
  const initialState = new Float64Array(width);
  completeState(spec, bestX, parameterCount, initialState);
  return summarise({
    y,
    spec,
    parameters: { alpha: best.a, beta: best.b, gamma: best.g, phi: best.p },
    initialState,
    estimatedCount: np,
    fixedCount,
    optimizer: { evaluations, status: result.status, strategy, improvingRestarts },
  });
}

/**
 * Fits one additive ETS model by maximum likelihood (see the module comment for the
 * method). Parameters given in `config` are held fixed; the initial state is always
 * estimated.
 *
 * Complexity: O(n) per likelihood evaluation, at most `maxEvaluations` (2000) evaluations.
 *
 * @param y the series (finite values, oldest first).
 * @param config the model ({ trend: 'N' | 'A' | 'Ad', season: 'N' | 'A', period }) and options.
 * @returns the fitted model with its log-likelihood, AIC, AICc, BIC, σ², parameters and states.
 *   A constant series gives the exact ETS(A,N,N) fit forecast::ets gives (`constant: true`).
 * @throws EngineError INVALID_ARGUMENT for a bad configuration or fixed parameters outside the
 *   parameter space; NOT_ENOUGH_DATA when n ≤ (number of parameters + 4), forecast's limit.
 * @example
 * const fit = fitEts(series, { trend: 'Ad', season: 'N' });
 * fit.method; // 'ETS(A,Ad,N)'
 */
export function fitEts(y: Series, config: EtsConfig): FittedEts {
  return estimateEts(y, config, true);
}

/**
 * A fitted model from given parameters and initial state, with nothing estimated — to
 * reproduce a model fitted elsewhere (e.g. by R) or to refit a model to new data. The
 * information criteria count every parameter and free initial state as estimated, so they
 * equal those of the original fit.
 *
 * Complexity: O(n·w).
 *
 * @param initialState the full initial state (forecast layout, all m seasonal states).
 * @throws EngineError INVALID_ARGUMENT for a bad configuration, missing parameters or a wrong
 *   state length; NOT_ENOUGH_DATA when there are no more observations than parameters.
 * @example etsFromParameters(y, { trend: 'N', season: 'N' }, { alpha: 0.25, beta: null, gamma: null, phi: null }, [1000])
 */
export function etsFromParameters(
  y: Series,
  config: Pick<EtsConfig, 'trend' | 'season' | 'period'>,
  parameters: EtsParameters,
  initialState: ArrayLike<number>,
): FittedEts {
  checkFinite(y, 'y');
  const spec = etsSpec(config);
  const hasTrend = spec.trend !== 'N';
  const seasonal = spec.season === 'A';
  const damped = spec.trend === 'Ad';
  const need = (name: string, v: number | null, wanted: boolean): void => {
    if (wanted && (v === null || !Number.isFinite(v))) throw new EngineError('INVALID_ARGUMENT', `${name} is required`);
    if (!wanted && v !== null)
      throw new EngineError('INVALID_ARGUMENT', `${name} must be null for ${etsMethodName(spec)}`);
  };
  need('alpha', parameters.alpha, true);
  need('beta', parameters.beta, hasTrend);
  need('gamma', parameters.gamma, seasonal);
  need('phi', parameters.phi, damped);
  if (initialState.length !== etsStateWidth(spec)) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `initial state needs ${etsStateWidth(spec)} values, got ${initialState.length}`,
    );
  }
  checkFinite(initialState, 'initialState');
  const smoothing = 1 + Number(hasTrend) + Number(seasonal) + Number(damped);
  const estimatedCount = smoothing + freeStateCount(spec);
  if (y.length <= estimatedCount) {
    throw new EngineError('NOT_ENOUGH_DATA', `${etsMethodName(spec)} needs more than ${estimatedCount} values`);
  }
  return summarise({
    y,
    spec,
    parameters,
    initialState: Float64Array.from(initialState),
    estimatedCount,
    fixedCount: 0,
    optimizer: null,
  });
}
