/**
 * Derivative-free minimisation by the Nelder–Mead simplex method in the variant of Nash
 * (1990), Compact Numerical Methods for Computers, 2nd ed., Algorithm 19 — the variant R's
 * `optim(method = "Nelder-Mead")` uses and forecast::ets calls for its likelihood (with
 * reflection 1, contraction 0.5, expansion 2, relative tolerance √ε and 2000 evaluations).
 * Reproducing its steps (initial simplex, order of evaluation, stopping rules) lets Ebbline
 * reach the same optimum as forecast::ets from the same starting point.
 */
import { EngineError } from '../core/errors';

/** Settings of {@link nelderMead}; the defaults are forecast::ets's. */
export interface NelderMeadOptions {
  /** Stop when the best value is ≤ this. Default −Infinity (never). */
  readonly absoluteTolerance?: number;
  /**
   * Stop when (worst − best) ≤ relativeTolerance·(|f(start)| + relativeTolerance).
   * Default √ε = 1.490116119384765625e−8.
   */
  readonly relativeTolerance?: number;
  /** Reflection coefficient. Default 1. */
  readonly reflection?: number;
  /** Contraction (and shrink) coefficient. Default 0.5. */
  readonly contraction?: number;
  /** Expansion coefficient. Default 2. */
  readonly expansion?: number;
  /** Stop after more than this many function evaluations. Default 2000. */
  readonly maxEvaluations?: number;
}

/** Outcome of {@link nelderMead}. */
export interface NelderMeadResult {
  /** Best point found. */
  readonly x: Float64Array;
  /** f(x). */
  readonly value: number;
  /** Function evaluations used. */
  readonly evaluations: number;
  /**
   * 0: converged by the tolerance; 1: evaluation limit reached; 10: a shrink step did not
   * reduce the simplex (degenerate simplex) — the same codes as R's `optim`.
   */
  readonly status: 0 | 1 | 10;
}

/** Value that replaces a non-finite function value (R's `big`), so such points lose. */
const BIG = 1.0e35;

/**
 * Minimises `objective` from `start`. The objective may return Infinity or NaN for
 * infeasible points (they are treated as 1e35); the vector it receives is scratch space
 * owned by the optimiser, valid only during the call.
 *
 * The initial simplex adds to each coordinate in turn a step of 0.1·max|start_i| (0.1 when
 * start is all zero), as Nash's code does; the polytope then reflects, expands, contracts
 * and shrinks until the spread of function values over the simplex is within the relative
 * tolerance of the starting value.
 *
 * Complexity: O(n) work per evaluation besides the objective; at most `maxEvaluations`
 * evaluations (plus up to n + 1 for a final shrink).
 *
 * @throws EngineError INVALID_ARGUMENT when `start` is empty or the objective is not finite at `start`.
 * @example
 * nelderMead((x) => (x[0]! - 1) ** 2 + (x[1]! + 2) ** 2, [0, 0]).x // ≈ [1, −2]
 */
export function nelderMead(
  objective: (x: Float64Array) => number,
  start: ArrayLike<number>,
  options: NelderMeadOptions = {},
): NelderMeadResult {
  const n = start.length;
  if (n === 0) throw new EngineError('INVALID_ARGUMENT', 'Nelder–Mead needs at least one parameter');
  const absTol = options.absoluteTolerance ?? -Infinity;
  const relTol = options.relativeTolerance ?? 1.490116119384765625e-8;
  const alpha = options.reflection ?? 1;
  const beta = options.contraction ?? 0.5;
  const gamma = options.expansion ?? 2;
  const maxEvaluations = options.maxEvaluations ?? 2000;

  const scratch = new Float64Array(n);
  const evaluate = (point: Float64Array): number => {
    scratch.set(point);
    const f = objective(scratch);
    return Number.isFinite(f) ? f : BIG;
  };

  // Simplex vertices 0..n and their values; `centroid` and `trial` are work vectors.
  const vertices: Float64Array[] = [];
  const values = new Float64Array(n + 1);
  const origin = Float64Array.from(start);
  scratch.set(origin);
  const f0 = objective(scratch);
  if (!Number.isFinite(f0)) {
    throw new EngineError('INVALID_ARGUMENT', 'Nelder–Mead: the objective is not finite at the starting point');
  }
  let evaluations = 1;
  const convergenceTolerance = relTol * (Math.abs(f0) + relTol);
  vertices.push(Float64Array.from(origin));
  values[0] = f0;

  let step = 0;
  for (let i = 0; i < n; i++) step = Math.max(step, 0.1 * Math.abs(origin[i] as number));
  if (step === 0) step = 0.1;
  let size = 0;
  for (let j = 1; j <= n; j++) {
    const vertex = Float64Array.from(origin);
    let tryStep = step;
    // A step too small to change the coordinate is enlarged tenfold until it does.
    while (vertex[j - 1] === origin[j - 1]) {
      vertex[j - 1] = (origin[j - 1] as number) + tryStep;
      tryStep *= 10;
    }
    size += tryStep;
    vertices.push(vertex);
  }
  let oldSize = size;
  let recomputeVertices = true;
  let best = 0;
  let status: 0 | 1 | 10 = 0;
  const centroid = new Float64Array(n);
  const trial = new Float64Array(n);
  const reflected = new Float64Array(n);

  for (;;) {
    if (recomputeVertices) {
      for (let j = 0; j <= n; j++) {
        if (j !== best) {
          values[j] = evaluate(vertices[j] as Float64Array);
          evaluations++;
        }
      }
      recomputeVertices = false;
    }
    // Best (lowest) and worst (highest) vertex; ties keep the earlier index, as Nash's code.
    let low = values[best] as number;
    let high = low;
    let worst = best;
    for (let j = 0; j <= n; j++) {
      if (j === best) continue;
      const f = values[j] as number;
      if (f < low) {
        best = j;
        low = f;
      }
      if (f > high) {
        worst = j;
        high = f;
      }
    }
    if (high <= low + convergenceTolerance || low <= absTol) break;

    const worstVertex = vertices[worst] as Float64Array;
    for (let i = 0; i < n; i++) {
      let sum = -(worstVertex[i] as number);
      for (let j = 0; j <= n; j++) sum += (vertices[j] as Float64Array)[i] as number;
      centroid[i] = sum / n;
    }
    for (let i = 0; i < n; i++) {
      reflected[i] = (1 + alpha) * (centroid[i] as number) - alpha * (worstVertex[i] as number);
    }
    const fReflected = evaluate(reflected);
    evaluations++;
    if (fReflected < low) {
      for (let i = 0; i < n; i++) trial[i] = gamma * (reflected[i] as number) + (1 - gamma) * (centroid[i] as number);
      const fExpanded = evaluate(trial);
      evaluations++;
      if (fExpanded < fReflected) {
        worstVertex.set(trial);
        values[worst] = fExpanded;
      } else {
        worstVertex.set(reflected);
        values[worst] = fReflected;
      }
    } else {
      if (fReflected < high) {
        worstVertex.set(reflected);
        values[worst] = fReflected;
      }
      for (let i = 0; i < n; i++) trial[i] = (1 - beta) * (worstVertex[i] as number) + beta * (centroid[i] as number);
      const fContracted = evaluate(trial);
      evaluations++;
      if (fContracted < (values[worst] as number)) {
        worstVertex.set(trial);
        values[worst] = fContracted;
      } else if (fReflected >= high) {
        // Shrink every vertex towards the best one.
        recomputeVertices = true;
        size = 0;
        const bestVertex = vertices[best] as Float64Array;
        for (let j = 0; j <= n; j++) {
          if (j === best) continue;
          const vertex = vertices[j] as Float64Array;
          for (let i = 0; i < n; i++) {
            vertex[i] = beta * ((vertex[i] as number) - (bestVertex[i] as number)) + (bestVertex[i] as number);
            size += Math.abs((vertex[i] as number) - (bestVertex[i] as number));
          }
        }
        if (size < oldSize) {
          oldSize = size;
        } else {
          status = 10;
          break;
        }
      }
    }
    if (evaluations > maxEvaluations) break;
  }
  if (evaluations > maxEvaluations) status = 1;
  return { x: Float64Array.from(vertices[best] as Float64Array), value: values[best] as number, evaluations, status };
}
