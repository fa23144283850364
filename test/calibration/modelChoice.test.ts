// Calibration of the model choice: on series whose generating family is known and the
// difference is clear, the rolling-origin backtest (lowest mean pinball loss) must pick a
// candidate of the true family. Invented, seeded series of two years.
import { describe, expect, it } from 'vitest';
import { createRng } from '../../engine/core/random';
import { isoWeekday, toDayNumber } from '../../engine/core/dates';
import { CANDIDATE_NAMES, modelResidualFlow } from '../../engine/forecast/residualFlows';

const START = '2024-01-01';
const DAYS = 730;

function series(value: (weekday: number, rng: ReturnType<typeof createRng>) => number, seed: number): Float64Array {
  const rng = createRng(seed);
  const first = toDayNumber(START);
  return Float64Array.from({ length: DAYS }, (_, d) => Math.max(0, Math.round(value(isoWeekday(first + d), rng))));
}

function pinballOf(report: ReturnType<typeof modelResidualFlow>['report'], name: string): number {
  const c = report.backtest?.candidates.find((x) => x.name === name);
  if (!c?.pinball) throw new Error(`no pinball score for ${name}`);
  return c.pinball.mean;
}

describe('the backtest picks the true model family in clear cases', () => {
  it('a strongly weekly-seasonal smooth flow gets a weekly-seasonal model, not a flat one', () => {
    // Market takings: a steady level with a large Saturday peak and a quiet Sunday, little noise.
    const weekly = [0, -2_000, -1_500, 0, 3_000, 14_000, -9_000];
    const y = series((w, rng) => 10_000 + (weekly[w - 1] as number) + 600 * rng.normal(), 21);
    const { report, component } = modelResidualFlow(y, START, 'inflow', '2026-01-01', 60);
    expect(report.treatment).toBe('continuous');
    expect(report.components.weekly).toBe(true);
    expect([CANDIDATE_NAMES.ets, CANDIDATE_NAMES.decomposition]).toContain(report.method);
    if (report.method === CANDIDATE_NAMES.ets) expect(report.model).toMatch(/^ETS\(A,(N|A|Ad),A\)$/);
    // The seasonal naive benchmark doubles the noise and must lose clearly.
    expect(pinballOf(report, report.method)).toBeLessThan(0.8 * pinballOf(report, CANDIDATE_NAMES.seasonalNaive));
    expect(component?.kind).toBe('residual');
  });

  it('pure noise around a level gets a non-seasonal level model, not the seasonal naive one', () => {
    const y = series((_, rng) => 6_000 + 2_500 * rng.normal(), 22);
    const { report } = modelResidualFlow(y, START, 'outflow', '2026-01-01', 60);
    expect(report.method).not.toBe(CANDIDATE_NAMES.seasonalNaive);
    expect(report.method).not.toBe(CANDIDATE_NAMES.croston);
    // Whichever level model wins, the ETS candidate itself chose no season and no trend by AICc.
    const ets = report.backtest?.candidates.find((c) => c.name === CANDIDATE_NAMES.ets);
    expect(ets?.model).toBe('ETS(A,N,N)');
    // Common practice, no source: seasonal naive on white noise has √2 times its error, so its
    // pinball loss is far worse than a level model's.
    expect(pinballOf(report, report.method)).toBeLessThan(0.8 * pinballOf(report, CANDIDATE_NAMES.seasonalNaive));
  });

  it('a rare lumpy flow gets the intermittent treatment', () => {
    const y = series((_, rng) => (rng.nextFloat() < 0.05 ? 30_000 + 60_000 * rng.nextFloat() : 0), 23);
    const { report, component } = modelResidualFlow(y, START, 'outflow', '2026-01-01', 60);
    expect(report.method).toBe(CANDIDATE_NAMES.croston);
    expect(component?.kind).toBe('intermittent');
  });
});
