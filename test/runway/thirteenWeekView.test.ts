// The 13-week cash view. Common practice, no single source: weekly buckets of receipts and
// payments rolled forward one quarter; ending balance = opening balance + net flow.
import { beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import { thirteenWeekView } from '../../engine/runway/thirteenWeekView';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario, type ScenarioRun } from '../../engine/scenario/forecastScenario';
import { syntheticHistory } from '../scenario/syntheticHistory';

const history = syntheticHistory();
let run: ScenarioRun;
let short: ScenarioRun;

beforeAll(() => {
  run = forecastScenario(prepareForecastBasis(history, { horizon: 91 }), { paths: 2000, seed: 8 });
  short = forecastScenario(prepareForecastBasis(history, { horizon: 60 }), { paths: 500, seed: 8 });
});

describe('thirteenWeekView', () => {
  it('has 13 seven-day weeks counted from the as-of date', () => {
    const v = thirteenWeekView(run.result, run.components);
    expect(v.weeks).toHaveLength(13);
    expect(v.complete).toBe(true);
    v.weeks.forEach((w, i) => {
      expect(w.week).toBe(i + 1);
      expect(w.from).toBe(addDays(history.asOf, 7 * i + 1));
      expect(w.to).toBe(addDays(history.asOf, 7 * i + 7));
    });
  });

  it('closes each week at opening + net and opens the next one there', () => {
    const v = thirteenWeekView(run.result, run.components);
    expect(v.weeks[0]!.openingBalance).toBe(history.endBalance);
    for (const [i, w] of v.weeks.entries()) {
      expect(w.expectedNet).toBeCloseTo(w.expectedInflow! - w.expectedOutflow!, 6);
      expect(w.closingBalance).toBeCloseTo(w.openingBalance + w.expectedNet, 6);
      if (i > 0) expect(w.openingBalance).toBe(v.weeks[i - 1]!.closingBalance);
      expect(w.expectedInflow!).toBeGreaterThan(0);
      expect(w.expectedOutflow!).toBeGreaterThan(0);
    }
  });

  it('takes the bands from the simulated day that closes the week', () => {
    const v = thirteenWeekView(run.result, run.components);
    for (const w of v.weeks) {
      const day = run.result.daily[7 * w.week - 1]!;
      expect(day.date).toBe(w.to);
      expect(w.closing).toEqual({ p10: day.quantiles[1], p50: day.quantiles[3], p90: day.quantiles[5] });
      expect(w.pCrossedByClose).toBe(day.pCrossed);
      expect(w.closing.p10).toBeLessThanOrEqual(w.closing.p50);
      expect(w.closing.p50).toBeLessThanOrEqual(w.closing.p90);
    }
  });

  it('expected closing balances agree with the simulated mean within Monte Carlo error', () => {
    const v = thirteenWeekView(run.result, run.components);
    const n = run.sim.paths;
    for (const w of v.weeks) {
      const d = 7 * w.week - 1;
      let sum = 0;
      let sq = 0;
      for (let p = 0; p < n; p++) {
        const b = run.sim.balances[d * n + p] as number;
        sum += b;
        sq += b * b;
      }
      const mean = sum / n;
      const se = Math.sqrt((sq / n - mean * mean) / n);
      expect(Math.abs(w.closingBalance - mean), `week ${w.week}`).toBeLessThanOrEqual(4.5 * se);
    }
  });

  it('without components falls back to the simulated mean and has no inflow/outflow split', () => {
    const v = thirteenWeekView(run.result);
    expect(v.expectedFrom).toBe('simulated mean');
    for (const w of v.weeks) {
      expect(w.expectedInflow).toBeNull();
      expect(w.closingBalance).toBe(run.result.daily[7 * w.week - 1]!.mean);
    }
  });

  it('shows only whole weeks of a shorter horizon and flags the view as incomplete', () => {
    const v = thirteenWeekView(short.result, short.components);
    expect(v.weeks).toHaveLength(8);
    expect(v.complete).toBe(false);
  });
});
