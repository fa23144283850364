/**
 * Axis ticks for the report's chart: amounts at 1, 2 or 5 × 10^k steps (Heckbert,
 * "Nice numbers for graph labels", Graphics Gems, 1990) and dates on the first day of a
 * month.
 */
import { addMonths, daysBetween, formatYmd, parseIsoDate, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';

/**
 * About `count` round values covering [min, max]: every multiple of the step from the
 * first at or below min to the first at or above max.
 * @throws EngineError INVALID_ARGUMENT for non-finite bounds or a count below 2.
 * @example niceTicks(1234, 9876, 5) // [0, 2000, 4000, 6000, 8000, 10000]
 */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max))
    throw new EngineError('INVALID_ARGUMENT', 'tick bounds must be finite');
  if (!(count >= 2)) throw new EngineError('INVALID_ARGUMENT', 'at least two ticks are needed');
  let lo = Math.min(min, max);
  let hi = Math.max(min, max);
  if (lo === hi) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / (count - 1);
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  // Heckbert's rounded nice number: the step nearest the raw one, so about `count` ticks.
  const step = (fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10) * power;
  const first = Math.floor(lo / step);
  const last = Math.ceil(hi / step);
  const ticks: number[] = [];
  // Multiply rather than add, so ticks do not accumulate rounding error.
  for (let k = first; k <= last; k++) ticks.push(Number((k * step).toPrecision(12)) || 0);
  return ticks;
}

/**
 * First days of months strictly after `from` and up to `to`, every `everyMonths` months.
 * @example monthTicks('2026-10-31', '2027-01-30') // ['2026-11-01', '2026-12-01', '2027-01-01']
 */
export function monthTicks(from: CalendarDate, to: CalendarDate, everyMonths = 1): CalendarDate[] {
  const p = parseIsoDate(from);
  if (!p || !parseIsoDate(to)) throw new EngineError('INVALID_DATE', `not calendar dates: ${from}, ${to}`);
  const out: CalendarDate[] = [];
  let d = addMonths(formatYmd(p.year, p.month, 1), 1);
  while (daysBetween(d, to) >= 0) {
    out.push(d);
    d = addMonths(d, everyMonths);
  }
  return out;
}
