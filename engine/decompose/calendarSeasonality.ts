/**
 * Calendar-monthly seasonality: the part of a daily cash-flow series that repeats by day of
 * the calendar month (rent on the 1st, a card bill on the 15th, pay on the last day or the
 * last business day). Months are 28 to 31 days long, so this is not a fixed-period
 * seasonal and is not estimated by STL; it is a regression on calendar indicators.
 *
 * Buckets. Every date belongs to exactly one of 31 day buckets:
 * - "day d" for d = 1 … 30 when d is not the last day of its month;
 * - "month end" for the last calendar day of the month (the 31st, the 30th of April, June,
 *   September and November, the 28th of February, or the 29th in a leap year).
 * So the 31st is always a month end, and 28 February is a month end in common years but
 * "day 28" in leap years. Optionally, a last-business-day indicator is added on the last
 * Monday–Friday of each month (no public holidays are known to the engine; where the month
 * ends on a weekday it is the same day as the month end, otherwise the Friday before).
 *
 * Effect of a date: e(t) = β[bucket(t)] + γ · [t is the last business day].
 *
 * Centring. The component of a date is its effect minus the mean effect over all days of
 * its calendar month: c(t) = e(t) − (1/D) Σ_{s in month(t)} e(s), D = days in that month.
 * It therefore sums to zero over every calendar month, of any length, and the level of the
 * series stays with the trend.
 *
 * Estimation (regularised regression). The input r (a series already detrended and
 * weekly-deseasonalised) is regressed on an intercept and the centred indicators
 * x_b(t) = 1[bucket(t) = b] − (days of month(t) in bucket b) / D (and likewise for the
 * last-business-day indicator), by least squares with a ridge penalty λ·Σβ² + λ·γ² on the
 * effects (not the intercept):
 *     minimise Σ_t (r_t − μ − Σ_b β_b x_b(t) − γ z(t))² + λ (Σ_b β_b² + γ²).
 * λ acts as that many pseudo-observations at zero per effect. It makes the system positive
 * definite (the centred indicators sum to zero, so without a penalty the effects are
 * determined only up to a constant; the penalty picks effects that sum to zero) and keeps
 * rare buckets (days 29 and 30 occur in fewer months; short histories) from chasing noise.
 * By default λ is chosen by empirical Bayes (a random-effects view of ridge): a pilot fit
 * with λ = 0.001 gives the noise variance σ² = RSS / (n − p) and the effects' spread beyond
 * sampling noise τ² = mean(β̂²) − σ² · mean(1 / n_b) over observed buckets (n_b = days in
 * bucket b), and λ = σ² / τ², clamped to [0.001, 1e6]; when τ² ≤ 0 (no calendar pattern
 * beyond noise) λ = 1e6 and the component is essentially zero. Least squares (means) rather than a robust fit on purpose: cash-flow spikes on a
 * calendar day are the signal, and the expected flow is what a forecast needs; a robust fit
 * would erase a rent payment that occasionally moves by a day.
 *
 * Projection to any date uses the same rule: bucket from the calendar (engine/core/dates),
 * effect, minus the mean effect over that date's month. The in-sample component is the
 * projection over the fitted dates.
 */
import { EngineError } from '../core/errors';
import { civilFromDays, daysFromCivil, daysInMonth, isoWeekday, toDayNumber, type CalendarDate } from '../core/dates';
import { solveSymmetricPositiveDefinite } from './solveSymmetricPositiveDefinite';

/** Number of day buckets: days 1–30 (when not the last day) and the month end. */
export const CALENDAR_DAY_BUCKETS = 31;

/** Index of the month-end bucket in {@link CalendarMonthlyFit.dayEffects}. */
export const MONTH_END_BUCKET = 30;

/** Penalty of the pilot fit: just enough to fix the effects' free constant. */
const PILOT_SHRINKAGE = 1e-3;
/** Penalty used when the effects are indistinguishable from noise (they shrink to about zero). */
const MAX_SHRINKAGE = 1e6;

/** Options of {@link fitCalendarMonthly}. */
export interface CalendarMonthlyOptions {
  /** Estimate a last-business-day (last Monday–Friday) effect on top of the day buckets. Default true. */
  readonly lastBusinessDay?: boolean;
  /**
   * Ridge penalty λ > 0 in pseudo-observations at zero per effect, or `'auto'` (default):
   * λ = σ²/τ² estimated from the data (see the module comment).
   */
  readonly shrinkage?: number | 'auto';
}

/** A fitted calendar-monthly profile. Plain data: it may cross the worker boundary. */
export interface CalendarMonthlyFit {
  /**
   * Effects β, length 31: index d − 1 is "day d, not the last day of the month"
   * (d = 1 … 30), index {@link MONTH_END_BUCKET} is the month end. Uncentred: the
   * component of a date subtracts its month's mean effect.
   */
  readonly dayEffects: Float64Array;
  /** γ, the last-business-day effect (0 when not estimated). */
  readonly lastBusinessDayEffect: number;
  readonly lastBusinessDayEstimated: boolean;
  /** μ, the mean level of the input beyond the effects (not part of the component). */
  readonly intercept: number;
  /** The penalty λ used (estimated when the option was 'auto'). */
  readonly shrinkage: number;
  /** How many input days fell in each bucket (same indexing as dayEffects). */
  readonly bucketCounts: Int32Array;
  /** How many last business days the input held. */
  readonly lastBusinessDayCount: number;
  /** The centred component over the input days. */
  readonly component: Float64Array;
  readonly startDate: CalendarDate;
}

/**
 * Fits the calendar-monthly profile (day-of-month buckets, month end, optionally last
 * business day) to a detrended, weekly-deseasonalised daily series by ridge-regularised
 * least squares; see the module comment for the exact model and centring.
 *
 * Source: the bucket model is Ebbline's own (regression on calendar indicators, as in
 * trading-day and moving-holiday regressors of X-13ARIMA-SEATS, U.S. Census Bureau); the
 * estimator is ridge regression (Hoerl and Kennard 1970, Technometrics 12(1), 55–67).
 *
 * Complexity: O(n + months · p²) to build the normal equations and O(p³) to solve them,
 * p = 32 or 33; O(n) memory.
 *
 * @param y daily values on consecutive calendar days from `startDate`, finite, at least 28; never mutated.
 * @param startDate the calendar date of y[0] (`YYYY-MM-DD`).
 * @param options last-business-day effect and shrinkage.
 * @returns the effects, intercept, counts and the centred in-sample component.
 * @throws EngineError NOT_ENOUGH_DATA when y has fewer than 28 values.
 * @throws EngineError INVALID_ARGUMENT for a non-finite value or shrinkage ≤ 0.
 * @throws EngineError INVALID_DATE when startDate is not a calendar date.
 * @example
 * const fit = fitCalendarMonthly(residual, '2023-01-01');
 * fit.dayEffects[0]; // effect of the 1st
 * fit.dayEffects[MONTH_END_BUCKET]; // effect of the last day of the month
 */
export function fitCalendarMonthly(
  y: ArrayLike<number>,
  startDate: CalendarDate,
  options: CalendarMonthlyOptions = {},
): CalendarMonthlyFit {
  const n = y.length;
  const start = toDayNumber(startDate);
  if (n < 28) {
    throw new EngineError('NOT_ENOUGH_DATA', `calendar-monthly seasonality needs at least 28 days, got ${n}`);
  }
  const lambdaOption = options.shrinkage ?? 'auto';
  if (lambdaOption !== 'auto' && !(Number.isFinite(lambdaOption) && lambdaOption > 0)) {
    throw new EngineError('INVALID_ARGUMENT', `calendar-monthly shrinkage must be positive, got ${lambdaOption}`);
  }
  const withLbd = options.lastBusinessDay ?? true;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(y[i] as number)) {
      throw new EngineError('INVALID_ARGUMENT', `calendar-monthly input must be finite; value ${i} is ${y[i]}`);
    }
  }

  // Parameters: [μ, β_0 … β_30, γ?]; the row of a date is u − g, where u holds its 0/1
  // indicators and g the month's bucket shares (see the module comment).
  const p = 1 + CALENDAR_DAY_BUCKETS + (withLbd ? 1 : 0);
  const lbdIndex = 1 + CALENDAR_DAY_BUCKETS;
  const ata = new Float64Array(p * p);
  const atr = new Float64Array(p);
  const monthCounts = new Float64Array(p);
  const share = new Float64Array(p);
  const bucketCounts = new Int32Array(CALENDAR_DAY_BUCKETS);
  let lastBusinessDayCount = 0;

  let i = 0;
  while (i < n) {
    const { year, month, day } = civilFromDays(start + i);
    const monthDays = daysInMonth(year, month);
    const lbd = lastBusinessDayOf(year, month, monthDays);
    monthCounts.fill(0);
    let count = 0;
    let sum = 0;
    for (let d = day; d <= monthDays && i < n; d++, i++) {
      const r = y[i] as number;
      const b = 1 + bucketOf(d, monthDays);
      bucketCounts[b - 1] = (bucketCounts[b - 1] as number) + 1;
      ata[0] = (ata[0] as number) + 1;
      ata[b] = (ata[b] as number) + 1;
      ata[b * p] = (ata[b * p] as number) + 1;
      ata[b * p + b] = (ata[b * p + b] as number) + 1;
      atr[0] = (atr[0] as number) + r;
      atr[b] = (atr[b] as number) + r;
      monthCounts[0] = (monthCounts[0] as number) + 1;
      monthCounts[b] = (monthCounts[b] as number) + 1;
      if (withLbd && d === lbd) {
        lastBusinessDayCount++;
        const q = lbdIndex;
        ata[q] = (ata[q] as number) + 1;
        ata[q * p] = (ata[q * p] as number) + 1;
        ata[q * p + b] = (ata[q * p + b] as number) + 1;
        ata[b * p + q] = (ata[b * p + q] as number) + 1;
        ata[q * p + q] = (ata[q * p + q] as number) + 1;
        atr[q] = (atr[q] as number) + r;
        monthCounts[q] = (monthCounts[q] as number) + 1;
      }
      count++;
      sum += r;
    }
    // Σ(u − g)(u − g)ᵀ = Σuuᵀ − U gᵀ − g Uᵀ + N g gᵀ and Σ(u − g) r = Σur − g R.
    share.fill(0);
    for (let d = 1; d <= monthDays; d++) share[1 + bucketOf(d, monthDays)] = 1 / monthDays;
    if (withLbd) share[lbdIndex] = 1 / monthDays;
    for (let a = 0; a < p; a++) {
      const ga = share[a] as number;
      const ua = monthCounts[a] as number;
      for (let b = 0; b < p; b++) {
        const gb = share[b] as number;
        if (ga === 0 && gb === 0) continue;
        ata[a * p + b] = (ata[a * p + b] as number) - ua * gb - ga * (monthCounts[b] as number) + count * ga * gb;
      }
      atr[a] = (atr[a] as number) - ga * sum;
    }
  }
  const solve = (penalty: number): Float64Array => {
    const penalised = ata.slice();
    for (let a = 1; a < p; a++) penalised[a * p + a] = (penalised[a * p + a] as number) + penalty;
    return solveSymmetricPositiveDefinite(penalised, atr);
  };
  const toFit = (theta: Float64Array, penalty: number): CalendarMonthlyFit => {
    const partial = {
      dayEffects: theta.slice(1, 1 + CALENDAR_DAY_BUCKETS),
      lastBusinessDayEffect: withLbd ? (theta[lbdIndex] as number) : 0,
    };
    return {
      ...partial,
      lastBusinessDayEstimated: withLbd,
      intercept: theta[0] as number,
      shrinkage: penalty,
      bucketCounts,
      lastBusinessDayCount,
      component: projectCalendarMonthly(partial, startDate, n),
      startDate,
    };
  };

  if (lambdaOption !== 'auto') return toFit(solve(lambdaOption), lambdaOption);

  // Empirical-Bayes penalty: a nearly unpenalised fit gives the noise variance σ² and the
  // spread τ² of the effects beyond their sampling noise; λ = σ² / τ².
  const pilot = toFit(solve(PILOT_SHRINKAGE), PILOT_SHRINKAGE);
  let rss = 0;
  for (let t = 0; t < n; t++) {
    const e = (y[t] as number) - pilot.intercept - (pilot.component[t] as number);
    rss += e * e;
  }
  const sigma2 = rss / Math.max(1, n - p);
  let sumSquares = 0;
  let sumInverseCounts = 0;
  let effects = 0;
  for (let b = 0; b < CALENDAR_DAY_BUCKETS; b++) {
    const c = bucketCounts[b] as number;
    if (c === 0) continue;
    sumSquares += (pilot.dayEffects[b] as number) ** 2;
    sumInverseCounts += 1 / c;
    effects++;
  }
  if (withLbd && lastBusinessDayCount > 0) {
    sumSquares += pilot.lastBusinessDayEffect ** 2;
    sumInverseCounts += 1 / lastBusinessDayCount;
    effects++;
  }
  const tau2 = (sumSquares - sigma2 * sumInverseCounts) / effects;
  const lambda = tau2 > 0 ? Math.min(MAX_SHRINKAGE, Math.max(PILOT_SHRINKAGE, sigma2 / tau2)) : MAX_SHRINKAGE;
  return toFit(solve(lambda), lambda);
}

/**
 * The calendar-monthly component of a fit on `days` consecutive calendar days from
 * `startDate` (in the past, over the fit, or in the future): each date's bucket effect plus
 * the last-business-day effect where it applies, minus the mean of those over all days of
 * its calendar month, so each full calendar month sums to zero.
 *
 * Complexity: O(days).
 *
 * @param fit a result of {@link fitCalendarMonthly}; never mutated.
 * @param startDate first date (`YYYY-MM-DD`).
 * @param days number of days, a non-negative integer.
 * @returns the component as a new Float64Array of length `days`.
 * @throws EngineError INVALID_DATE for a bad date; INVALID_ARGUMENT for a bad `days` or a
 *   fit whose effects are not 31 finite numbers.
 * @example
 * const next90 = projectCalendarMonthly(fit, '2026-04-01', 90);
 */
export function projectCalendarMonthly(
  fit: Pick<CalendarMonthlyFit, 'dayEffects' | 'lastBusinessDayEffect'>,
  startDate: CalendarDate,
  days: number,
): Float64Array {
  const start = toDayNumber(startDate);
  if (!Number.isInteger(days) || days < 0) {
    throw new EngineError('INVALID_ARGUMENT', `days must be a non-negative integer, got ${days}`);
  }
  const effects = fit.dayEffects;
  const gamma = fit.lastBusinessDayEffect;
  if (effects.length !== CALENDAR_DAY_BUCKETS || !Number.isFinite(gamma) || !effects.every(Number.isFinite)) {
    throw new EngineError('INVALID_ARGUMENT', 'calendar-monthly fit must hold 31 finite day effects');
  }
  const out = new Float64Array(days);
  let i = 0;
  while (i < days) {
    const { year, month, day } = civilFromDays(start + i);
    const monthDays = daysInMonth(year, month);
    const lbd = lastBusinessDayOf(year, month, monthDays);
    let mean = gamma;
    for (let d = 1; d < monthDays; d++) mean += effects[d - 1] as number;
    mean = (mean + (effects[MONTH_END_BUCKET] as number)) / monthDays;
    for (let d = day; d <= monthDays && i < days; d++, i++) {
      let e = effects[bucketOf(d, monthDays)] as number;
      if (d === lbd) e += gamma;
      out[i] = e - mean;
    }
  }
  return out;
}

/** Bucket of day-of-month d in a month of `monthDays` days: d − 1, or the month end. */
function bucketOf(d: number, monthDays: number): number {
  return d === monthDays ? MONTH_END_BUCKET : d - 1;
}

/** Day of month of the last Monday–Friday of the month. */
function lastBusinessDayOf(year: number, month: number, monthDays: number): number {
  const weekday = isoWeekday(daysFromCivil(year, month, monthDays));
  return weekday === 6 ? monthDays - 1 : weekday === 7 ? monthDays - 2 : monthDays;
}
