/**
 * Runway as a distribution: how many weeks after the as-of date the balance first falls
 * below the threshold, read from the share of simulated paths that have crossed by each
 * day. Paths that never cross within the horizon count as "beyond the horizon", so a
 * quantile exists only when at least that share of ALL paths crosses; otherwise it is
 * reported as beyond the horizon, never as a made-up number. This is the same definition
 * as the forecast's first-crossing range (engine/simulate/summariseBalances.ts).
 */
import { addDays, isCalendarDate, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';

/** One quantile of the first-crossing time. */
export interface RunwayQuantile {
  /** Share of all paths that have crossed by then (0.1, 0.5, 0.9). */
  readonly level: number;
  /** Days from the as-of date to the crossing day (1 = the first forecast day); null when beyond the horizon. */
  readonly days: number | null;
  /** `days / 7`, unrounded; null when beyond the horizon. */
  readonly weeks: number | null;
  readonly date: CalendarDate | null;
  /** True when fewer than `level` of the paths cross within the horizon. */
  readonly beyondHorizon: boolean;
}

/** The simulated runway: first-crossing quantiles in days and weeks from the as-of date. */
export interface CrossingRunway {
  readonly asOf: CalendarDate;
  readonly horizonDays: number;
  readonly horizonWeeks: number;
  /** Threshold in minor units. */
  readonly threshold: number;
  readonly paths: number;
  /** Share of paths that fall below the threshold within the horizon. */
  readonly shareCrossing: number;
  /** Monte Carlo standard error of that share, √(p(1−p)/N). */
  readonly standardError: number;
  readonly p10: RunwayQuantile;
  readonly p50: RunwayQuantile;
  readonly p90: RunwayQuantile;
}

/**
 * Runway from the cumulative crossed shares (`pCrossed`) of a forecast's days.
 *
 * @param pCrossed share of paths below the threshold on any day up to day d (index 0 = the
 *   first forecast day); non-decreasing, in [0, 1].
 * @param paths how many paths the shares come from (for the standard error).
 * @throws EngineError INVALID_ARGUMENT for an empty or decreasing series, shares outside
 *   [0, 1] or fewer than one path; INVALID_DATE for a malformed as-of date.
 * @example runwayFromCrossedShares([0, 0.2, 0.6], '2026-10-31', 0, 1000).p50.days // 3
 */
export function runwayFromCrossedShares(
  pCrossed: ArrayLike<number>,
  asOf: CalendarDate,
  threshold: number,
  paths: number,
): CrossingRunway {
  const h = pCrossed.length;
  if (!isCalendarDate(asOf)) throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${asOf}"`);
  if (h === 0) throw new EngineError('INVALID_ARGUMENT', 'runway needs at least one forecast day');
  if (!Number.isInteger(paths) || paths < 1)
    throw new EngineError('INVALID_ARGUMENT', `paths must be ≥ 1, got ${paths}`);
  let previous = 0;
  for (let d = 0; d < h; d++) {
    const p = pCrossed[d] as number;
    if (!(p >= 0 && p <= 1) || p < previous) {
      throw new EngineError('INVALID_ARGUMENT', `crossed shares must be non-decreasing in [0, 1]; day ${d} has ${p}`);
    }
    previous = p;
  }
  const quantile = (level: number): RunwayQuantile => {
    for (let d = 0; d < h; d++) {
      if ((pCrossed[d] as number) >= level) {
        return { level, days: d + 1, weeks: (d + 1) / 7, date: addDays(asOf, d + 1), beyondHorizon: false };
      }
    }
    return { level, days: null, weeks: null, date: null, beyondHorizon: true };
  };
  const share = pCrossed[h - 1] as number;
  return {
    asOf,
    horizonDays: h,
    horizonWeeks: h / 7,
    threshold,
    paths,
    shareCrossing: share,
    standardError: Math.sqrt((share * (1 - share)) / paths),
    p10: quantile(0.1),
    p50: quantile(0.5),
    p90: quantile(0.9),
  };
}
