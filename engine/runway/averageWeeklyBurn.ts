/**
 * The plain "current burn": the mean net outflow per week over the last 13 weeks of
 * history (91 days ending on the as-of date), the figure people divide the balance by.
 * It is a description of the past, shown beside the simulated runway for comparison.
 */
import { addDays, daysBetween, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import type { ForecastHistory } from '../forecast/history';

/** Weeks of history the burn averages over by default. */
export const BURN_WEEKS = 13;

export interface WeeklyBurn {
  /** Whole weeks averaged (13, or fewer when the history is shorter). */
  readonly weeks: number;
  /** First and last day of the window (the last is the as-of date). */
  readonly from: CalendarDate;
  readonly to: CalendarDate;
  /** True when the full number of weeks asked for was available. */
  readonly complete: boolean;
  /** Totals over the window, minor units: inflow ≥ 0, outflow ≥ 0 (a magnitude). */
  readonly inflow: number;
  readonly outflow: number;
  /** Mean net flow per week (inflow − outflow) / weeks. */
  readonly netPerWeek: number;
  /** Mean net outflow per week: −netPerWeek; positive when the account is burning cash. */
  readonly burnPerWeek: number;
}

/**
 * @param weeks how many weeks back from the as-of date (default 13).
 * @throws EngineError NOT_ENOUGH_DATA when the history covers less than one week;
 *   INVALID_ARGUMENT for a week count that is not a whole number ≥ 1.
 * @example averageWeeklyBurn(history).burnPerWeek // 41250.5 (412.51 EUR a week)
 */
export function averageWeeklyBurn(
  history: Pick<ForecastHistory, 'start' | 'asOf' | 'entries'>,
  weeks = BURN_WEEKS,
): WeeklyBurn {
  if (!Number.isInteger(weeks) || weeks < 1) {
    throw new EngineError('INVALID_ARGUMENT', `weeks must be a whole number ≥ 1, got ${weeks}`);
  }
  const available = Math.floor((daysBetween(history.start, history.asOf) + 1) / 7);
  if (available < 1) {
    throw new EngineError('NOT_ENOUGH_DATA', 'the average weekly burn needs at least one full week of history');
  }
  const used = Math.min(weeks, available);
  const from = addDays(history.asOf, -(7 * used - 1));
  let inflow = 0;
  let outflow = 0;
  for (const e of history.entries) {
    if (e.date < from || e.date > history.asOf) continue;
    if (e.amount > 0) inflow += e.amount;
    else outflow -= e.amount;
  }
  const netPerWeek = (inflow - outflow) / used;
  return {
    weeks: used,
    from,
    to: history.asOf,
    complete: used === weeks,
    inflow,
    outflow,
    netPerWeek,
    burnPerWeek: netPerWeek === 0 ? 0 : -netPerWeek,
  };
}
