import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import { describeRunway } from '../../engine/runway/describeRunway';
import { firstCrossingDays } from '../../engine/runway/firstCrossingDays';
import { runway } from '../../engine/runway/runway';
import { runwayFromPaths } from '../../engine/runway/runwayFromPaths';
import { runwayFromResult } from '../../engine/runway/runwayFromResult';
import { prepareForecastBasis, type ForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario, type ScenarioRun } from '../../engine/scenario/forecastScenario';
import { syntheticHistory } from '../scenario/syntheticHistory';

const history = syntheticHistory();
let basis: ForecastBasis;
let run: ScenarioRun;

beforeAll(() => {
  basis = prepareForecastBasis(history, { horizon: 91 });
  run = forecastScenario(basis, { paths: 1000, seed: 4 });
});

describe('runway', () => {
  it('from the result alone equals the runway from the raw first crossings', () => {
    const fromResult = runwayFromResult(run.result);
    const fromPaths = runwayFromPaths(run.sim.firstCrossing, run.result.asOf, run.result.horizonDays, 0);
    expect(fromResult.p10).toEqual(fromPaths.p10);
    expect(fromResult.p50).toEqual(fromPaths.p50);
    expect(fromResult.p90).toEqual(fromPaths.p90);
    expect(fromResult.shareCrossing).toBeCloseTo(fromPaths.shareCrossing, 12);
    expect(fromResult.p10.date).toBe(run.result.shortfall.firstCrossing.p10);
    expect(fromResult.p50.date).toBe(run.result.shortfall.firstCrossing.p50);
    expect(fromResult.p90.date).toBe(run.result.shortfall.firstCrossing.p90);
  });

  it('puts the simulated range beside the 13-week burn and the naive runway', () => {
    const r = runway({ result: run.result, history });
    expect(r.burn.weeks).toBe(13);
    expect(r.burn.to).toBe(history.asOf);
    expect(r.naive.status).toBe(r.burn.burnPerWeek > 0 ? 'burning' : 'not-burning');
    if (r.naive.weeks !== null) expect(r.naive.weeks).toBeCloseTo(history.endBalance / r.burn.burnPerWeek, 9);
    expect(r.labels.naive).toMatch(/ignores timing, seasonality and uncertainty/);
    expect(r.caution).toBe(CAUTION);
    const text = describeRunway(r);
    expect(text).toHaveLength(3);
    expect(text[2]).toMatch(/^Naive runway \(balance divided by that burn/);
  });

  it('names the threshold in the naive runway when there is one', () => {
    const r = runway({ result: run.result, history, sim: run.sim, threshold: 100_000 });
    if (r.naive.weeks !== null) {
      expect(r.naive.weeks).toBeCloseTo((history.endBalance - 100_000) / r.burn.burnPerWeek, 9);
    }
    expect(describeRunway(r)[2]).toMatch(/^Naive runway \(balance above 1,000\.00 [A-Z]{3} divided by that burn/);
  });

  it('needs the raw paths for another threshold, and then uses them', () => {
    expect(() => runway({ result: run.result, history, threshold: 100_000 })).toThrow(/raw simulated paths/);
    const r = runway({ result: run.result, history, sim: run.sim, threshold: 100_000 });
    const direct = runwayFromPaths(firstCrossingDays(run.sim, 100_000), run.result.asOf, 91, 100_000);
    expect(r.simulated).toEqual(direct);
    // A higher line is reached by at least as many paths.
    expect(r.simulated.shareCrossing).toBeGreaterThanOrEqual(run.result.shortfall.probability);
  });

  it('says "beyond the horizon" when too few paths cross', () => {
    const rich = forecastScenario(
      { ...basis, history: { ...history, endBalance: 50_000_000 } },
      { paths: 200, seed: 4 },
    );
    const r = runway({ result: rich.result, history });
    expect(r.simulated.shareCrossing).toBe(0);
    expect(r.simulated.p50.beyondHorizon).toBe(true);
    expect(describeRunway(r)[0]).toMatch(/beyond the horizon; that is an estimate, not a guarantee/);
  });
});
