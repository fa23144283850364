/**
 * The `ebbline.decompose/1` JSON document (`ebbline decompose --format json`): for the
 * inflows and outflows that the recurring flows do not explain, the components of the
 * daily decomposition (arrays in major units, one value per calendar day from `start`),
 * the weekly profile, what was estimated and what was left out, the diagnostics of the
 * series and of the remainder, and the recurring flows found. Amounts are rounded to the
 * currency's minor unit, statistics to six significant digits, keys in a fixed order.
 */
import { CAUTION } from '../core/caution';
import { exponentOf, toMajor } from '../core/money';
import { describeCadence } from '../recurring/cadence';
import type { SeriesDiagnostics } from '../stats/diagnostics';
import type { DirectionPatterns, HistoryPatterns } from './decomposeHistory';
import { recurringSelection, type RecurringDecision } from './recurringComponents';

export const DECOMPOSE_SCHEMA = 'ebbline.decompose/1';

/** ISO weekdays in the order of DailyDecomposition.weeklyProfile (index 0 = Monday). */
export const WEEKDAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

function stat(x: number | null | undefined): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : Number(x.toPrecision(6));
}

function stats(values: ArrayLike<number>): (number | null)[] {
  return Array.from(values, (v) => stat(v));
}

/** The diagnostics part of the document. */
export function diagnosticsJson(d: SeriesDiagnostics | null) {
  if (d === null) return null;
  return {
    n: d.n,
    period: d.period,
    maxLag: d.maxLag,
    level: d.level,
    acf: d.acf
      ? {
          values: stats(d.acf.values),
          whiteNoiseBand: stat(d.acf.whiteNoiseBand),
          bartlettBands: stats(d.acf.bartlettBands),
        }
      : null,
    pacf: d.pacf ? { values: stats(d.pacf.values), whiteNoiseBand: stat(d.pacf.whiteNoiseBand) } : null,
    ljungBox: d.whiteNoise
      ? {
          statistic: stat(d.whiteNoise.ljungBox.statistic),
          lag: d.whiteNoise.ljungBox.lag,
          df: d.whiteNoise.ljungBox.df,
          pValue: stat(d.whiteNoise.ljungBox.pValue),
        }
      : null,
    whiteNoise: d.whiteNoise ? d.whiteNoise.isWhiteNoise : null,
    lagsOutsideBand: d.whiteNoise ? [...d.whiteNoise.lagsOutside] : null,
    adf: d.adf ? { statistic: stat(d.adf.statistic), lag: d.adf.lag, pValue: stat(d.adf.pValue) } : null,
    kpss: d.kpss
      ? {
          statistic: stat(d.kpss.statistic),
          lag: d.kpss.lag,
          pValue: stat(d.kpss.pValue),
          pValueBound: d.kpss.pValueBound,
        }
      : null,
    differencing: { ndiffs: d.ndiffs, nsdiffs: d.nsdiffs },
    sentences: [...d.sentences],
    omitted: d.omitted.map((o) => ({ component: o.component, reason: o.reason })),
  };
}

function directionJson(p: DirectionPatterns, start: string, money: (x: number) => number) {
  const d = p.decomposition;
  const amounts = (values: ArrayLike<number>) => Array.from(values, money);
  let total = 0;
  for (let i = 0; i < p.series.length; i++) total += p.series[i] as number;
  return {
    direction: p.direction,
    days: p.series.length,
    total: money(total),
    meanPerDay: money(p.series.length ? total / p.series.length : 0),
    components: d
      ? {
          start,
          trend: amounts(d.trend),
          weekly: amounts(d.weekly),
          monthly: d.monthly ? amounts(d.monthly) : null,
          yearly: d.yearly ? amounts(d.yearly) : null,
          remainder: amounts(d.remainder),
        }
      : null,
    weeklyProfile: d
      ? Object.fromEntries(WEEKDAY_NAMES.map((name, i) => [name, money(d.weeklyProfile[i] as number)]))
      : null,
    estimated: d
      ? { trend: true, weekly: true, monthly: d.estimated.monthly, yearly: d.estimated.yearly }
      : { trend: false, weekly: false, monthly: false, yearly: false },
    weeklyStrength: stat(p.weeklyStrength),
    notes: [...p.notes],
    diagnostics: { series: diagnosticsJson(p.seriesDiagnostics), remainder: diagnosticsJson(p.remainderDiagnostics) },
  };
}

/**
 * The JSON-ready object of a history's patterns. `treatment` of a recurring flow says what
 * a forecast does with it: 'projected' by its schedule, 'ended', 'dismissed', or
 * 'unconfirmed' (kept with the other flows until confirmed); the components describe the
 * flows left once the projected and ended ones are taken out. `notes` are the caller's
 * sentences about the whole history (e.g. an account whose statements end early).
 * @example JSON.stringify(decomposeToJson(decomposeHistory(history)), null, 2)
 */
export function decomposeToJson(
  patterns: HistoryPatterns,
  decisions: readonly RecurringDecision[] = [],
  notes: readonly string[] = [],
): Record<string, unknown> {
  const byKey = new Map(decisions.map((d) => [d.key, d]));
  const e = exponentOf(patterns.currency);
  const money = (minor: number) => toMajor(Math.round(minor), e);
  return {
    schema: DECOMPOSE_SCHEMA,
    currency: patterns.currency,
    start: patterns.start,
    asOf: patterns.asOf,
    inflow: directionJson(patterns.inflow, patterns.start, money),
    outflow: directionJson(patterns.outflow, patterns.start, money),
    recurring: patterns.recurring.map((f) => ({
      label: f.label,
      direction: f.direction,
      cadence: describeCadence(f.cadence),
      amount: money(f.typicalAmount),
      next: f.nextDate,
      confidence: Number(f.confidence.toFixed(6)),
      occurrences: f.occurrences,
      firstDate: f.firstDate,
      lastDate: f.lastDate,
      treatment: recurringSelection(f, byKey.get(f.key)),
    })),
    notes: [...notes],
    caution: CAUTION,
  };
}
