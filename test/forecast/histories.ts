// Small invented histories for the forecast pipeline tests (not the demo workspace), built
// day by day from a seeded generator so every run sees the same entries.
import { createRng, type Rng } from '../../engine/core/random';
import { addDays, fromDayNumber, toDayNumber, type CalendarDate } from '../../engine/core/dates';
import type { ForecastHistory, HistoryEntry } from '../../engine/forecast/history';

/** One kind of flow: returns the signed amount (minor units) booked on a day, or 0. */
export type DailyFlow = (date: CalendarDate, day: number, rng: Rng) => number;

export interface FlowSpec {
  readonly description: string;
  readonly counterparty?: string;
  readonly flow: DailyFlow;
}

export interface HistorySpec {
  readonly start?: CalendarDate;
  readonly days: number;
  readonly seed?: number;
  readonly endBalance?: number;
  readonly flows: readonly FlowSpec[];
  readonly currency?: string;
}

/** Builds the history: for each day, each flow in order may book one entry. */
export function buildHistory(spec: HistorySpec): ForecastHistory {
  const start = spec.start ?? '2025-01-01';
  const rng = createRng(spec.seed ?? 1);
  const entries: HistoryEntry[] = [];
  const first = toDayNumber(start);
  for (let d = 0; d < spec.days; d++) {
    const date = fromDayNumber(first + d);
    spec.flows.forEach((f, k) => {
      const amount = f.flow(date, d, rng);
      if (amount !== 0) {
        entries.push({
          id: `f${k}d${d}`,
          date,
          amount,
          description: f.description,
          ...(f.counterparty !== undefined ? { counterparty: f.counterparty } : {}),
        });
      }
    });
  }
  return {
    currency: spec.currency ?? 'EUR',
    start,
    asOf: addDays(start, spec.days - 1),
    endBalance: spec.endBalance ?? 500_000,
    relative: false,
    entries,
  };
}

/** A fixed amount on a day of the month (every month, weekends included). */
export function monthly(dayOfMonth: number, amount: number, until?: CalendarDate): DailyFlow {
  return (date) => (Number(date.slice(8, 10)) === dayOfMonth && (until === undefined || date <= until) ? amount : 0);
}

/** Every day: a normal amount with the given mean and sd (minor units), floored at 0 in magnitude. */
export function everyDay(sign: 1 | -1, mean: number, sd: number): DailyFlow {
  return (_date, _day, rng) => sign * Math.max(0, Math.round(mean + sd * rng.normal()));
}

/** On a share of days: a uniform amount between lo and hi (minor units). */
export function sometimes(sign: 1 | -1, share: number, lo: number, hi: number): DailyFlow {
  return (_date, _day, rng) => (rng.nextFloat() < share ? sign * Math.round(lo + (hi - lo) * rng.nextFloat()) : 0);
}

/** Walks a JSON value and returns the paths of every number that is not finite. */
export function nonFiniteNumbers(value: unknown, path = '$'): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFiniteNumbers(v, `${path}[${i}]`));
  if (value !== null && typeof value === 'object') {
    return Object.entries(value).flatMap(([k, v]) => nonFiniteNumbers(v, `${path}.${k}`));
  }
  return [];
}

/** Counts every number in a JSON value (to show a walk saw something). */
export function countNumbers(value: unknown): number {
  if (typeof value === 'number') return 1;
  if (Array.isArray(value)) return value.reduce((s: number, v) => s + countNumbers(v), 0);
  if (value !== null && typeof value === 'object')
    return Object.values(value).reduce((s: number, v) => s + countNumbers(v), 0);
  return 0;
}
