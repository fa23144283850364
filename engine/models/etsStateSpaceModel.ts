/**
 * Hands a fitted ETS model to the Monte Carlo simulation (engine/simulate/types.ts).
 */
import type { StateSpaceModel } from '../simulate/types';
import type { FittedEts } from './etsModel';

/**
 * The simulation's plain-data form of a fitted model: its last state (seasonal states
 * reordered oldest first, as `StateSpaceModel.season` expects), smoothing parameters with
 * absent components as β = 0, γ = 0, φ = 1, and σ = √σ².
 *
 * @example etsToStateSpaceModel(autoEts(y, { period: 7 })).season.length // 7 for a seasonal fit
 */
export function etsToStateSpaceModel(fitted: FittedEts): StateSpaceModel {
  const { spec, lastState, parameters } = fitted;
  const hasTrend = spec.trend !== 'N';
  const base = hasTrend ? 2 : 1;
  const season: number[] = [];
  if (spec.season === 'A') {
    // Forecast layout keeps the most recent first; the simulation wants it last.
    for (let j = spec.period - 1; j >= 0; j--) season.push(lastState[base + j] as number);
  }
  return {
    alpha: parameters.alpha,
    beta: hasTrend ? (parameters.beta ?? 0) : 0,
    gamma: spec.season === 'A' ? (parameters.gamma ?? 0) : 0,
    phi: spec.trend === 'Ad' ? (parameters.phi ?? 1) : 1,
    level: lastState[0] as number,
    trend: hasTrend ? (lastState[1] as number) : 0,
    season,
    sigma: Math.sqrt(fitted.sigma2),
  };
}
