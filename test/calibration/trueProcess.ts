// A synthetic cash process whose future distribution is known exactly, for calibration
// checks of the whole forecast pipeline (invented data): daily card takings and daily
// supplies, each i.i.d. normal clamped at zero, and a fixed rent on the 1st of each month.
import { addDays, type CalendarDate } from '../../engine/core/dates';
import { createRng, type Rng } from '../../engine/core/random';
import type { ForecastHistory, HistoryEntry } from '../../engine/forecast/history';

export interface TrueProcess {
  /** Mean and sd of the daily takings before clamping (minor units). */
  readonly takings: readonly [number, number];
  /** Mean and sd of the daily supplies before clamping (minor units). */
  readonly supplies: readonly [number, number];
  /** Signed rent booked on the 1st of every month (minor units). */
  readonly rent: number;
}

export const STUDIO_PROCESS: TrueProcess = { takings: [8_000, 3_000], supplies: [6_000, 2_500], rent: -90_000 };

function clamped(rng: Rng, [mean, sd]: readonly [number, number]): number {
  return Math.max(0, Math.round(mean + sd * rng.normal()));
}

/** `days` days of history from `start`, ending with balance `endBalance`. */
export function trueHistory(
  process: TrueProcess,
  seed: number,
  start: CalendarDate,
  days: number,
  endBalance: number,
): ForecastHistory {
  const rng = createRng(seed);
  const entries: HistoryEntry[] = [];
  for (let d = 0; d < days; d++) {
    const date = addDays(start, d);
    entries.push({ id: `t${d}`, date, amount: clamped(rng, process.takings), description: 'Card takings Tillpoint' });
    entries.push({ id: `s${d}`, date, amount: -clamped(rng, process.supplies), description: 'Supplies order' });
    if (date.endsWith('-01')) {
      entries.push({
        id: `r${d}`,
        date,
        amount: process.rent,
        description: 'Studio rent',
        counterparty: 'Landlord Ltd',
      });
    }
  }
  return { currency: 'EUR', start, asOf: addDays(start, days - 1), endBalance, relative: false, entries };
}

/** Which of `horizon` days from `first` are the 1st of a month (rent days). */
export function rentDays(first: CalendarDate, horizon: number): boolean[] {
  return Array.from({ length: horizon }, (_, d) => addDays(first, d).endsWith('-01'));
}

/**
 * One realised future of the process: end-of-day balances of the days of `rent` (from
 * rentDays), written into `out`. The future does not depend on the history (i.i.d. days),
 * only on the start balance.
 */
export function trueFuture(
  process: TrueProcess,
  rng: Rng,
  rent: readonly boolean[],
  startBalance: number,
  out: Float64Array,
): void {
  let b = startBalance;
  for (let d = 0; d < rent.length; d++) {
    b += clamped(rng, process.takings) - clamped(rng, process.supplies);
    if (rent[d]) b += process.rent;
    out[d] = b;
  }
}

/** The true probability of ending some day below `threshold` within the horizon, by simulation. */
export function trueCrossingFrequency(
  process: TrueProcess,
  seed: number,
  first: CalendarDate,
  horizon: number,
  startBalance: number,
  threshold: number,
  paths: number,
): number {
  const rng = createRng(seed);
  const rent = rentDays(first, horizon);
  const path = new Float64Array(horizon);
  let crossed = 0;
  for (let p = 0; p < paths; p++) {
    trueFuture(process, rng, rent, startBalance, path);
    if (path.some((b) => b < threshold)) crossed++;
  }
  return crossed / paths;
}
