/**
 * Up to four scenarios side by side with the base forecast: balance bands and the chance
 * of having gone below the threshold at chosen dates, the shortfall probability over the
 * horizon, the first-crossing range and the simulated runway, and what changes against the
 * base in plain words.
 *
 * "About the same" is decided conservatively: a change in a probability smaller than two
 * standard errors of the difference of two independent estimates, 2·√(se₁² + se₂²), is
 * called within simulation noise. Scenario runs share random numbers with the base
 * (engine/simulate), so their true noise is smaller; a small real change may then be
 * described as "about the same", never the other way round.
 */
import { CAUTION } from '../core/caution';
import { addDays, daysBetween, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import type { ForecastResult } from '../forecast/runForecast';
import { formatAmount, formatDate, formatPercent, formatWeeks } from '../report/plainFormat';
import type { CrossingRunway, RunwayQuantile } from '../runway/runwayFromCrossedShares';
import { runwayFromResult } from '../runway/runwayFromResult';
import { QUANTILE_LEVELS } from '../simulate/types';

/** Most scenarios compared with the base at once. */
export const MAX_SCENARIOS = 4;

/** How the app and the CLI's report name the forecast without any plan. */
export const BASE_FORECAST_NAME = 'Base forecast (no changes)';

const P10 = QUANTILE_LEVELS.indexOf(0.1);
const P50 = QUANTILE_LEVELS.indexOf(0.5);
const P90 = QUANTILE_LEVELS.indexOf(0.9);

export interface NamedResult {
  readonly name: string;
  readonly result: ForecastResult;
}

/** One scenario (or the base) at one comparison date; amounts in minor units. */
export interface ScenarioAtDate {
  readonly date: CalendarDate;
  readonly mean: number;
  readonly p10: number;
  readonly p50: number;
  readonly p90: number;
  readonly pBelow: number;
  readonly pCrossed: number;
}

export interface ScenarioColumn {
  readonly name: string;
  readonly isBase: boolean;
  readonly planItems: number;
  readonly at: readonly ScenarioAtDate[];
  readonly shortfall: { readonly probability: number; readonly standardError: number };
  readonly firstCrossing: ForecastResult['shortfall']['firstCrossing'];
  readonly runway: CrossingRunway;
}

export interface ScenarioDifference {
  readonly name: string;
  /** Change of pCrossed at each comparison date (scenario − base). */
  readonly pCrossedChange: readonly number[];
  /** Change of the median balance at each comparison date (minor units). */
  readonly medianChange: readonly number[];
  readonly sentences: readonly string[];
}

export interface ScenarioComparison {
  readonly asOf: CalendarDate;
  readonly currency: string;
  readonly threshold: number;
  readonly horizonDays: number;
  readonly dates: readonly CalendarDate[];
  /** The base first, then the scenarios in the order given. */
  readonly columns: readonly ScenarioColumn[];
  readonly differences: readonly ScenarioDifference[];
  readonly caution: string;
}

export interface CompareOptions {
  /** Dates to compare at (within the horizon, ascending after sorting); default every 30 days and the last day (30 days apart, none within a week of the last). */
  readonly dates?: readonly CalendarDate[];
  /** The base column's name (default "Base forecast"). */
  readonly baseName?: string;
}

function defaultDates(asOf: CalendarDate, horizon: number): CalendarDate[] {
  const days: number[] = [];
  // Every 30 days, but not within a week of the last day, which always ends the list.
  for (let d = 30; d + 7 <= horizon; d += 30) days.push(d);
  days.push(horizon);
  return days.map((d) => addDays(asOf, d));
}

function column(name: string, isBase: boolean, r: ForecastResult, dates: readonly CalendarDate[]): ScenarioColumn {
  const at = dates.map((date) => {
    const day = r.daily[daysBetween(r.asOf, date) - 1] as ForecastResult['daily'][number];
    return {
      date,
      mean: day.mean,
      p10: day.quantiles[P10] as number,
      p50: day.quantiles[P50] as number,
      p90: day.quantiles[P90] as number,
      pBelow: day.pBelow,
      pCrossed: day.pCrossed,
    };
  });
  return {
    name,
    isBase,
    planItems: r.planItems,
    at,
    shortfall: { probability: r.shortfall.probability, standardError: r.shortfall.standardError },
    firstCrossing: r.shortfall.firstCrossing,
    runway: runwayFromResult(r),
  };
}

/** Probabilities p (base) and q (scenario) from n and m paths: is q − p within noise? */
function withinNoise(p: number, n: number, q: number, m: number): boolean {
  const se = Math.sqrt((p * (1 - p)) / n + (q * (1 - q)) / m);
  return Math.abs(q - p) <= 2 * se;
}

function runwayText(q: RunwayQuantile): string {
  return q.beyondHorizon || q.weeks === null ? 'beyond the horizon' : formatWeeks(q.weeks);
}

function sentencesFor(
  base: ScenarioColumn,
  scenario: ScenarioColumn,
  baseResult: ForecastResult,
  result: ForecastResult,
  currency: string,
  threshold: number,
): string[] {
  const last = base.at.length - 1;
  const b = base.at[last] as ScenarioAtDate;
  const s = scenario.at[last] as ScenarioAtDate;
  const line = formatAmount(threshold, currency);
  const when = formatDate(b.date);
  let chance: string;
  if (b.pCrossed === s.pCrossed) {
    chance = `stays at ${formatPercent(b.pCrossed)}`;
  } else if (withinNoise(b.pCrossed, baseResult.paths, s.pCrossed, result.paths)) {
    chance = `stays about the same (${formatPercent(b.pCrossed)} against ${formatPercent(s.pCrossed)}, within simulation noise)`;
  } else {
    chance = `${s.pCrossed > b.pCrossed ? 'rises' : 'falls'} from ${formatPercent(b.pCrossed)} to ${formatPercent(s.pCrossed)}`;
  }
  const diff = s.p50 - b.p50;
  const median =
    Math.abs(diff) < 0.5
      ? 'the median balance on that date is unchanged'
      : `the median balance on that date is ${formatAmount(Math.abs(diff), currency)} ${diff < 0 ? 'lower' : 'higher'}`;
  const sentences = [
    `With "${scenario.name}" the estimated chance of going below ${line} by ${when} ${chance}; ${median}.`,
  ];
  // A change that is over by the last date (a payment that comes late but comes) shows at
  // an earlier date: name the largest one.
  let k = last;
  for (let i = 0; i < last; i++) {
    const d = Math.abs((scenario.at[i] as ScenarioAtDate).p50 - (base.at[i] as ScenarioAtDate).p50);
    if (d > Math.abs((scenario.at[k] as ScenarioAtDate).p50 - (base.at[k] as ScenarioAtDate).p50) + 0.5) k = i;
  }
  if (k !== last) {
    const d = (scenario.at[k] as ScenarioAtDate).p50 - (base.at[k] as ScenarioAtDate).p50;
    sentences.push(
      `The largest change of the median balance among the compared dates is on ${formatDate((base.at[k] as ScenarioAtDate).date)}: ${formatAmount(Math.abs(d), currency)} ${d < 0 ? 'lower' : 'higher'}.`,
    );
  }
  const rb = base.runway.p10;
  const rs = scenario.runway.p10;
  if (rb.days !== rs.days) {
    sentences.push(
      `The time by which 10% of the simulated paths have fallen below ${line} moves from ${runwayText(rb)} to ${runwayText(rs)}.`,
    );
  }
  return sentences;
}

/**
 * @throws EngineError INVALID_ARGUMENT for more than four scenarios, empty or repeated
 *   names, results that differ in as-of date, currency, threshold or horizon, or
 *   comparison dates outside the horizon.
 * @example
 * compareScenarios(base.result, [{ name: 'Late commission payment', result: late.result }]).differences[0].sentences[0]
 *   // 'With "Late commission payment" the estimated chance of going below 0.00 EUR by 29 Jan 2027 rises from 4% to 19%; …'
 */
export function compareScenarios(
  base: ForecastResult,
  scenarios: readonly NamedResult[],
  options: CompareOptions = {},
): ScenarioComparison {
  if (scenarios.length > MAX_SCENARIOS) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `at most ${MAX_SCENARIOS} scenarios can be compared at once, got ${scenarios.length}`,
    );
  }
  const baseName = options.baseName ?? 'Base forecast';
  const names = new Set<string>([baseName]);
  for (const s of scenarios) {
    if (!s.name.trim()) throw new EngineError('INVALID_ARGUMENT', 'every scenario needs a name');
    if (names.has(s.name)) throw new EngineError('INVALID_ARGUMENT', `two columns are named "${s.name}"`);
    names.add(s.name);
    const r = s.result;
    const mismatch =
      r.asOf !== base.asOf
        ? `as-of date ${r.asOf} (base ${base.asOf})`
        : r.currency !== base.currency
          ? `currency ${r.currency} (base ${base.currency})`
          : r.threshold !== base.threshold
            ? 'threshold'
            : r.horizonDays !== base.horizonDays
              ? `horizon ${r.horizonDays} days (base ${base.horizonDays})`
              : null;
    if (mismatch) {
      throw new EngineError('INVALID_ARGUMENT', `scenario "${s.name}" differs from the base in its ${mismatch}`);
    }
  }
  const dates = [...(options.dates ?? defaultDates(base.asOf, base.horizonDays))].sort();
  if (dates.length === 0) throw new EngineError('INVALID_ARGUMENT', 'at least one comparison date is needed');
  for (const date of dates) {
    const d = daysBetween(base.asOf, date);
    if (!(d >= 1 && d <= base.horizonDays)) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        `comparison date ${date} is outside the forecast (${addDays(base.asOf, 1)} to ${addDays(base.asOf, base.horizonDays)})`,
      );
    }
  }
  const baseColumn = column(baseName, true, base, dates);
  const columns = [baseColumn, ...scenarios.map((s) => column(s.name, false, s.result, dates))];
  const differences = scenarios.map((s, i) => {
    const col = columns[i + 1] as ScenarioColumn;
    return {
      name: s.name,
      pCrossedChange: col.at.map((a, k) => a.pCrossed - (baseColumn.at[k] as ScenarioAtDate).pCrossed),
      medianChange: col.at.map((a, k) => a.p50 - (baseColumn.at[k] as ScenarioAtDate).p50),
      sentences: sentencesFor(baseColumn, col, base, s.result, base.currency, base.threshold),
    };
  });
  return {
    asOf: base.asOf,
    currency: base.currency,
    threshold: base.threshold,
    horizonDays: base.horizonDays,
    dates,
    columns,
    differences,
    caution: CAUTION,
  };
}
