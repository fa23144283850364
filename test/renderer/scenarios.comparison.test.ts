// The comparison run of the Scenarios screen: every column forecast by the worker's
// `forecast` method with the same seed, set side by side by compareScenarios; a change
// that matches no recurring flow is surfaced, not dropped.
import { describe, expect, it } from 'vitest';
import { runForecast } from '../../engine/forecast/runForecast';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { analysisMethods } from '../../renderer/src/lib/worker/analysisMethods';
import {
  SCENARIO_SEED,
  runComparison,
  type ScenarioForecastCaller,
} from '../../renderer/src/components/scenarios/comparisonRun';
import { syntheticHistory } from '../scenario/syntheticHistory';

const history = syntheticHistory({ days: 200 });

function plan(doc: unknown): Plan {
  const v = validatePlan(doc, history.currency);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

const late = plan({
  schema: 'ebbline.plan/1',
  items: [
    {
      label: 'Big invoice',
      amount: -5000,
      date: '2025-12-01',
      probability: 1,
      delayDays: { min: 0, max: 10 },
      every: null,
    },
  ],
});
const ghost = plan({
  schema: 'ebbline.plan/1',
  recurring: [{ match: 'no such flow anywhere', action: 'pause', from: null }],
});

function recordingCaller(): { caller: ScenarioForecastCaller; seeds: number[] } {
  const seeds: number[] = [];
  return {
    seeds,
    caller: {
      call: async (_method, params, options) => {
        seeds.push(params.config.seed ?? -1);
        return analysisMethods.forecast(params, { progress: (s, l) => options?.onProgress?.(s, l) });
      },
    },
  };
}

describe('runComparison', () => {
  it('runs the reference and each scenario on the same seed and compares them', async () => {
    const { caller, seeds } = recordingCaller();
    const shares: number[] = [];
    const outcome = await runComparison(
      caller,
      {
        history,
        decisions: [],
        reference: { id: null, name: 'Base forecast (no changes)', plan: null },
        scenarios: [
          { id: 'a', name: 'Big payment', plan: late },
          { id: 'b', name: 'Ghost pause', plan: ghost },
        ],
        settings: { horizon: 60, paths: 300, threshold: 0 },
      },
      { onProgress: (s) => shares.push(s) },
    );
    expect(seeds).toEqual([SCENARIO_SEED, SCENARIO_SEED, SCENARIO_SEED]);
    expect(outcome.settings.seed).toBe(SCENARIO_SEED);
    expect(outcome.comparison.columns.map((c) => c.name)).toEqual([
      'Base forecast (no changes)',
      'Big payment',
      'Ghost pause',
    ]);
    expect(outcome.comparison.caution).toContain('Estimates only');
    expect(outcome.comparison.differences[0]!.sentences[0]).toMatch(/^With "Big payment" the estimated chance/);
    expect(shares.every((s, i) => s >= 0 && s <= 1 && (i === 0 || s >= (shares[i - 1] as number) - 1e-9))).toBe(true);
    // The numbers are runForecast's for the same inputs and seed.
    const direct = runForecast(history, { horizon: 60, paths: 300, seed: SCENARIO_SEED, threshold: 0, plan: late });
    expect(outcome.runs[0]!.result.daily).toEqual(direct.daily);
    // A planned outflow lowers the median from its date on; nothing before it changes.
    const before = outcome.reference.result.daily.findIndex((d) => d.date === '2025-12-01') - 1;
    expect(outcome.runs[0]!.result.daily[before]!.quantiles).toEqual(outcome.reference.result.daily[before]!.quantiles);
    // The pause that matches nothing is surfaced with the forecast's own note.
    expect(outcome.runs[1]!.unmatched).toEqual([
      'The plan\'s change "pause no such flow anywhere" matches no recurring flow that is projected; it was not applied.',
    ]);
    expect(outcome.runs[1]!.result.daily).toEqual(outcome.reference.result.daily);
  });

  it('refuses a fifth scenario before forecasting anything', async () => {
    const { caller, seeds } = recordingCaller();
    const five = Array.from({ length: 5 }, (_, i) => ({ id: `s${i}`, name: `S${i}`, plan: late }));
    await expect(
      runComparison(caller, {
        history,
        decisions: [],
        reference: { id: null, name: 'Base', plan: null },
        scenarios: five,
        settings: { horizon: 30, paths: 100, threshold: 0 },
      }),
    ).rejects.toThrow('At most 4');
    expect(seeds).toEqual([]);
  });
});
