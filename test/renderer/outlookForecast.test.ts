import { readdirSync, readFileSync } from 'node:fs';
import { beforeEach, describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import { historyFromLedger, type ForecastHistory } from '../../engine/forecast/history';
import { runForecast } from '../../engine/forecast/runForecast';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import {
  analysisMethods,
  clearAnalysisCache,
  crossingsAt,
  forecastWithKeptModels,
  HistoryNotKeptError,
  resolveHistory,
} from '../../renderer/src/lib/worker/analysisMethods';

/**
 * The invented demo workspace's EUR history (resources/demo), cut to its last 400 days so
 * the backtests run (they need 168 days) while each forecast stays around a second.
 */
function demoHistory(): ForecastHistory {
  const dir = new URL('../../resources/demo/statements/', import.meta.url);
  const files = readdirSync(dir)
    .sort()
    .map((file) => ({
      file,
      result: importStatement(new Uint8Array(readFileSync(new URL(file, dir))), { fileName: file }) as ImportResult,
    }));
  const full = historyFromLedger(buildLedger(files), { currency: 'EUR' });
  const start = addDays(full.asOf, -399);
  return Object.freeze({ ...full, start, entries: Object.freeze(full.entries.filter((e) => e.date >= start)) });
}

const history = demoHistory();
const context = { progress: () => {} };
// A threshold near the balance, so that paths do cross and the drivers are not empty.
const base = { horizon: 60, paths: 1000, seed: 3, threshold: 2_800_000 };

describe('the Outlook forecast with kept models', () => {
  beforeEach(() => clearAnalysisCache());

  it('gives exactly runForecast’s result, cold, after a new threshold and after a new horizon', () => {
    const labels: string[] = [];
    expect(forecastWithKeptModels(history, base)).toEqual(runForecast(history, base));
    // Same paths, another threshold: only the crossings are counted again.
    const lower = { ...base, threshold: 2_500_000 };
    const kept = forecastWithKeptModels(history, lower, (_, label) => labels.push(label));
    expect(labels).toContain('Counting the paths below the threshold');
    expect(labels.some((l) => l.startsWith('Modelling'))).toBe(false);
    const fresh = runForecast(history, lower);
    expect(kept).toEqual(fresh);
    expect(fresh.shortfall.probability).toBeGreaterThan(0);
    // Models fitted for 365 days serve a 90-day horizon unchanged.
    const longer = { ...base, horizon: 90, paths: 500 };
    expect(forecastWithKeptModels(history, longer)).toEqual(runForecast(history, longer));
  });

  it('gives the same result with models fitted per direction from the residual series (two workers)', async () => {
    const inputs = await analysisMethods.residualInputs({ history, decisions: [] }, context);
    const fit = (direction: 'inflow' | 'outflow') =>
      analysisMethods.fitResidualSeries(
        { series: inputs[direction], start: inputs.start, direction, forecastStart: inputs.forecastStart },
        context,
      );
    const [inflow, outflow] = [await fit('inflow'), await fit('outflow')];
    clearAnalysisCache(); // the forecasting worker has fitted nothing itself
    const labels: string[] = [];
    const result = await analysisMethods.forecast(
      {
        history,
        config: base,
        models: {
          fitHorizon: Math.min(inflow.fitHorizon, outflow.fitHorizon),
          inflow: inflow.model,
          outflow: outflow.model,
        },
      },
      { progress: (_, label) => labels.push(label) },
    );
    expect(labels.some((l) => l.startsWith('Modelling'))).toBe(false);
    const expected = runForecast(history, base);
    // The window receives the recurring flows without the ids of their entries.
    expect(result.detected.every((f) => f.memberIds.length === 0)).toBe(true);
    expect(result.recurring.every((r) => r.flow.memberIds.length === 0)).toBe(true);
    expect(result).toEqual({
      ...expected,
      detected: expected.detected.map((f) => ({ ...f, memberIds: [] })),
      recurring: expected.recurring.map((r) => ({ ...r, flow: { ...r.flow, memberIds: [] } })),
    });
  });

  it('keeps a history under its key, so later calls only name it', async () => {
    const first = await analysisMethods.forecast({ history, historyKey: 'k1', config: base }, context);
    expect(first.shortfall.probability).toBeGreaterThan(0);
    const named = await analysisMethods.forecast({ history: null, historyKey: 'k1', config: base }, context);
    expect(named).toEqual(first);
    expect(resolveHistory({ history: null, historyKey: 'k1' }).history).toBe(history);
    expect(() => resolveHistory({ history: null, historyKey: 'unknown' })).toThrow(HistoryNotKeptError);
    try {
      resolveHistory({ history: null, historyKey: 'unknown' });
    } catch (e) {
      expect((e as HistoryNotKeptError).code).toBe('HISTORY_NOT_KEPT');
    }
  });

  it('refuses settings outside their bounds with runForecast’s own messages', () => {
    for (const config of [{ horizon: 0 }, { paths: 50 }, { seed: -1 }, { threshold: Number.NaN }]) {
      let expected = '';
      try {
        runForecast(history, config);
      } catch (e) {
        expected = (e as Error).message;
      }
      expect(expected).not.toBe('');
      expect(() => forecastWithKeptModels(history, config)).toThrow(expected);
    }
  });
});

describe('crossingsAt', () => {
  it('finds the same first day below as the simulation does', () => {
    const components = [
      {
        kind: 'recurring' as const,
        key: 'rent',
        label: 'Rent',
        days: [0, 30, 60],
        amount: { kind: 'normal' as const, mean: -90_000, sd: 20_000 },
        timing: { offsets: [0, 1], weights: [0.7, 0.3] },
        probability: 0.9,
      },
    ];
    const input = { startBalance: 200_000, horizon: 70, paths: 400, seed: 9, components };
    for (const threshold of [0, 50_000, 120_000, 250_000]) {
      const sim = simulateBalances({ ...input, threshold });
      const other = simulateBalances({ ...input, threshold: -1e9 });
      expect(Array.from(crossingsAt(other, threshold))).toEqual(Array.from(sim.firstCrossing));
    }
  });
});
