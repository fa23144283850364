/**
 * Expected inflow and outflow per forecast day, computed exactly from the simulation's
 * components instead of from the paths: every component is linear in its random draws, so
 * its expectation is one cheap deterministic pass (no sampling error):
 * - recurring: Σ over nominal days and timing offsets of P(occurs) · weight · E[amount];
 * - planned: P(happens) · E[amount], spread evenly over the whole-day delays min..max;
 * - residual (innovations state space, additive error): the state recursion run with each
 *   error replaced by its mean (0 for Gaussian errors, the residuals' mean for the
 *   stationary bootstrap, whose draws are marginally uniform over the residuals), plus the
 *   seasonal offset;
 * - intermittent: P(occurs on that weekday) · mean size.
 * Each component counts wholly as inflow or outflow by its direction: its sign (residual,
 * intermittent) or the sign of its expected amount (recurring, planned). Inflow + outflow
 * is then exactly the expected net flow, which the simulated mean balance estimates with
 * Monte Carlo error (test/runway/expectedDailyFlows.test.ts checks the two agree).
 */
import { EngineError } from '../core/errors';
import type {
  AmountDistribution,
  FlowComponent,
  IntermittentComponent,
  PlannedComponent,
  RecurringComponent,
  ResidualComponent,
} from '../simulate/types';

/** Expected flows per day offset (0 = the first forecast day), minor units. */
export interface ExpectedDailyFlows {
  readonly horizon: number;
  /** Expected receipts per day (≥ 0 for ordinary components). */
  readonly inflow: Float64Array;
  /** Expected payments per day as magnitudes (≥ 0 for ordinary components). */
  readonly outflow: Float64Array;
}

/**
 * Mean of an amount distribution (0 for an empty empirical sample, as the simulation draws).
 * @example amountMean({ kind: 'empirical', values: [-90000, -93000] }) // -91500
 */
export function amountMean(a: AmountDistribution): number {
  switch (a.kind) {
    case 'fixed':
      return a.value;
    case 'normal':
      return a.mean;
    case 'empirical': {
      if (a.values.length === 0) return 0;
      let s = 0;
      for (const v of a.values) s += v;
      return s / a.values.length;
    }
  }
}

function addSigned(out: ExpectedDailyFlows, day: number, value: number, inflow: boolean): void {
  if (day < 0 || day >= out.horizon || value === 0) return;
  if (inflow) out.inflow[day] = (out.inflow[day] as number) + value;
  else out.outflow[day] = (out.outflow[day] as number) - value;
}

function recurring(c: RecurringComponent, out: ExpectedDailyFlows): void {
  const mean = amountMean(c.amount);
  const n = c.timing.weights.length;
  let total = 0;
  for (let i = 0; i < n; i++) total += Math.max(0, c.timing.weights[i] as number);
  for (const nominal of c.days) {
    if (n === 0) {
      addSigned(out, nominal, c.probability * mean, mean > 0);
    } else if (total === 0) {
      // The simulation's cumulative weights are then all 0 and every draw takes the last offset.
      addSigned(out, nominal + (c.timing.offsets[n - 1] as number), c.probability * mean, mean > 0);
    } else {
      for (let i = 0; i < n; i++) {
        const w = Math.max(0, c.timing.weights[i] as number) / total;
        addSigned(out, nominal + (c.timing.offsets[i] as number), c.probability * w * mean, mean > 0);
      }
    }
  }
}

function planned(c: PlannedComponent, out: ExpectedDailyFlows): void {
  const mean = amountMean(c.amount);
  const min = Math.floor(c.delayMin);
  const spread = Math.max(0, Math.floor(c.delayMax) - min) + 1;
  for (const nominal of c.days) {
    for (let k = 0; k < spread; k++) addSigned(out, nominal + min + k, (c.probability * mean) / spread, mean > 0);
  }
}

function residual(c: ResidualComponent, out: ExpectedDailyFlows): void {
  const { alpha, beta, gamma, phi } = c.model;
  const m = c.model.season.length;
  const season = Float64Array.from(c.model.season);
  let e = 0;
  if (c.errors.kind === 'bootstrap' && c.errors.residuals.length > 0) {
    for (const r of c.errors.residuals) e += r;
    e /= c.errors.residuals.length;
  }
  let level = c.model.level;
  let trend = c.model.trend;
  let pos = 0;
  for (let d = 0; d < out.horizon; d++) {
    const s = m > 0 ? (season[pos] as number) : 0;
    const value = level + phi * trend + s + e + ((c.offset[d] as number) || 0);
    addSigned(out, d, c.sign * value, c.sign > 0);
    const newLevel = level + phi * trend + alpha * e;
    trend = phi * trend + beta * e;
    level = newLevel;
    if (m > 0) {
      season[pos] = s + gamma * e;
      pos = pos + 1 === m ? 0 : pos + 1;
    }
  }
}

function intermittent(c: IntermittentComponent, out: ExpectedDailyFlows): void {
  const np = c.probability.length;
  const ns = c.sizes.length;
  if (np === 0 || ns === 0) return;
  let size = 0;
  for (const s of c.sizes) size += s;
  size /= ns;
  for (let d = 0; d < out.horizon; d++) {
    addSigned(out, d, c.sign * (c.probability[(c.phase + d) % np] as number) * size, c.sign > 0);
  }
}

/**
 * @throws EngineError INVALID_ARGUMENT for a horizon that is not a whole number ≥ 1.
 * @example expectedDailyFlows(run.components, run.result.horizonDays).inflow[0]
 * Complexity: O(horizon · components + Σ occurrences × timing offsets).
 */
export function expectedDailyFlows(components: readonly FlowComponent[], horizon: number): ExpectedDailyFlows {
  if (!Number.isInteger(horizon) || horizon < 1) {
    throw new EngineError('INVALID_ARGUMENT', `horizon must be a whole number of days ≥ 1, got ${horizon}`);
  }
  const out: ExpectedDailyFlows = { horizon, inflow: new Float64Array(horizon), outflow: new Float64Array(horizon) };
  for (const c of components) {
    switch (c.kind) {
      case 'recurring':
        recurring(c, out);
        break;
      case 'planned':
        planned(c, out);
        break;
      case 'residual':
        residual(c, out);
        break;
      case 'intermittent':
        intermittent(c, out);
        break;
    }
  }
  return out;
}
