/**
 * The 13-week cash view: weekly buckets of expected receipts and payments rolled forward a
 * quarter, with the closing balance of each week (expected, and the P10 / P50 / P90 band
 * of the simulated paths). Common practice, no single source: the ending balance of a week
 * is its opening balance plus its net flow, and each week opens with the last one's close.
 *
 * Buckets are 7-day weeks counted from the as-of date (week 1 = the 7 days after it), not
 * calendar (Monday-based) weeks: every bucket is then a full week whatever weekday the
 * statements end on, the 13 weeks are exactly the first 91 forecast days, and "week n"
 * means the same here as in the runway ("n weeks from the as-of date"). Only whole weeks
 * inside the horizon are shown: a horizon under 91 days gives fewer rows, flagged by
 * `complete: false`.
 *
 * Expected inflow, outflow and net come from the components' exact expectations
 * (engine/runway/expectedDailyFlows.ts) when the components are given, and the expected
 * closing balance is then opening + net exactly; the bands always come from the simulated
 * daily quantiles. Without components, only the net is known: the difference of the
 * simulated mean balances (inflow and outflow are null).
 */
import { CAUTION } from '../core/caution';
import { EngineError } from '../core/errors';
import type { CalendarDate } from '../core/dates';
import type { ForecastResult } from '../forecast/runForecast';
import { QUANTILE_LEVELS, type FlowComponent } from '../simulate/types';
import { expectedDailyFlows } from './expectedDailyFlows';

/** Weeks in the view. */
export const VIEW_WEEKS = 13;

const P10 = QUANTILE_LEVELS.indexOf(0.1);
const P50 = QUANTILE_LEVELS.indexOf(0.5);
const P90 = QUANTILE_LEVELS.indexOf(0.9);

/** One week of the view; amounts in minor units (fractional: they are expectations). */
export interface CashWeek {
  /** 1 = the 7 days after the as-of date. */
  readonly week: number;
  readonly from: CalendarDate;
  readonly to: CalendarDate;
  /** Expected receipts of the week; null when the components were not given. */
  readonly expectedInflow: number | null;
  /** Expected payments of the week as a magnitude; null when the components were not given. */
  readonly expectedOutflow: number | null;
  /** Expected net flow: inflow − outflow. */
  readonly expectedNet: number;
  /** Expected balance at the start of the week (the previous week's expected close). */
  readonly openingBalance: number;
  /** Expected balance at the end of the week's last day: opening + net. */
  readonly closingBalance: number;
  /** Simulated closing balance band on the week's last day. */
  readonly closing: { readonly p10: number; readonly p50: number; readonly p90: number };
  /** Share of paths below the threshold at the end of the week. */
  readonly pBelowAtClose: number;
  /** Share of paths that have been below the threshold on any day up to the week's end. */
  readonly pCrossedByClose: number;
}

export interface ThirteenWeekView {
  readonly asOf: CalendarDate;
  readonly currency: string;
  readonly threshold: number;
  readonly startBalance: number;
  readonly bucketing: 'as-of 7-day weeks';
  /** How the expected flows were obtained. */
  readonly expectedFrom: 'components' | 'simulated mean';
  readonly weeks: readonly CashWeek[];
  /** False when the horizon holds fewer than 13 whole weeks. */
  readonly complete: boolean;
  readonly caution: string;
}

/**
 * @param components the simulated components of the same forecast (ScenarioRun.components);
 *   without them the view has no inflow/outflow split.
 * @param weeks how many weeks (default 13); fewer when the horizon is shorter.
 * @throws EngineError INVALID_ARGUMENT for a week count that is not a whole number ≥ 1.
 * @example thirteenWeekView(run.result, run.components).weeks[0].closing.p50
 * Complexity: O(horizon · components) with components, O(horizon) without.
 */
export function thirteenWeekView(
  result: ForecastResult,
  components?: readonly FlowComponent[],
  weeks = VIEW_WEEKS,
): ThirteenWeekView {
  if (!Number.isInteger(weeks) || weeks < 1) {
    throw new EngineError('INVALID_ARGUMENT', `weeks must be a whole number ≥ 1, got ${weeks}`);
  }
  const h = result.daily.length;
  const count = Math.min(weeks, Math.floor(h / 7));
  const expected = components ? expectedDailyFlows(components, h) : null;
  const rows: CashWeek[] = [];
  let opening = result.startBalance;
  for (let w = 0; w < count; w++) {
    const firstDay = 7 * w;
    const lastDay = firstDay + 6;
    const close = result.daily[lastDay] as ForecastResult['daily'][number];
    let inflow: number | null = null;
    let outflow: number | null = null;
    let net: number;
    if (expected) {
      inflow = 0;
      outflow = 0;
      for (let d = firstDay; d <= lastDay; d++) {
        inflow += expected.inflow[d] as number;
        outflow += expected.outflow[d] as number;
      }
      net = inflow - outflow;
    } else {
      net = close.mean - opening;
    }
    const closing = expected ? opening + net : close.mean;
    rows.push({
      week: w + 1,
      from: (result.daily[firstDay] as ForecastResult['daily'][number]).date,
      to: close.date,
      expectedInflow: inflow,
      expectedOutflow: outflow,
      expectedNet: net,
      openingBalance: opening,
      closingBalance: closing,
      closing: {
        p10: close.quantiles[P10] as number,
        p50: close.quantiles[P50] as number,
        p90: close.quantiles[P90] as number,
      },
      pBelowAtClose: close.pBelow,
      pCrossedByClose: close.pCrossed,
    });
    opening = closing;
  }
  return {
    asOf: result.asOf,
    currency: result.currency,
    threshold: result.threshold,
    startBalance: result.startBalance,
    bucketing: 'as-of 7-day weeks',
    expectedFrom: expected ? 'components' : 'simulated mean',
    weeks: rows,
    complete: count === weeks,
    caution: CAUTION,
  };
}
