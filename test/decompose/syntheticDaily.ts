import { createRng } from '../../engine/core/random';
import { civilFromDays, daysInMonth, isoWeekday, toDayNumber, type CalendarDate } from '../../engine/core/dates';

/** Invented weekly effects, Monday … Sunday (sum zero). */
export const WEEKLY_EFFECT = [10, 4, 0, -3, 18, -12, -17] as const;

export interface SyntheticOptions {
  readonly start: CalendarDate;
  readonly days: number;
  readonly seed: number;
  readonly noiseSd: number;
  /** Effect on a day of month d (1-based) that is not the month's last day. */
  readonly dayEffect?: (day: number) => number;
  readonly monthEndEffect?: number;
  readonly lastBusinessDayEffect?: number;
  readonly weekly?: boolean;
  readonly yearlyAmplitude?: number;
  readonly trendSlope?: number;
}

export interface SyntheticSeries {
  readonly y: Float64Array;
  readonly trend: Float64Array;
  readonly weekly: Float64Array;
  /** Calendar effect of each date minus its calendar month's mean effect. */
  readonly monthlyCentred: Float64Array;
  readonly yearly: Float64Array;
}

/**
 * Invented daily series with known components, computed independently of the engine's
 * decomposition code: trend + weekly + calendar-monthly + yearly + Gaussian noise (seeded).
 * The calendar effect is centred by an explicit loop over each month's days, so the
 * monthly truth has the same meaning as the engine's component. Times `t` are day numbers.
 */
export function syntheticDaily(o: SyntheticOptions): SyntheticSeries {
  const rng = createRng(o.seed);
  const s0 = toDayNumber(o.start);
  const n = o.days;
  const trend = new Float64Array(n);
  const weekly = new Float64Array(n);
  const monthlyCentred = new Float64Array(n);
  const yearly = new Float64Array(n);
  const y = new Float64Array(n);
  const rawEffect = (year: number, month: number, day: number): number => {
    const last = daysInMonth(year, month);
    const lastWeekday = isoWeekday(
      toDayNumber(`${year}-${String(month).padStart(2, '0')}-${String(last).padStart(2, '0')}`),
    );
    const lbd = lastWeekday === 6 ? last - 1 : lastWeekday === 7 ? last - 2 : last;
    let e = day === last ? (o.monthEndEffect ?? 0) : (o.dayEffect?.(day) ?? 0);
    if (day === lbd) e += o.lastBusinessDayEffect ?? 0;
    return e;
  };
  for (let i = 0; i < n; i++) {
    const t = s0 + i;
    const { year, month, day } = civilFromDays(t);
    const last = daysInMonth(year, month);
    let mean = 0;
    for (let d = 1; d <= last; d++) mean += rawEffect(year, month, d);
    mean /= last;
    monthlyCentred[i] = rawEffect(year, month, day) - mean;
    trend[i] = 100 + (o.trendSlope ?? 0.02) * i + mean; // the month's mean effect is level, not seasonality
    weekly[i] = o.weekly === false ? 0 : (WEEKLY_EFFECT[isoWeekday(t) - 1] as number);
    const a = o.yearlyAmplitude ?? 0;
    yearly[i] = a * Math.sin((2 * Math.PI * t) / 365.25) + (a / 3) * Math.cos((4 * Math.PI * t) / 365.25);
    y[i] =
      (trend[i] as number) +
      (weekly[i] as number) +
      (monthlyCentred[i] as number) +
      (yearly[i] as number) +
      o.noiseSd * rng.normal();
  }
  return { y, trend, weekly, monthlyCentred, yearly };
}

/** Root mean squared difference. */
export function rmse(a: ArrayLike<number>, b: ArrayLike<number>, from = 0, to = a.length): number {
  let s = 0;
  for (let i = from; i < to; i++) s += ((a[i] as number) - (b[i] as number)) ** 2;
  return Math.sqrt(s / (to - from));
}

/** Largest absolute difference. */
export function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs((a[i] as number) - (b[i] as number)));
  return m;
}
