/**
 * The order of a file's rows: banks export oldest first or newest first; a running balance
 * can only be checked once that is known.
 */
import type { CalendarDate } from '../../core/dates';

/** Row order of a file, from its booking dates. */
export type CsvRowOrder = 'oldestFirst' | 'newestFirst' | 'unknown' | 'unsorted';

/**
 * Detects the row order from booking dates `YYYY-MM-DD` in file order (such strings sort
 * like the days they name). `unknown` when every row has the same date; `unsorted` when the
 * dates go both up and down, with the first row index that breaks the order.
 *
 * @example detectRowOrder(['2025-01-03', '2025-01-02', '2025-01-02']) // { order: 'newestFirst' }
 * @example detectRowOrder(['2025-01-01', '2025-01-03', '2025-01-02']) // { order: 'unsorted', breakIndex: 2 }
 */
export function detectRowOrder(dates: readonly CalendarDate[]): { order: CsvRowOrder; breakIndex?: number } {
  let direction = 0;
  for (let k = 1; k < dates.length; k++) {
    const a = dates[k - 1] as string;
    const b = dates[k] as string;
    const step = b > a ? 1 : b < a ? -1 : 0;
    if (step === 0) continue;
    if (direction === 0) direction = step;
    else if (step !== direction) return { order: 'unsorted', breakIndex: k };
  }
  return { order: direction > 0 ? 'oldestFirst' : direction < 0 ? 'newestFirst' : 'unknown' };
}
