import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import type { ForecastResult } from '../../engine/forecast/runForecast';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { compareScenarios } from '../../engine/scenario/compareScenarios';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario } from '../../engine/scenario/forecastScenario';
import { syntheticHistory } from './syntheticHistory';

function plan(items: unknown[]): Plan {
  const v = validatePlan({ schema: 'ebbline.plan/1', items }, 'EUR');
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

let base: ForecastResult;
let outflow: ForecastResult;
let inflow: ForecastResult;

beforeAll(() => {
  const history = syntheticHistory({ endBalance: 900_000 });
  const basis = prepareForecastBasis(history, { horizon: 60 });
  const config = { paths: 1000, seed: 12, threshold: 450_000 };
  base = forecastScenario(basis, config).result;
  outflow = forecastScenario(basis, {
    ...config,
    plan: plan([{ label: 'Kiln deposit', amount: -1000, date: base.daily[5]!.date }]),
  }).result;
  inflow = forecastScenario(basis, {
    ...config,
    plan: plan([{ label: 'Grant', amount: 3000, date: base.daily[0]!.date }]),
  }).result;
});

describe('compareScenarios', () => {
  it('puts the base first and reads each column at the chosen dates', () => {
    const dates = [base.daily[59]!.date, base.daily[9]!.date];
    const c = compareScenarios(base, [{ name: 'Kiln', result: outflow }], { dates });
    expect(c.dates).toEqual([base.daily[9]!.date, base.daily[59]!.date]);
    expect(c.columns.map((x) => [x.name, x.isBase])).toEqual([
      ['Base forecast', true],
      ['Kiln', false],
    ]);
    const at = c.columns[1]!.at[0]!;
    const day = outflow.daily[9]!;
    expect(at).toEqual({
      date: day.date,
      mean: day.mean,
      p10: day.quantiles[1],
      p50: day.quantiles[3],
      p90: day.quantiles[5],
      pBelow: day.pBelow,
      pCrossed: day.pCrossed,
    });
    expect(c.columns[1]!.shortfall.probability).toBe(outflow.shortfall.probability);
    expect(c.caution).toBe(CAUTION);
  });

  it('explains a certain outflow in plain words with the exact median change', () => {
    const c = compareScenarios(base, [{ name: 'Kiln', result: outflow }]);
    // Default dates: every 30 days and the last day.
    expect(c.dates).toEqual([base.daily[29]!.date, base.daily[59]!.date]);
    const d = c.differences[0]!;
    // Common random numbers: every path is exactly 1,000.00 EUR lower from day 5 on.
    expect(d.medianChange[1]).toBeCloseTo(-100_000, 6);
    const pb = base.daily[59]!.pCrossed;
    const ps = outflow.daily[59]!.pCrossed;
    expect(ps).toBeGreaterThan(pb);
    expect(d.sentences[0]).toMatch(
      /^With "Kiln" the estimated chance of going below 4,500\.00 EUR by \d{1,2} \w{3} \d{4} rises from \d+(\.\d)?% to \d+(\.\d)?%; the median balance on that date is 1,000\.00 EUR lower\.$/,
    );
    const inflowWords = compareScenarios(base, [{ name: 'Grant', result: inflow }]).differences[0]!.sentences[0]!;
    expect(inflowWords).toMatch(/falls from .* to .*; the median balance on that date is 3,000\.00 EUR higher\./);
  });

  it('says "stays at" for no change and "about the same" within simulation noise', () => {
    const same = compareScenarios(base, [{ name: 'Copy', result: base }]).differences[0]!;
    expect(same.sentences).toHaveLength(1);
    expect(same.sentences[0]).toMatch(/stays at .*; the median balance on that date is unchanged\.$/);
    // Shift the last day's pCrossed by less than two standard errors of a difference.
    const p = 0.3;
    const tweak = (r: ForecastResult, q: number): ForecastResult => ({
      ...r,
      daily: r.daily.map((x, i) => (i === r.daily.length - 1 ? { ...x, pCrossed: q } : x)),
    });
    const se = Math.sqrt((2 * p * (1 - p)) / 1000);
    const noisy = compareScenarios(tweak(base, p), [{ name: 'Noise', result: tweak(base, p + 1.5 * se) }]);
    expect(noisy.differences[0]!.sentences[0]).toMatch(
      /stays about the same \(30% against 33%, within simulation noise\)/,
    );
    const real = compareScenarios(tweak(base, p), [{ name: 'Real', result: tweak(base, p + 2.5 * se) }]);
    expect(real.differences[0]!.sentences[0]).toMatch(/rises from 30% to 35%/);
  });

  it('refuses what cannot be compared', () => {
    const five = Array.from({ length: 5 }, (_, i) => ({ name: `S${i}`, result: outflow }));
    expect(() => compareScenarios(base, five)).toThrow(/at most 4/);
    expect(() => compareScenarios(base, [{ name: 'Base forecast', result: outflow }])).toThrow(/two columns/);
    expect(() => compareScenarios(base, [{ name: 'X', result: { ...outflow, threshold: 0 } }])).toThrow(/threshold/);
    expect(() => compareScenarios(base, [{ name: 'X', result: { ...outflow, horizonDays: 30 } }])).toThrow(/horizon/);
    expect(() => compareScenarios(base, [], { dates: [base.asOf] })).toThrow(/outside the forecast/);
  });
});
