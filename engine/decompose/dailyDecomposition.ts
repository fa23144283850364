/**
 * The decomposition Ebbline applies to a daily inflow or outflow series (calendar days,
 * zero-filled): y = trend + weekly + calendar-monthly + yearly + remainder.
 *
 * - weekly: STL with period 7 (Cleveland et al. 1990; engine/decompose/stl.ts) and a
 *   seasonal span of 51 weeks by default. forecast::mstl would use 11, but day-of-month
 *   spikes (rent on the 1st) fall on a few weekdays within any 11-week window, so a short
 *   span lets the weekly component soak them up locally and the backfitting below converges
 *   slowly; over 51 weeks they fall on every weekday in turn and average out, while the
 *   weekly pattern may still drift over a year. (Measured on a synthetic five-year series
 *   with weekly, day-of-month and yearly parts: weekly RMSE 5.9 with span 11, 0.7 with 51.)
 * - calendar-monthly: day-of-month / month-end / last-business-day effects, centred within
 *   each calendar month (engine/decompose/calendarSeasonality.ts), because months are not a
 *   fixed period;
 * - yearly: only with at least two full years (n ≥ 731 days, the condition R's
 *   forecast::mstl uses to keep period 365.25): the seasonal of an STL fit with period
 *   365.25 (span 15, as forecast::mstl's second period), smoothed onto the first K Fourier
 *   harmonics of 365.25 days (default K = 4). The harmonics keep the yearly component smooth
 *   so it cannot soak up day-of-month spikes that recur on nearly the same day of the year,
 *   and project to any future date without a 365/366-day mismatch;
 * - trend: from the yearly STL fit (span 609 days by R's default) when the yearly component
 *   is estimated, otherwise from the weekly STL fit with a trend span of `trendWindow`
 *   days (default 91, about a quarter): longer than a month, so calendar-monthly effects
 *   stay out of the trend, while the level still follows changes over a few months.
 *
 * The components are estimated by backfitting, in the manner of MSTL (Bandara, Hyndman and
 * Bergmeir 2021, arXiv:2107.13462) extended by the calendar component: `iterations` passes
 * (default 3) of
 *   1. weekly  ← STL(y − monthly − yearly, period 7)
 *   2. yearly, trend ← STL(y − weekly − monthly, period 365.25), harmonics of its seasonal
 *      (or trend ← the weekly fit's trend when there is no yearly component)
 *   3. monthly ← calendar fit of y − trend − weekly − yearly
 * and remainder = y − trend − weekly − monthly − yearly.
 *
 * A component that the history is too short for is left out (null), and `notes` says so in
 * plain sentences (DESIGN.md §4.6).
 */
import { EngineError } from '../core/errors';
import { fromDayNumber, isoWeekday, toDayNumber, type CalendarDate } from '../core/dates';
import { stl } from './stl';
import {
  fitCalendarMonthly,
  projectCalendarMonthly,
  type CalendarMonthlyFit,
  type CalendarMonthlyOptions,
} from './calendarSeasonality';
import { solveSymmetricPositiveDefinite } from './solveSymmetricPositiveDefinite';

/** Fewest days for any decomposition: more than two weeks (STL with period 7). */
export const MIN_DAYS_WEEKLY = 15;
/** Fewest days for the calendar-monthly component: two months' worth. */
export const MIN_DAYS_MONTHLY = 56;
/** Fewest days for the yearly component: more than two years of 365.25 days. */
export const MIN_DAYS_YEARLY = 731;
/** Length of the year used by the yearly component. */
export const YEAR_DAYS = 365.25;

/** Options of {@link decomposeDaily}. */
export interface DailyDecompositionOptions {
  /** STL seasonal span in weeks for the weekly component (default 51), or 'periodic' for a fixed weekly pattern. */
  readonly weeklyWindow?: number | 'periodic';
  /** STL seasonal span for the yearly STL fit (default 15). */
  readonly yearlyWindow?: number;
  /** Trend span in days when no yearly component is estimated, and for the weekly fit (default 91). */
  readonly trendWindow?: number;
  /** Number of yearly Fourier harmonics, 1 to 20 (default 4). */
  readonly yearlyHarmonics?: number;
  /** Backfitting passes, at least 1 (default 3). */
  readonly iterations?: number;
  /** Robust STL fits (R's robust = TRUE) for the weekly and yearly steps. Default false. */
  readonly robust?: boolean;
  /** Options of the calendar-monthly fit. */
  readonly calendar?: CalendarMonthlyOptions;
}

/** The fitted yearly component: y(t) = Σ_k a_k cos(2πk·t/365.25) + b_k sin(2πk·t/365.25), t = day number. */
export interface YearlyHarmonicsFit {
  readonly harmonics: number;
  /** a_1 … a_K. */
  readonly cos: Float64Array;
  /** b_1 … b_K. */
  readonly sin: Float64Array;
}

/** Result of {@link decomposeDaily}. Plain data. Left-out components are null. */
export interface DailyDecomposition {
  readonly startDate: CalendarDate;
  readonly length: number;
  readonly trend: Float64Array;
  readonly weekly: Float64Array;
  readonly monthly: Float64Array | null;
  readonly yearly: Float64Array | null;
  /** y − trend − weekly − monthly − yearly. */
  readonly remainder: Float64Array;
  /** y − weekly − monthly − yearly: what a non-seasonal model forecasts. */
  readonly seasonallyAdjusted: Float64Array;
  readonly estimated: {
    readonly trend: true;
    readonly weekly: true;
    readonly monthly: boolean;
    readonly yearly: boolean;
  };
  /** Plain sentences about components left out and why. */
  readonly notes: readonly string[];
  /** Weekly effect by ISO weekday (index 0 = Monday), from the last seven days: used for projection. */
  readonly weeklyProfile: Float64Array;
  readonly monthlyFit: CalendarMonthlyFit | null;
  readonly yearlyFit: YearlyHarmonicsFit | null;
}

/** Seasonal components projected to future dates by {@link projectDailySeasonality}. */
export interface DailySeasonalityProjection {
  readonly weekly: Float64Array;
  /** Zeros when the component was not estimated. */
  readonly monthly: Float64Array;
  /** Zeros when the component was not estimated. */
  readonly yearly: Float64Array;
  /** weekly + monthly + yearly. */
  readonly total: Float64Array;
}

/**
 * Decomposes a daily series into trend, weekly, calendar-monthly and (with two full years)
 * yearly components plus remainder; see the module comment for the method.
 *
 * Sources: STL, Cleveland, Cleveland, McRae and Terpenning (1990), J. Official Statistics
 * 6(1), 3–73; MSTL backfitting, Bandara, Hyndman and Bergmeir (2021), arXiv:2107.13462;
 * calendar component and harmonics as documented in this module and calendarSeasonality.ts.
 *
 * Complexity: O(iterations · n) time (each STL fit is O(n) with default jumps, the
 * calendar and harmonic fits O(n) plus small fixed-size solves); O(n) memory.
 *
 * @param y daily values on consecutive calendar days from `startDate`, finite, at least
 *   15; never mutated.
 * @param startDate the date of y[0] (`YYYY-MM-DD`).
 * @param options spans, harmonics, passes, robustness and calendar options.
 * @returns components, the seasonally adjusted series, notes and the fitted profiles.
 * @throws EngineError NOT_ENOUGH_DATA with fewer than 15 days.
 * @throws EngineError INVALID_ARGUMENT for non-finite values or bad options; INVALID_DATE for a bad start date.
 * @example
 * const d = decomposeDaily(outflows, '2023-01-01');
 * d.notes; // ['Yearly seasonality was left out: …'] when under two years
 */
export function decomposeDaily(
  y: ArrayLike<number>,
  startDate: CalendarDate,
  options: DailyDecompositionOptions = {},
): DailyDecomposition {
  const n = y.length;
  const start = toDayNumber(startDate);
  if (n < MIN_DAYS_WEEKLY) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `a daily decomposition needs at least ${MIN_DAYS_WEEKLY} days (more than two weeks), got ${n}`,
    );
  }
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = y[i] as number;
    if (!Number.isFinite(v)) {
      throw new EngineError(
        'INVALID_ARGUMENT',
        `daily series must be finite; value ${i} (${fromDayNumber(start + i)}) is ${v}`,
      );
    }
    x[i] = v;
  }
  const weeklyWindow = options.weeklyWindow ?? 51;
  const yearlyWindow = options.yearlyWindow ?? 15;
  const trendWindow = options.trendWindow ?? 91;
  const harmonics = options.yearlyHarmonics ?? 4;
  const iterations = options.iterations ?? 3;
  const robust = options.robust ?? false;
  if (!Number.isInteger(harmonics) || harmonics < 1 || harmonics > 20) {
    throw new EngineError('INVALID_ARGUMENT', `yearlyHarmonics must be an integer from 1 to 20, got ${harmonics}`);
  }
  if (!Number.isInteger(iterations) || iterations < 1) {
    throw new EngineError('INVALID_ARGUMENT', `iterations must be a positive integer, got ${iterations}`);
  }

  const notes: string[] = [];
  const withMonthly = n >= MIN_DAYS_MONTHLY;
  const withYearly = n >= MIN_DAYS_YEARLY;
  if (!withMonthly) {
    notes.push(
      `Monthly (day-of-month) seasonality was left out: it needs at least ${MIN_DAYS_MONTHLY} days of history and this series has ${n}.`,
    );
  }
  if (!withYearly) {
    notes.push(
      `Yearly seasonality was left out: it needs at least two full years (${MIN_DAYS_YEARLY} days) of history and this series has ${n}.`,
    );
  }

  let weekly: Float64Array = new Float64Array(n);
  let trend: Float64Array = new Float64Array(n);
  let monthly: Float64Array | null = withMonthly ? new Float64Array(n) : null;
  let yearly: Float64Array | null = withYearly ? new Float64Array(n) : null;
  let monthlyFit: CalendarMonthlyFit | null = null;
  let yearlyFit: YearlyHarmonicsFit | null = null;
  const work = new Float64Array(n);

  for (let pass = 0; pass < iterations; pass++) {
    for (let i = 0; i < n; i++) {
      work[i] = (x[i] as number) - (monthly ? (monthly[i] as number) : 0) - (yearly ? (yearly[i] as number) : 0);
    }
    const weeklyFit = stl(work, { period: 7, sWindow: weeklyWindow, tWindow: trendWindow, robust });
    weekly = weeklyFit.seasonal;
    trend = weeklyFit.trend;

    if (yearly) {
      for (let i = 0; i < n; i++) {
        work[i] = (x[i] as number) - (weekly[i] as number) - (monthly ? (monthly[i] as number) : 0);
      }
      const yearFit = stl(work, { period: YEAR_DAYS, sWindow: yearlyWindow, robust });
      trend = yearFit.trend;
      yearlyFit = fitYearlyHarmonics(yearFit.seasonal, start, harmonics);
      yearly = projectYearly(yearlyFit, start, n);
    }

    if (monthly) {
      for (let i = 0; i < n; i++) {
        work[i] =
          (x[i] as number) - (trend[i] as number) - (weekly[i] as number) - (yearly ? (yearly[i] as number) : 0);
      }
      monthlyFit = fitCalendarMonthly(work, startDate, options.calendar);
      monthly = monthlyFit.component;
    }
  }

  const remainder = new Float64Array(n);
  const seasonallyAdjusted = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const seasonal =
      (weekly[i] as number) + (monthly ? (monthly[i] as number) : 0) + (yearly ? (yearly[i] as number) : 0);
    seasonallyAdjusted[i] = (x[i] as number) - seasonal;
    remainder[i] = (seasonallyAdjusted[i] as number) - (trend[i] as number);
  }
  const weeklyProfile = new Float64Array(7);
  for (let i = n - 7; i < n; i++) weeklyProfile[isoWeekday(start + i) - 1] = weekly[i] as number;

  return {
    startDate,
    length: n,
    trend,
    weekly,
    monthly,
    yearly,
    remainder,
    seasonallyAdjusted,
    estimated: { trend: true, weekly: true, monthly: withMonthly, yearly: withYearly },
    notes,
    weeklyProfile,
    monthlyFit,
    yearlyFit,
  };
}

/**
 * Projects the seasonal components of a daily decomposition to `days` dates from
 * `startDate` (usually the day after the history): weekly from the last week's effect per
 * weekday, monthly by the calendar rule of {@link projectCalendarMonthly}, yearly by
 * evaluating the harmonics at those dates. Add a trend or level forecast of
 * `seasonallyAdjusted` to get a forecast of the series.
 *
 * Complexity: O(days · harmonics).
 *
 * @param fit a result of {@link decomposeDaily}; never mutated.
 * @param startDate first projected date (`YYYY-MM-DD`).
 * @param days number of days, a non-negative integer.
 * @returns weekly, monthly, yearly and total seasonal values as new Float64Arrays.
 * @throws EngineError INVALID_DATE or INVALID_ARGUMENT for a bad date or count.
 * @example
 * const s = projectDailySeasonality(d, '2026-04-01', 90);
 * s.total[0]; // seasonal part of the first forecast day
 */
export function projectDailySeasonality(
  fit: Pick<DailyDecomposition, 'weeklyProfile' | 'monthlyFit' | 'yearlyFit'>,
  startDate: CalendarDate,
  days: number,
): DailySeasonalityProjection {
  const start = toDayNumber(startDate);
  if (!Number.isInteger(days) || days < 0) {
    throw new EngineError('INVALID_ARGUMENT', `days must be a non-negative integer, got ${days}`);
  }
  const weekly = new Float64Array(days);
  for (let i = 0; i < days; i++) weekly[i] = fit.weeklyProfile[isoWeekday(start + i) - 1] as number;
  const monthly = fit.monthlyFit ? projectCalendarMonthly(fit.monthlyFit, startDate, days) : new Float64Array(days);
  const yearly = fit.yearlyFit ? projectYearly(fit.yearlyFit, start, days) : new Float64Array(days);
  const total = new Float64Array(days);
  for (let i = 0; i < days; i++) total[i] = (weekly[i] as number) + (monthly[i] as number) + (yearly[i] as number);
  return { weekly, monthly, yearly, total };
}

/** Least-squares fit of an intercept and K harmonics of 365.25 days to `seasonal` (day numbers from `start`). */
function fitYearlyHarmonics(seasonal: Float64Array, start: number, harmonics: number): YearlyHarmonicsFit {
  const n = seasonal.length;
  const p = 1 + 2 * harmonics;
  const ata = new Float64Array(p * p);
  const atb = new Float64Array(p);
  const row = new Float64Array(p);
  for (let i = 0; i < n; i++) {
    harmonicRow(start + i, harmonics, row);
    const v = seasonal[i] as number;
    for (let a = 0; a < p; a++) {
      const ra = row[a] as number;
      atb[a] = (atb[a] as number) + ra * v;
      for (let b = 0; b <= a; b++) ata[a * p + b] = (ata[a * p + b] as number) + ra * (row[b] as number);
    }
  }
  for (let a = 0; a < p; a++) for (let b = a + 1; b < p; b++) ata[a * p + b] = ata[b * p + a] as number;
  const theta = solveSymmetricPositiveDefinite(ata, atb);
  const cos = new Float64Array(harmonics);
  const sin = new Float64Array(harmonics);
  for (let k = 0; k < harmonics; k++) {
    cos[k] = theta[1 + 2 * k] as number;
    sin[k] = theta[2 + 2 * k] as number;
  }
  return { harmonics, cos, sin };
}

/** [1, cos(2π·1·t/Y), sin(2π·1·t/Y), …] for day number t. */
function harmonicRow(t: number, harmonics: number, row: Float64Array): void {
  row[0] = 1;
  const angle = (2 * Math.PI * t) / YEAR_DAYS;
  for (let k = 1; k <= harmonics; k++) {
    row[2 * k - 1] = Math.cos(k * angle);
    row[2 * k] = Math.sin(k * angle);
  }
}

function projectYearly(fit: YearlyHarmonicsFit, start: number, days: number): Float64Array {
  const out = new Float64Array(days);
  const row = new Float64Array(1 + 2 * fit.harmonics);
  for (let i = 0; i < days; i++) {
    harmonicRow(start + i, fit.harmonics, row);
    let v = 0;
    for (let k = 0; k < fit.harmonics; k++) {
      v += (fit.cos[k] as number) * (row[1 + 2 * k] as number) + (fit.sin[k] as number) * (row[2 + 2 * k] as number);
    }
    out[i] = v;
  }
  return out;
}
