/**
 * The innovations recursions of the additive ETS models (Hyndman, Koehler, Ord and Snyder
 * 2008, chapter 2; FPP3 section 8.7) with fixed parameters and initial state: one-step
 * errors, states and the sum of squared errors. The arithmetic follows forecast's C
 * routine step for step (ŷ = ℓ + φb + s_{t−m}; ℓ_t = q + α(y − s − q) with q = ℓ + φb;
 * b_t = φb + (β/α)(ℓ_t − ℓ_{t−1} − φb); s_t = s_{t−m} + γ(y − q − s_{t−m})), so that the
 * same parameters give the same numbers to the last few bits.
 */
import { EngineError } from '../core/errors';
import type { Series } from './forecastTypes';
import { etsStateWidth, type EtsParameters, type EtsSpec } from './etsModel';

/** Output of {@link etsFilter}. */
export interface EtsFilterResult {
  readonly residuals: Float64Array;
  readonly fitted: Float64Array;
  /** States x_0 … x_n row-major (forecast layout), `width` per row. */
  readonly states: Float64Array;
  readonly width: number;
  readonly sse: number;
}

function checkState(spec: EtsSpec, initialState: ArrayLike<number>): void {
  const width = etsStateWidth(spec);
  if (initialState.length !== width) {
    throw new EngineError('INVALID_ARGUMENT', `initial state needs ${width} values, got ${initialState.length}`);
  }
}

/**
 * Sum of squared one-step errors for given parameters: the inner loop of estimation. The
 * seasonal states live in a ring buffer, so each step costs O(1) whatever m.
 *
 * Each combination of trend and season has its own loop (below) with no per-step tests of
 * the model: the loop is the critical path of every fit, and the shared loop with those
 * tests ran about twice as slowly for the seasonal models. The arithmetic of each step is
 * the shared loop's, operation for operation, so the SSE is the same to the last bit.
 *
 * Complexity: O(n).
 *
 * @param ring scratch space of at least `spec.period` values (overwritten).
 * @returns SSE, or NaN when the recursion overflows (the caller treats that as infeasible).
 * @example etsSse([1, 2, 3], spec, 0.5, 0, 0, 1, Float64Array.of(1), new Float64Array(1))
 */
export function etsSse(
  y: Series,
  spec: EtsSpec,
  alpha: number,
  beta: number,
  gamma: number,
  phi: number,
  initialState: ArrayLike<number>,
  ring: Float64Array,
): number {
  const hasTrend = spec.trend !== 'N';
  const level = initialState[0] as number;
  if (spec.season !== 'A') {
    if (hasTrend && phi === 1) return sseUndampedTrend(y, alpha, beta / alpha, level, initialState[1] as number);
    return hasTrend
      ? sseTrend(y, alpha, beta / alpha, phi, level, initialState[1] as number)
      : sseLevel(y, alpha, level);
  }
  const m = spec.period;
  // Ring order: ring[oldest] = s_{t−m}, then newer ones after it (wrapping); oldest starts at 0.
  const base = hasTrend ? 2 : 1;
  for (let j = 0; j < m; j++) ring[j] = initialState[base + m - 1 - j] as number;
  if (hasTrend && phi === 1) {
    return sseUndampedTrendSeason(y, alpha, beta / alpha, gamma, level, initialState[1] as number, ring, m);
  }
  return hasTrend
    ? sseTrendSeason(y, alpha, beta / alpha, gamma, phi, level, initialState[1] as number, ring, m)
    : sseSeason(y, alpha, gamma, level, ring, m);
}

/** ETS(A,N,N): ŷ = ℓ; ℓ ← ℓ + α(y − ℓ). */
function sseLevel(y: Series, alpha: number, level: number): number {
  const n = y.length;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const e = yt - level;
    sse += e * e;
    level = level + alpha * (yt - level);
  }
  return sse;
}

/** ETS(A,A,N) and (A,Ad,N): q = ℓ + φb; ŷ = q; ℓ' = q + α(y − q); b ← φb + (β/α)(ℓ' − ℓ − φb). */
function sseTrend(y: Series, alpha: number, ratio: number, phi: number, level: number, slope: number): number {
  const n = y.length;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const phib = phi * slope;
    const q = level + phib;
    const e = yt - q;
    sse += e * e;
    const newLevel = q + alpha * (yt - q);
    slope = phib + ratio * (newLevel - level - phib);
    level = newLevel;
  }
  return sse;
}

/**
 * sseTrend with φ = 1: φ·b is then b exactly (multiplying by 1 is exact in IEEE arithmetic),
 * and leaving the product out shortens the recursion's chain of dependent operations.
 */
function sseUndampedTrend(y: Series, alpha: number, ratio: number, level: number, slope: number): number {
  const n = y.length;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const q = level + slope;
    const e = yt - q;
    sse += e * e;
    const newLevel = q + alpha * (yt - q);
    slope = slope + ratio * (newLevel - level - slope);
    level = newLevel;
  }
  return sse;
}

/** ETS(A,N,A): ŷ = ℓ + s; ℓ ← ℓ + α(y − s − ℓ); s ← s + γ(y − ℓ − s). */
function sseSeason(y: Series, alpha: number, gamma: number, level: number, ring: Float64Array, m: number): number {
  const n = y.length;
  let oldest = 0;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const s = ring[oldest] as number;
    const e = yt - (level + s);
    sse += e * e;
    ring[oldest] = s + gamma * (yt - level - s);
    level = level + alpha * (yt - s - level);
    oldest = oldest + 1 === m ? 0 : oldest + 1;
  }
  return sse;
}

/** ETS(A,A,A) and (A,Ad,A): the trend and the season updates together. */
function sseTrendSeason(
  y: Series,
  alpha: number,
  ratio: number,
  gamma: number,
  phi: number,
  level: number,
  slope: number,
  ring: Float64Array,
  m: number,
): number {
  const n = y.length;
  let oldest = 0;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const s = ring[oldest] as number;
    const phib = phi * slope;
    const q = level + phib;
    const e = yt - (q + s);
    sse += e * e;
    const newLevel = q + alpha * (yt - s - q);
    slope = phib + ratio * (newLevel - level - phib);
    ring[oldest] = s + gamma * (yt - q - s);
    oldest = oldest + 1 === m ? 0 : oldest + 1;
    level = newLevel;
  }
  return sse;
}

/** sseTrendSeason with φ = 1 (see sseUndampedTrend). */
function sseUndampedTrendSeason(
  y: Series,
  alpha: number,
  ratio: number,
  gamma: number,
  level: number,
  slope: number,
  ring: Float64Array,
  m: number,
): number {
  const n = y.length;
  let oldest = 0;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const yt = y[t] as number;
    const s = ring[oldest] as number;
    const q = level + slope;
    const e = yt - (q + s);
    sse += e * e;
    const newLevel = q + alpha * (yt - s - q);
    slope = slope + ratio * (newLevel - level - slope);
    ring[oldest] = s + gamma * (yt - q - s);
    oldest = oldest + 1 === m ? 0 : oldest + 1;
    level = newLevel;
  }
  return sse;
}

/**
 * Runs the ETS recursions over `y` from `initialState` with fixed parameters and returns
 * every state, the one-step fitted values and errors, and the SSE.
 *
 * Complexity: O(n·w) for state width w (the states are stored).
 *
 * @throws EngineError INVALID_ARGUMENT when the initial state has the wrong length.
 * @example etsFilter([3, 4], { error: 'A', trend: 'N', season: 'N', period: 1 }, { alpha: 0.5, beta: null, gamma: null, phi: null }, [2]).residuals // [1, 1.5]
 */
export function etsFilter(
  y: Series,
  spec: EtsSpec,
  parameters: EtsParameters,
  initialState: ArrayLike<number>,
): EtsFilterResult {
  checkState(spec, initialState);
  const n = y.length;
  const width = etsStateWidth(spec);
  const hasTrend = spec.trend !== 'N';
  const seasonal = spec.season === 'A';
  const m = spec.period;
  const alpha = parameters.alpha;
  const beta = hasTrend ? (parameters.beta ?? 0) : 0;
  const gamma = seasonal ? (parameters.gamma ?? 0) : 0;
  const phi = spec.trend === 'Ad' ? (parameters.phi ?? 1) : 1;
  const states = new Float64Array((n + 1) * width);
  for (let j = 0; j < width; j++) states[j] = initialState[j] as number;
  const residuals = new Float64Array(n);
  const fitted = new Float64Array(n);
  const base = hasTrend ? 2 : 1;
  let sse = 0;
  for (let t = 0; t < n; t++) {
    const prev = t * width;
    const next = prev + width;
    const level = states[prev] as number;
    const slope = hasTrend ? (states[prev + 1] as number) : 0;
    const s = seasonal ? (states[prev + base + m - 1] as number) : 0;
    const yt = y[t] as number;
    const phib = hasTrend ? phi * slope : 0;
    const q = hasTrend ? level + phib : level;
    const forecast = seasonal ? q + s : q;
    fitted[t] = forecast;
    const e = yt - forecast;
    residuals[t] = e;
    sse += e * e;
    const p = seasonal ? yt - s : yt;
    const newLevel = q + alpha * (p - q);
    states[next] = newLevel;
    if (hasTrend) states[next + 1] = phib + (beta / alpha) * (newLevel - level - phib);
    if (seasonal) {
      states[next + base] = s + gamma * (yt - q - s);
      for (let j = 1; j < m; j++) states[next + base + j] = states[prev + base + j - 1] as number;
    }
  }
  return { residuals, fitted, states, width, sse };
}

/**
 * Point forecasts ŷ_{n+h|n} = ℓ_n + φ_h b_n + s_{n−m+1+((h−1) mod m)}, φ_h = φ + … + φ^h
 * (FPP3 table 8.7), from the state `state` (forecast layout).
 *
 * Complexity: O(horizon).
 *
 * @example etsPointForecast({ error: 'A', trend: 'A', season: 'N', period: 1 }, 1, [10, 2], 3) // [12, 14, 16]
 */
export function etsPointForecast(spec: EtsSpec, phi: number, state: ArrayLike<number>, horizon: number): Float64Array {
  checkState(spec, state);
  const hasTrend = spec.trend !== 'N';
  const seasonal = spec.season === 'A';
  const m = spec.period;
  const base = hasTrend ? 2 : 1;
  const level = state[0] as number;
  const slope = hasTrend ? (state[1] as number) : 0;
  const damping = spec.trend === 'Ad' ? phi : 1;
  const out = new Float64Array(horizon);
  // Same accumulation of φ_h as forecast's C code (adds φ^h each step; h when φ = 1).
  let phiStar = damping;
  for (let i = 0; i < horizon; i++) {
    let f = hasTrend ? level + phiStar * slope : level;
    if (seasonal) f += state[base + m - 1 - (i % m)] as number;
    out[i] = f;
    phiStar = Math.abs(damping - 1) < 1e-10 ? phiStar + 1 : phiStar + Math.pow(damping, i + 2);
  }
  return out;
}
