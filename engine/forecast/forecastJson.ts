/**
 * The `ebbline.forecast/1` JSON document of DESIGN.md section 5: amounts in major units
 * rounded to the currency's minor unit, probabilities with six decimals, keys in a fixed
 * order, so the same inputs and seed give byte-identical output.
 *
 * The keys DESIGN.md spells out are exactly those written at the top level and in `daily`,
 * `shortfall`, `firstCrossing`, `drivers` and `recurring` (outside checks read them). The
 * contents of `model.inflow`, `model.outflow` and `model.backtest` are open in the design;
 * they carry the model report, the backtest scores of every candidate and the notes, and
 * `model.notes` holds the notes that concern the whole forecast (balances, the plan).
 */
import { exponentOf, toMajor } from '../core/money';
import { describeCadence } from '../recurring/cadence';
import { QUANTILE_LEVELS } from '../simulate/types';
import type { DirectionReport } from './residualFlows';
import type { ForecastResult } from './runForecast';

export const FORECAST_SCHEMA = 'ebbline.forecast/1';

/** Keys of one `daily` row besides date, mean, pBelow and pCrossed, in QUANTILE_LEVELS order. */
export const QUANTILE_KEYS = ['p05', 'p10', 'p25', 'p50', 'p75', 'p90', 'p95'] as const;

/** A probability as written: six decimals (finer than any Monte Carlo error at 100,000 paths). */
export function jsonProbability(p: number): number {
  return Number(p.toFixed(6));
}

/** A score as written: six significant digits, null when undefined. */
function score(x: number | null | undefined): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : Number(x.toPrecision(6));
}

function directionJson(m: DirectionReport, money: (minor: number) => number) {
  return {
    method: m.method,
    model: m.model,
    treatment: m.treatment,
    trainingDays: m.trainingDays,
    meanPerDay: money(m.meanPerDay),
    components: { weekly: m.components.weekly, monthly: m.components.monthly, yearly: m.components.yearly },
    residualCheck: m.residualCheck,
    residualsLookRandom: m.residualsLookRandom,
    notes: m.notes,
  };
}

function backtestJson(m: DirectionReport, exponent: number) {
  if (m.backtest === null) return null;
  return {
    winner: m.method,
    scoredBy: 'mean pinball loss over P10/P50/P90, MASE breaking ties',
    horizonDays: m.backtest.horizon,
    origins: m.backtest.origins.length,
    candidates: m.backtest.candidates.map((c) => ({
      name: c.name,
      model: c.model,
      mase: score(c.mase),
      // Pinball loss is in money per day: major units like every other amount.
      pinball: c.pinball ? score(c.pinball.mean / 10 ** exponent) : null,
      coverage80: score(c.coverage80),
      coverage90: score(c.coverage90),
      failures: c.failures.length,
    })),
  };
}

/**
 * The JSON-ready object of a forecast.
 * @example JSON.stringify(forecastToJson(result), null, 2)
 */
export function forecastToJson(result: ForecastResult): Record<string, unknown> {
  const e = exponentOf(result.currency);
  const money = (minor: number) => toMajor(Math.round(minor), e);
  if (QUANTILE_LEVELS.length !== QUANTILE_KEYS.length) throw new Error('quantile keys out of step with levels');
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
      row.pBelow = jsonProbability(d.pBelow);
      row.pCrossed = jsonProbability(d.pCrossed);
      return row;
    }),
    shortfall: {
      probability: jsonProbability(result.shortfall.probability),
      firstCrossing: {
        p10: result.shortfall.firstCrossing.p10,
        p50: result.shortfall.firstCrossing.p50,
        p90: result.shortfall.firstCrossing.p90,
      },
      drivers: result.shortfall.drivers.map((d) => ({ label: d.label, amount: money(d.amount) })),
    },
    recurring: result.recurring.map((r) => ({
      label: r.label,
      cadence: describeCadence(r.cadence),
      amount: money(r.amount),
      next: r.nextDate,
      confidence: jsonProbability(r.flow.confidence),
    })),
    model: {
      inflow: directionJson(result.model.inflow, money),
      outflow: directionJson(result.model.outflow, money),
      backtest: { inflow: backtestJson(result.model.inflow, e), outflow: backtestJson(result.model.outflow, e) },
      notes: result.notes.filter((n) => !n.startsWith('Inflows: ') && !n.startsWith('Outflows: ')),
    },
    caution: result.caution,
  };
}
