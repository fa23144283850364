import { describe, expect, it } from 'vitest';
import { forecastToJson } from '../../engine/forecast/forecastJson';
import { runForecast } from '../../engine/forecast/runForecast';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario } from '../../engine/scenario/forecastScenario';
import { forecastWithPaths } from '../../engine/scenario/forecastWithPaths';
import { syntheticHistory } from './syntheticHistory';

const history = syntheticHistory();

function plan(doc: unknown): Plan {
  const v = validatePlan(doc, 'EUR');
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

const withChanges = plan({
  schema: 'ebbline.plan/1',
  items: [
    { label: 'Kiln deposit', amount: -1500, date: '2026-01-05', probability: 1 },
    { label: 'Big invoice', amount: 2400, date: '2026-01-10', probability: 0.7, delayDays: { min: 5, max: 40 } },
    { label: 'Loan instalment', amount: -320, date: '2026-01-15', every: 'month' },
  ],
  recurring: [
    { match: 'landlord', action: 'scale', from: '2026-02-01', factor: 1.1 },
    { match: 'nothing like this', action: 'pause' },
  ],
  startBalanceChange: 500,
});

describe('forecastScenario on a prepared basis', () => {
  it('serves several plans from one basis: each equals its own runForecast', () => {
    // runForecast prepares a fresh basis for its plan; here one basis is prepared without
    // any plan and reused. Equal results show the basis does not depend on the plan.
    const decisions = [{ key: 'out:owner:monthDay', state: 'dismissed' as const }];
    const basis = prepareForecastBasis(history, { horizon: 91, decisions });
    for (const p of [
      withChanges,
      plan({ schema: 'ebbline.plan/1', recurring: [{ match: 'landlord', action: 'pause', from: '2026-01-20' }] }),
    ]) {
      const config = { horizon: 91, paths: 600, seed: 17, threshold: 50_000, plan: p, decisions };
      const direct = runForecast(history, config);
      const viaBasis = forecastScenario(basis, { paths: 600, seed: 17, threshold: 50_000, plan: p });
      expect(viaBasis.result).toEqual(direct);
      expect(JSON.stringify(forecastToJson(viaBasis.result))).toBe(JSON.stringify(forecastToJson(direct)));
      expect(forecastWithPaths(history, config).result).toEqual(direct);
    }
    const run = forecastScenario(basis, { paths: 600, seed: 17, threshold: 50_000, plan: withChanges });
    // The unmatched plan change is reported, not dropped.
    expect(run.result.notes.some((n) => n.includes('nothing like this'))).toBe(true);
    expect(run.components.map((c) => c.key)).toContain('plan:0:Kiln deposit');
  });

  it('shares the draws of untouched flows: a certain one-off shifts every path by its amount', () => {
    const basis = prepareForecastBasis(history, { horizon: 60 });
    const base = forecastScenario(basis, { paths: 300, seed: 2 });
    const day = 20;
    const oneOff = plan({
      schema: 'ebbline.plan/1',
      items: [{ label: 'Deposit', amount: -1000, date: base.result.daily[day]!.date }],
    });
    const scenario = forecastScenario(basis, { paths: 300, seed: 2, plan: oneOff });
    const n = base.sim.paths;
    for (let d = 0; d < 60; d++) {
      for (let p = 0; p < n; p += 37) {
        const shift = d >= day ? -100_000 : 0;
        expect(scenario.sim.balances[d * n + p]).toBeCloseTo(base.sim.balances[d * n + p]! + shift, 6);
      }
    }
  });

  it('refuses settings outside their bounds', () => {
    const basis = prepareForecastBasis(history, { horizon: 30 });
    expect(() => forecastScenario(basis, { paths: 10 })).toThrow(/paths/);
    expect(() => forecastScenario(basis, { seed: -1 })).toThrow(/seed/);
    expect(() => prepareForecastBasis(history, { horizon: 0 })).toThrow(/horizon/);
    expect(() => prepareForecastBasis(syntheticHistory({ days: 20 }))).toThrow(/at least 28 days/);
  });
});
