/**
 * The `ebbline.forecast/1` JSON document of DESIGN.md section 5: amounts in major units
 * rounded to the currency's minor unit, probabilities with six decimals, keys in a fixed
 * order, so the same inputs and seed give byte-identical output.
 */
import { exponentOf, toMajor } from '../core/money';
import { QUANTILE_LEVELS } from '../simulate/types';
import type { ForecastResult } from './runForecast';

export const FORECAST_SCHEMA = 'ebbline.forecast/1';

function probability(p: number): number {
  return Number(p.toFixed(6));
}

function score(x: number | null | undefined): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : Number(x.toPrecision(6));
}

const QUANTILE_KEYS = ['p05', 'p10', 'p25', 'p50', 'p75', 'p90', 'p95'] as const;

/**
 * The JSON-ready object of a forecast.
 * @example JSON.stringify(forecastToJson(result), null, 2)
 */
export function forecastToJson(result: ForecastResult): Record<string, unknown> {
  const e = exponentOf(result.currency);
  const money = (minor: number) => toMajor(Math.round(minor), e);
  if (QUANTILE_LEVELS.length !== QUANTILE_KEYS.length) throw new Error('quantile keys out of step with levels');
  const direction = (m: ForecastResult['model']['inflow']) => ({
    method: m.method,
    model: m.model,
    treatment: m.treatment,
    trainingDays: m.trainingDays,
    meanPerDay: money(m.meanPerDay),
    components: m.components,
    residualCheck: m.residualCheck,
    notes: m.notes,
  });
  const backtest = (m: ForecastResult['model']['inflow']) =>
    m.backtest === null
      ? null
      : {
          horizon: m.backtest.horizon,
          origins: m.backtest.origins.length,
          winner: m.backtest.winner,
          candidates: m.backtest.candidates.map((c) => ({
            name: c.name,
            model: c.model,
            mase: score(c.mase),
            pinball: c.pinball ? score(c.pinball.mean / 10 ** e) : null,
            coverage80: score(c.coverage80),
            coverage90: score(c.coverage90),
          })),
        };
  return {
    schema: FORECAST_SCHEMA,
    asOf: result.asOf,
    currency: result.currency,
    horizonDays: result.horizonDays,
    paths: result.paths,
    seed: result.seed,
    threshold: money(result.threshold),
    startBalance: money(result.startBalance),
    daily: result.daily.map((d) => {
      const row: Record<string, unknown> = { date: d.date, mean: money(d.mean) };
      QUANTILE_KEYS.forEach((k, i) => (row[k] = money(d.quantiles[i] as number)));
      row.pBelow = probability(d.pBelow);
      row.pCrossed = probability(d.pCrossed);
      return row;
    }),
    shortfall: {
      probability: probability(result.shortfall.probability),
      standardError: probability(result.shortfall.standardError),
      firstCrossing: result.shortfall.firstCrossing,
      drivers: result.shortfall.drivers.map((d) => ({ label: d.label, amount: money(d.amount) })),
    },
    recurring: result.recurring.map((r) => ({
      label: r.label,
      cadence: r.flow.cadenceText,
      amount: money(r.amount),
      next: r.nextDate,
      confidence: probability(r.flow.confidence),
      status: r.status,
    })),
    model: {
      inflow: direction(result.model.inflow),
      outflow: direction(result.model.outflow),
      backtest: { inflow: backtest(result.model.inflow), outflow: backtest(result.model.outflow) },
    },
    notes: result.notes,
    caution: result.caution,
  };
}
