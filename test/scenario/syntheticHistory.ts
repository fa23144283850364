// An invented small business history for tests (not the demo workspace): Saturday market
// takings, rent on the 1st, an owner's draw at month end, invoice payments now and then and
// small supplies; seeded, so every run builds the same entries.
import { createRng } from '../../engine/core/random';
import { addDays, fromDayNumber, isoWeekday, toDayNumber, type CalendarDate } from '../../engine/core/dates';
import type { ForecastHistory, HistoryEntry } from '../../engine/forecast/history';

export interface SyntheticOptions {
  readonly start?: CalendarDate;
  readonly days?: number;
  readonly endBalance?: number;
  readonly seed?: number;
  /** Owner's draw on the 28th (minor units, positive). */
  readonly draw?: number;
}

export function syntheticHistory(options: SyntheticOptions = {}): ForecastHistory {
  const start = options.start ?? '2025-05-01';
  const days = options.days ?? 240;
  const rng = createRng(options.seed ?? 11);
  const entries: HistoryEntry[] = [];
  let n = 0;
  const add = (date: CalendarDate, amount: number, description: string, counterparty: string) =>
    entries.push({ id: `e${++n}`, date, amount, description, counterparty });
  const first = toDayNumber(start);
  let invoice = 0;
  for (let d = first; d < first + days; d++) {
    const date = fromDayNumber(d);
    const dom = Number(date.slice(8, 10));
    if (isoWeekday(d) === 6)
      add(date, Math.round(40000 * (0.6 + 0.8 * rng.nextFloat())), 'Card takings market', 'Tillpoint');
    if (dom === 1) add(date, -90000, `Studio rent ${date.slice(0, 7)}`, 'Landlord Ltd');
    if (dom === 28) add(date, -(options.draw ?? 320000), `Owner draw ${date.slice(0, 7)}`, 'Owner');
    if (rng.nextFloat() < 0.06) {
      invoice++;
      add(
        date,
        Math.round(80000 + 100000 * rng.nextFloat()),
        `Payment INV-2025-${String(invoice).padStart(3, '0')}`,
        'Client',
      );
    }
    if (rng.nextFloat() < 0.1) add(date, -Math.round(2000 + 10000 * rng.nextFloat()), 'Clay order', 'Supplies');
  }
  return {
    currency: 'EUR',
    start,
    asOf: addDays(start, days - 1),
    endBalance: options.endBalance ?? 300000,
    relative: false,
    entries,
  };
}
