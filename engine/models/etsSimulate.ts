/**
 * Sample paths of the future from a fitted additive ETS model.
 */
import { EngineError } from '../core/errors';
import { checkHorizon } from './forecastTypes';
import type { FittedEts } from './etsModel';

/**
 * Simulates `nPaths` futures of `horizon` steps from the model's last state by running the
 * state space equations forward with errors ε = σ·z, z drawn from `normal` (Hyndman et al.
 * 2008, section 6.1; forecast's `simulate.ets(future = TRUE)`). The random source is
 * injected so that results are reproducible (engine/core/random.ts gives a seeded one).
 *
 * Path p, step h (0-based) is written to out[p·horizon + h]. Paths are drawn one after the
 * other, steps in order, so the same generator state gives the same paths.
 *
 * Complexity: O(nPaths · horizon) time, O(m) extra space.
 *
 * @param normal returns independent standard normal deviates.
 * @param out receives nPaths·horizon values.
 * @throws EngineError INVALID_ARGUMENT for a bad horizon, path count or `out` length.
 * @example
 * const out = new Float64Array(1000 * 14);
 * simulateEts(fit, 14, 1000, createRng(7).normal, out);
 */
export function simulateEts(
  fitted: FittedEts,
  horizon: number,
  nPaths: number,
  normal: () => number,
  out: Float64Array,
): void {
  checkHorizon(horizon);
  if (!Number.isInteger(nPaths) || nPaths < 1) {
    throw new EngineError('INVALID_ARGUMENT', `path count must be a positive integer, got ${nPaths}`);
  }
  if (out.length !== nPaths * horizon) {
    throw new EngineError('INVALID_ARGUMENT', `out needs ${nPaths * horizon} values, got ${out.length}`);
  }
  const { spec, lastState } = fitted;
  const hasTrend = spec.trend !== 'N';
  const seasonal = spec.season === 'A';
  const m = spec.period;
  const alpha = fitted.parameters.alpha;
  const beta = fitted.parameters.beta ?? 0;
  const gamma = fitted.parameters.gamma ?? 0;
  const phi = spec.trend === 'Ad' ? (fitted.parameters.phi ?? 1) : 1;
  const sigma = Math.sqrt(fitted.sigma2);
  const base = hasTrend ? 2 : 1;
  const ring = new Float64Array(Math.max(1, m));
  for (let p = 0; p < nPaths; p++) {
    let level = lastState[0] as number;
    let slope = hasTrend ? (lastState[1] as number) : 0;
    let oldest = 0;
    if (seasonal) for (let j = 0; j < m; j++) ring[j] = lastState[base + m - 1 - j] as number;
    const row = p * horizon;
    for (let h = 0; h < horizon; h++) {
      const e = sigma * normal();
      const phib = phi * slope;
      const q = level + phib;
      const s = seasonal ? (ring[oldest] as number) : 0;
      out[row + h] = q + s + e;
      level = q + alpha * e;
      if (hasTrend) slope = phib + beta * e;
      if (seasonal) {
        ring[oldest] = s + gamma * e;
        oldest = oldest + 1 === m ? 0 : oldest + 1;
      }
    }
  }
}
