// Invented, seeded inputs shared by the forecast benches and the peer comparison: a five-year
// daily history of a small studio, with a weekly rhythm (Saturday market), a slow December,
// invoices paid now and then, and recurring rent, software, utilities, insurance and VAT.
import { addDays, isoWeekday, toDayNumber, type CalendarDate } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import type { ForecastHistory, HistoryEntry } from '../../engine/forecast/history';

export const BENCH_START: CalendarDate = '2021-01-01';
export const BENCH_DAYS = 5 * 365 + 1;

const WEEKLY = [0.7, 0.6, 0.7, 0.8, 1.0, 2.6, 0.4]; // Monday … Sunday

/** Five years of entries. */
export function benchHistory(seed = 2024): ForecastHistory {
  const rng = createRng(seed);
  const entries: HistoryEntry[] = [];
  const first = toDayNumber(BENCH_START);
  let n = 0;
  const add = (date: CalendarDate, amount: number, description: string, counterparty?: string) =>
    entries.push({ id: `b${n++}`, date, amount, description, ...(counterparty ? { counterparty } : {}) });
  for (let d = 0; d < BENCH_DAYS; d++) {
    const date = addDays(BENCH_START, d);
    const month = Number(date.slice(5, 7));
    const dom = Number(date.slice(8, 10));
    const season = month === 12 ? 0.6 : month >= 6 && month <= 8 ? 1.25 : 1;
    const w = WEEKLY[isoWeekday(first + d) - 1] as number;
    add(date, Math.max(0, Math.round(9_000 * w * season * (1 + 0.35 * rng.normal()))), 'Card takings Tillpoint');
    if (rng.nextFloat() < 0.5) add(date, -Math.max(0, Math.round(2_500 + 1_500 * rng.normal())), 'Materials');
    if (rng.nextFloat() < 0.05)
      add(date, Math.round(60_000 + 120_000 * rng.nextFloat()), `Invoice ${n}`, 'Commission client');
    if (dom === 1) add(date, -92_500, 'Studio rent', 'Kilnyard Studios');
    if (dom === 5) add(date, -Math.round(12_000 + 4_000 * rng.nextFloat()), 'Kiln electricity', 'Brightwell Energy');
    if (dom === 20) add(date, -3_250, 'Telephone', 'Pebblewire Telecom');
    if (dom === 15) add(date, -6_500, 'Market stall fee', 'Makers Market Association');
    if (dom === 25 && month % 3 === 1)
      add(date, -Math.round(110_000 + 30_000 * rng.nextFloat()), 'VAT', 'Office of Indirect Taxes');
    if (dom === 10 && month === 3) add(date, -34_800, 'Insurance', 'Stoutheart Insurance');
  }
  return {
    currency: 'EUR',
    start: BENCH_START,
    asOf: addDays(BENCH_START, BENCH_DAYS - 1),
    endBalance: 1_500_000,
    relative: false,
    entries,
  };
}

/** Median of a list of numbers. */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}
