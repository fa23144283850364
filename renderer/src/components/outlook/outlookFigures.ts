/**
 * The Outlook's words and tables, computed from a forecast result: weekly rows for the
 * table view, the first-crossing range in words, the headline chance with its Monte Carlo
 * error, the recent actual balances and the model summary. Pure functions (no DOM, no
 * Svelte), so they are unit-tested in Node.
 *
 * Wording: estimates, never promises — "estimated chance", "likely range", "if it happens".
 */
import type { DirectionReport } from '../../../../engine/forecast/residualFlows';
import type { ForecastHistory } from '../../../../engine/forecast/history';
import type { DailyOutlook, ForecastResult } from '../../../../engine/forecast/runForecast';
import { addDays, toDayNumber } from '../../../../engine/core/dates';
import { formatDay } from '../../lib/charts/calendar';
import { Q, type BalancePoint } from '../../lib/charts/fanChartConfig';
import { moneyText } from '../../lib/charts/moneyText';
import { percentText } from '../../lib/charts/percentText';

/**
 * One row of the table view: the balance distribution at the end of a week, at the
 * quantiles the fan chart draws (its P5–P95 and P25–P75 bands and the median).
 */
export interface WeeklyRow {
  readonly date: string;
  readonly p5: number;
  readonly p25: number;
  readonly p50: number;
  readonly p75: number;
  readonly p95: number;
  /** Chance of being below the threshold on that date. */
  readonly pBelow: number;
  /** Chance of having gone below by that date. */
  readonly pCrossed: number;
}

/**
 * Weekly rows from daily outlooks: the 7th, 14th, … forecast day, and the last day when
 * the horizon is not a whole number of weeks. Quantiles are those of that day — a week's
 * quantiles cannot be averaged from its days' quantiles.
 * @example weeklyRows(result.daily).length // 13 for a 90-day horizon (12 weeks + day 90)
 */
export function weeklyRows(daily: readonly DailyOutlook[]): WeeklyRow[] {
  const rows: WeeklyRow[] = [];
  const row = (d: DailyOutlook): WeeklyRow => ({
    date: d.date,
    p5: d.quantiles[Q.p5] as number,
    p25: d.quantiles[Q.p25] as number,
    p50: d.quantiles[Q.p50] as number,
    p75: d.quantiles[Q.p75] as number,
    p95: d.quantiles[Q.p95] as number,
    pBelow: d.pBelow,
    pCrossed: d.pCrossed,
  });
  for (let i = 6; i < daily.length; i += 7) rows.push(row(daily[i] as DailyOutlook));
  if (daily.length > 0 && daily.length % 7 !== 0) rows.push(row(daily[daily.length - 1] as DailyOutlook));
  return rows;
}

/** Fewest crossing paths for a first-crossing range in words (fewer make the dates noise). */
export const MIN_CROSSING_PATHS = 30;
/** Smallest shortfall probability for which the range is stated. */
export const MIN_RANGE_PROBABILITY = 0.01;

export interface CrossingRange {
  /** Dates by which 10%, 50% and 90% of the paths that do go below have gone below. */
  readonly from: string;
  readonly median: string;
  readonly to: string;
}

/**
 * When a shortfall, if it happens, most likely first happens: the 10th, 50th and 90th
 * percentiles of the first day below the threshold among the paths that go below. pCrossed
 * is the cumulative share of paths that have gone below by each day, so among crossing
 * paths the share by day d is pCrossed[d] / pCrossed[last]. (The engine's firstCrossing
 * quantiles count all paths, so they are null whenever fewer than 10% cross.)
 *
 * @returns null when too few paths go below for the dates to mean something (below
 *   MIN_RANGE_PROBABILITY or MIN_CROSSING_PATHS paths).
 * @example firstCrossingRange(result.daily, result.paths) // { from: '2027-01-12', median: …, to: '2027-03-03' }
 */
export function firstCrossingRange(daily: readonly DailyOutlook[], paths: number): CrossingRange | null {
  const last = daily[daily.length - 1];
  if (!last) return null;
  const total = last.pCrossed;
  if (total < MIN_RANGE_PROBABILITY || total * paths < MIN_CROSSING_PATHS) return null;
  const at = (share: number): string => {
    // A small tolerance: pCrossed is a count divided by the paths, share · total may round.
    const target = share * total - 1e-12;
    for (const d of daily) if (d.pCrossed >= target) return d.date;
    return last.date;
  };
  return { from: at(0.1), median: at(0.5), to: at(0.9) };
}

/** Two dates in words, with the year only where it is needed (a different year from the as-of date, or a range across years). */
function rangeDates(from: string, to: string, asOf: string): [string, string] {
  const sameYear = from.slice(0, 4) === to.slice(0, 4) && from.slice(0, 4) === asOf.slice(0, 4);
  const pattern = sameYear ? 'd MMM' : 'd MMM yyyy';
  return [formatDay(from, pattern), formatDay(to, pattern)];
}

/**
 * The first-crossing range in words, or null when there is nothing meaningful to say.
 * @example firstCrossingSentence(range, '2026-10-31') // 'If it happens, most likely between 12 Jan 2027 and 3 Mar 2027.'
 */
export function firstCrossingSentence(range: CrossingRange | null, asOf: string): string | null {
  if (!range) return null;
  if (range.from === range.to) {
    return `If it happens, most likely on ${formatDay(range.from, range.from.slice(0, 4) === asOf.slice(0, 4) ? 'd MMM' : 'd MMM yyyy')}.`;
  }
  const [from, to] = rangeDates(range.from, range.to, asOf);
  return `If it happens, most likely between ${from} and ${to}.`;
}

export interface ShortfallHeadline {
  /** The big figure, e.g. '4.2%' or '< 0.1%'. */
  readonly figure: string;
  /** The Monte Carlo error, e.g. '± 0.3 percentage points', or null when no path went below. */
  readonly error: string | null;
  /** One calm sentence under the figure. */
  readonly caption: string;
}

/**
 * The headline: the estimated chance of going below the threshold at least once within
 * the horizon, with its Monte Carlo standard error √(p(1−p)/N) (Koehler, Brown and
 * Haneuse 2009). When no path goes below, the figure is an upper bound by the rule of three
 * (3/N, about 95% confidence; Hanley and Lippman-Hand 1983), not a reassuring "0%".
 */
export function shortfallHeadline(
  probability: number,
  standardError: number,
  paths: number,
  horizonDays: number,
  threshold: number,
  currency: string,
): ShortfallHeadline {
  const below = moneyText(threshold, currency);
  const pathsText = paths.toLocaleString('en');
  if (probability === 0) {
    const bound = Math.max(0.1, Math.ceil((300 / paths) * 10) / 10);
    return {
      figure: `< ${bound.toFixed(1)}%`,
      error: null,
      caption: `None of the ${pathsText} simulated paths went below ${below} within the next ${horizonDays} days.`,
    };
  }
  const points = standardError * 100;
  return {
    figure: percentText(probability),
    error: points < 0.05 ? '± < 0.1 percentage points' : `± ${points.toFixed(1)} percentage points`,
    caption: `Estimated chance that the balance goes below ${below} at least once within the next ${horizonDays} days (${pathsText} simulated paths).`,
  };
}

/**
 * Actual end-of-day balances for the last `days` days up to the as-of date, rebuilt
 * backwards from the as-of balance: the balance at the end of day d is the as-of balance
 * minus every entry booked after d.
 * @example recentBalances(history, 60).at(-1) // { date: history.asOf, balance: history.endBalance }
 * Complexity: O(days + entries in those days); `history.entries` must be by date, as
 * ForecastHistory promises.
 */
export function recentBalances(history: ForecastHistory, days: number): BalancePoint[] {
  const end = toDayNumber(history.asOf);
  const first = Math.max(toDayNumber(history.start), end - days + 1);
  const count = end - first + 1;
  if (count <= 0) return [];
  // net[i]: sum of entries on day first + i. Entries are by date, so only the last ones
  // are read (YYYY-MM-DD compares as text): a history of 100,000 entries costs its last weeks.
  const net = new Float64Array(count);
  const firstDate = addDays(history.asOf, 1 - count);
  const entries = history.entries;
  for (let k = entries.length - 1; k >= 0; k--) {
    const e = entries[k] as (typeof entries)[number];
    if (e.date < firstDate) break;
    const i = toDayNumber(e.date) - first;
    if (i >= 0 && i < count) net[i] = (net[i] as number) + e.amount;
  }
  const points: BalancePoint[] = new Array(count);
  let balance = history.endBalance;
  for (let i = count - 1; i >= 0; i--) {
    points[i] = { date: addDays(history.asOf, i - count + 1), balance };
    balance -= net[i] as number;
  }
  return points;
}

/**
 * The method and the fitted model in one phrase, without saying the same name twice:
 * 'Decomposition + ETS (ETS(A,N,N) on the seasonally adjusted series)', but 'Croston SBA
 * (α = 0.10)' rather than 'Croston (SBA) (Croston SBA (α = 0.10))'.
 */
function methodText(report: DirectionReport): string {
  const first = report.method.split(/[\s(]/)[0]?.toLowerCase() ?? '';
  if (first && report.model.toLowerCase().startsWith(first)) {
    return report.model.charAt(0).toUpperCase() + report.model.slice(1);
  }
  return `${report.method} (${report.model})`;
}

function directionSentence(report: DirectionReport, currency: string): string {
  const name = report.direction === 'inflow' ? 'Other money in' : 'Other money out';
  if (report.treatment === 'none') return `${name}: nothing is left besides the recurring flows, so none is projected.`;
  const winner = report.backtest?.candidates.find((c) => c.name === report.method);
  let text = `${name} is projected with ${methodText(report)}`;
  if (report.backtest && winner) {
    const origins = report.backtest.origins.length;
    const parts: string[] = [];
    if (winner.mase !== null) parts.push(`MASE ${winner.mase.toFixed(2)}`);
    if (winner.pinball) parts.push(`pinball loss ${moneyText(winner.pinball.mean, currency)} a day`);
    if (winner.coverage80 !== null && winner.coverage90 !== null) {
      parts.push(
        `${percentText(winner.coverage80)} of actual days inside the 80% range and ${percentText(winner.coverage90)} inside the 90% range`,
      );
    }
    const n = report.backtest.candidates.length;
    text += `, chosen from ${n} method${n === 1 ? '' : 's'} by a backtest on ${origins} past periods of ${report.backtest.horizon} days`;
    if (parts.length) text += ` (${parts.join(', ')})`;
  } else {
    text += ', without a backtest';
  }
  text += '.';
  if (report.residualCheck) text += ` ${report.residualCheck}`;
  return text;
}

/**
 * The model summary in one plain paragraph: how the recurring flows and the rest are
 * projected, the backtest scores of the chosen methods, and the check of what is left.
 */
export function modelSummary(result: ForecastResult): string {
  const n = result.recurring.length;
  const recurring =
    n === 0
      ? 'No recurring flow is projected on its own schedule.'
      : `${n} recurring ${n === 1 ? 'flow is' : 'flows are'} projected on ${n === 1 ? 'its' : 'their'} own schedule${n === 1 ? '' : 's'}, with the amount and timing spread seen in the statements.`;
  return [
    recurring,
    directionSentence(result.model.inflow, result.currency),
    directionSentence(result.model.outflow, result.currency),
    `The balance is simulated along ${result.paths.toLocaleString('en')} paths (seed ${result.seed}).`,
  ].join(' ');
}

/** Drivers smaller than this share of the largest one are left out as noise. */
export const MIN_DRIVER_SHARE = 0.05;

/**
 * The drivers worth naming: those at least MIN_DRIVER_SHARE of the largest one (a flow
 * that differs by EUR 0.10 between the two groups of paths does not push anything).
 * @returns the drivers kept, in the engine's order, and how many were left out.
 */
export function notableDrivers<T extends { readonly amount: number }>(
  drivers: readonly T[],
): { shown: T[]; hidden: number } {
  const largest = drivers.reduce((m, d) => Math.max(m, Math.abs(d.amount)), 0);
  const shown = drivers.filter((d) => Math.abs(d.amount) >= MIN_DRIVER_SHARE * largest && d.amount !== 0);
  return { shown, hidden: drivers.length - shown.length };
}

/**
 * A driver of the shortfall in words.
 * @example driverText(-80000, 'EUR') // 'EUR 800.00 less on the paths that go below'
 */
export function driverText(amount: number, currency: string): string {
  const size = moneyText(Math.abs(amount), currency);
  return amount < 0 ? `${size} less on the paths that go below` : `${size} more on the paths that go below`;
}
