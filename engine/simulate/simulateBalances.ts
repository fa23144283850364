/**
 * Monte Carlo balance paths. Every component fills its daily amounts for all paths from its
 * own random substream, selected by the component's stable key, so changing one component
 * (a scenario pauses a flow, adds an item) leaves the draws of every other component as
 * they were: scenario differences are then differences of the changes, not of noise
 * (common random numbers, e.g. Glasserman 2004, Monte Carlo Methods in Financial
 * Engineering, section 4.2).
 *
 * Memory: two paths × horizon Float64Arrays (10,000 × 365 ≈ 29 MB each).
 */
import { EngineError } from '../core/errors';
import { createRng, type Rng } from '../core/random';
import type {
  AmountDistribution,
  FlowComponent,
  IntermittentComponent,
  PlannedComponent,
  RecurringComponent,
  ResidualComponent,
  SimulationInput,
  TimingSpread,
} from './types';

/** Bounds on the simulation size, documented for the CLI and the app. */
export const MIN_PATHS = 100;
export const MAX_PATHS = 100_000;
export const MAX_HORIZON = 730;

/** Raw simulation output: balances day-major (`balances[d * paths + p]`), crossings and totals. */
export interface SimulatedPaths {
  readonly paths: number;
  readonly horizon: number;
  /** End-of-day balance, day-major so each day's sample is one contiguous run. */
  readonly balances: Float64Array;
  /** First day offset below the threshold per path, −1 when never. */
  readonly firstCrossing: Int32Array;
  /** Horizon total of each component per path: `totals[p * components + c]`. */
  readonly totals: Float64Array;
}

/** FNV-1a hash of a string, 32 bits. */
function hashKey(key: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < key.length; i++) {
    h ^= key.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** Seed of a component's substream: the run seed mixed with the component key. */
export function substreamSeed(seed: number, key: string): number {
  return (Math.imul((seed >>> 0) ^ 0x9e3779b9, 0x85ebca6b) ^ hashKey(key)) >>> 0;
}

function validate(input: SimulationInput): void {
  const { paths, horizon, startBalance, threshold } = input;
  if (!Number.isInteger(paths) || paths < MIN_PATHS || paths > MAX_PATHS) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `paths must be a whole number from ${MIN_PATHS} to ${MAX_PATHS}, got ${paths}`,
    );
  }
  if (!Number.isInteger(horizon) || horizon < 1 || horizon > MAX_HORIZON) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `horizon must be a whole number of days from 1 to ${MAX_HORIZON}, got ${horizon}`,
    );
  }
  if (!Number.isFinite(startBalance) || !Number.isFinite(threshold)) {
    throw new EngineError('INVALID_ARGUMENT', 'start balance and threshold must be finite amounts');
  }
  const keys = new Set<string>();
  for (const c of input.components) {
    if (keys.has(c.key)) throw new EngineError('INVALID_ARGUMENT', `two flow components share the key "${c.key}"`);
    keys.add(c.key);
  }
}

/** 2^-32: turns a raw 32-bit draw into a uniform on [0, 1). */
const INV_2_32 = 2.3283064365386963e-10;

/**
 * A uniform on [0, 1) from one raw 32-bit draw. The hot loops use it for accept/reject
 * decisions and indices, where 32 bits of resolution are ample and half the draws of the
 * 53-bit `nextFloat` are saved.
 */
function uniform32(rng: Rng): number {
  return rng.nextUint32() * INV_2_32;
}

/**
 * An index in 0..n−1 by multiplying a raw draw (Lemire 2019, "Fast random integer
 * generation in an interval", without the rejection step): the bias is below n / 2^32,
 * far under Monte Carlo error for the sizes resampled here.
 */
function index32(rng: Rng, n: number): number {
  return Math.floor(rng.nextUint32() * INV_2_32 * n);
}

function drawAmount(a: AmountDistribution, rng: Rng): number {
  switch (a.kind) {
    case 'fixed':
      return a.value;
    case 'normal':
      return a.mean + a.sd * rng.normal();
    case 'empirical': {
      const n = a.values.length;
      if (n === 0) return 0;
      return a.values[index32(rng, n)] as number;
    }
  }
}

/** Cumulative weights of a timing spread, normalised to end at 1. */
function cumulative(spread: TimingSpread): Float64Array {
  const c = new Float64Array(spread.weights.length);
  let total = 0;
  for (let i = 0; i < c.length; i++) total += Math.max(0, spread.weights[i] as number);
  let run = 0;
  for (let i = 0; i < c.length; i++) {
    run += Math.max(0, spread.weights[i] as number) / (total || 1);
    c[i] = run;
  }
  return c;
}

function drawOffset(spread: TimingSpread, cum: Float64Array, rng: Rng): number {
  if (cum.length === 0) return 0;
  if (cum.length === 1) return spread.offsets[0] as number;
  const u = uniform32(rng);
  for (let i = 0; i < cum.length; i++) if (u < (cum[i] as number)) return spread.offsets[i] as number;
  return spread.offsets[cum.length - 1] as number;
}

/**
 * Adds one path's flows of a component to `flows[row..row + h)` and returns their total.
 * Built once per component; called path after path, so each component still consumes its
 * own substream in path order, exactly as when it filled all paths at once.
 */
type PathFill = (flows: Float64Array, row: number) => number;

function recurringFill(c: RecurringComponent, rng: Rng, h: number): PathFill {
  const cum = cumulative(c.timing);
  const days = Float64Array.from(c.days);
  const nd = days.length;
  const probability = c.probability;
  const fixed = c.amount.kind === 'fixed' ? c.amount.value : null;
  return (flows, row) => {
    let total = 0;
    for (let k = 0; k < nd; k++) {
      if (probability < 1 && uniform32(rng) >= probability) continue;
      const day = (days[k] as number) + drawOffset(c.timing, cum, rng);
      const amount = fixed ?? drawAmount(c.amount, rng);
      if (day >= 0 && day < h) {
        flows[row + day] = (flows[row + day] as number) + amount;
        total += amount;
      }
    }
    return total;
  };
}

function plannedFill(c: PlannedComponent, rng: Rng, h: number): PathFill {
  const spread = Math.max(0, Math.floor(c.delayMax) - Math.floor(c.delayMin)) + 1;
  return (flows, row) => {
    const happens = uniform32(rng) < c.probability;
    let total = 0;
    for (const nominal of c.days) {
      const delay = Math.floor(c.delayMin) + (spread > 1 ? index32(rng, spread) : 0);
      const amount = drawAmount(c.amount, rng);
      const day = nominal + delay;
      if (happens && day >= 0 && day < h) {
        flows[row + day] = (flows[row + day] as number) + amount;
        total += amount;
      }
    }
    return total;
  };
}

function residualFill(c: ResidualComponent, rng: Rng, h: number): PathFill {
  const { alpha, beta, gamma, phi, sigma } = c.model;
  const m = c.model.season.length;
  const season = new Float64Array(Math.max(1, m));
  const residuals = c.errors.kind === 'bootstrap' ? Float64Array.from(c.errors.residuals) : new Float64Array(0);
  const nr = residuals.length;
  const restart = c.errors.kind === 'bootstrap' ? 1 / Math.max(1, c.errors.meanBlock) : 1;
  const bootstrap = c.errors.kind === 'bootstrap' && nr > 0;
  const offset = Float64Array.from(c.offset);
  const offsetLength = offset.length;
  const sign = c.sign;
  return (flows, row) => {
    let level = c.model.level;
    let trend = c.model.trend;
    for (let j = 0; j < m; j++) season[j] = c.model.season[j] as number;
    let pos = 0; // ring position of the oldest seasonal state = s_{t+1−m}
    let index = bootstrap ? index32(rng, nr) : 0;
    let total = 0;
    for (let d = 0; d < h; d++) {
      const s = m > 0 ? (season[pos] as number) : 0;
      const mean = level + phi * trend + s;
      let e: number;
      if (bootstrap) {
        index = uniform32(rng) < restart ? index32(rng, nr) : index + 1 === nr ? 0 : index + 1;
        e = residuals[index] as number;
      } else {
        e = sigma * rng.normal();
      }
      // Not clamped at zero: clamping a symmetric error at zero on quiet days biases the
      // cumulative balance upwards, and the balance depends on the sums, which stay unbiased.
      const value = mean + e + (d < offsetLength ? (offset[d] as number) : 0);
      flows[row + d] = (flows[row + d] as number) + sign * value;
      total += sign * value;
      const newLevel = level + phi * trend + alpha * e;
      trend = phi * trend + beta * e;
      level = newLevel;
      if (m > 0) {
        season[pos] = s + gamma * e;
        pos = pos + 1 === m ? 0 : pos + 1;
      }
    }
    return total;
  };
}

function intermittentFill(c: IntermittentComponent, rng: Rng, h: number): PathFill {
  const probability = Float64Array.from(c.probability);
  const sizes = Float64Array.from(c.sizes);
  const np = probability.length;
  const ns = sizes.length;
  const sign = c.sign;
  const phase = c.phase;
  return (flows, row) => {
    let total = 0;
    if (np > 0 && ns > 0) {
      for (let d = 0; d < h; d++) {
        const prob = probability[(phase + d) % np] as number;
        if (uniform32(rng) < prob) {
          const amount = sign * (sizes[index32(rng, ns)] as number);
          flows[row + d] = (flows[row + d] as number) + amount;
          total += amount;
        }
      }
    }
    return total;
  };
}

function pathFill(c: FlowComponent, rng: Rng, h: number): PathFill {
  switch (c.kind) {
    case 'recurring':
      return recurringFill(c, rng, h);
    case 'planned':
      return plannedFill(c, rng, h);
    case 'residual':
      return residualFill(c, rng, h);
    case 'intermittent':
      return intermittentFill(c, rng, h);
  }
}

/**
 * Paths simulated together: their daily flows (BLOCK × horizon, 8 × 365 bytes each) stay in
 * the processor cache while every component adds to them, and each day's balances of the
 * block are written to the day-major output as one contiguous run.
 */
const BLOCK = 32;

/**
 * Simulates `paths` balance paths over `horizon` days.
 *
 * @param onProgress called with the share done (0..1) after each component, for progress bars.
 * @throws EngineError INVALID_ARGUMENT for paths/horizon outside the documented bounds or
 *   duplicate component keys.
 * @example simulateBalances({ startBalance: 100000, horizon: 90, paths: 1000, seed: 7, threshold: 0, components: [] })
 * Complexity: O(paths · (horizon + Σ occurrences)).
 */
export function simulateBalances(input: SimulationInput, onProgress?: (share: number) => void): SimulatedPaths {
  validate(input);
  const { paths, horizon: h, components, startBalance, threshold } = input;
  const nc = components.length;
  const fills = components.map((c) => pathFill(c, createRng(substreamSeed(input.seed, c.key)), h));
  const totals = new Float64Array(paths * nc);
  const balances = new Float64Array(paths * h);
  const firstCrossing = new Int32Array(paths).fill(-1);
  const flows = new Float64Array(BLOCK * h);
  let reported = 0;
  for (let p0 = 0; p0 < paths; p0 += BLOCK) {
    const nb = Math.min(BLOCK, paths - p0);
    flows.fill(0);
    // Component by component as before, so each cell sums its components in the same order.
    for (let ci = 0; ci < nc; ci++) {
      const fill = fills[ci] as PathFill;
      for (let b = 0; b < nb; b++) totals[(p0 + b) * nc + ci] = fill(flows, b * h);
    }
    for (let b = 0; b < nb; b++) {
      let balance = startBalance;
      let crossed = -1;
      const row = b * h;
      for (let d = 0; d < h; d++) {
        balance += flows[row + d] as number;
        flows[row + d] = balance;
        if (crossed < 0 && balance < threshold) crossed = d;
      }
      firstCrossing[p0 + b] = crossed;
    }
    for (let d = 0; d < h; d++) {
      const at = d * paths + p0;
      for (let b = 0; b < nb; b++) balances[at + b] = flows[b * h + d] as number;
    }
    if (onProgress) {
      // About as many calls as components, as before (one per component filled).
      const step = Math.floor(((p0 + nb) / paths) * nc);
      if (step > reported) {
        reported = step;
        onProgress(step / (nc + 1));
      }
    }
  }
  onProgress?.(1);
  return { paths, horizon: h, balances, firstCrossing, totals };
}
