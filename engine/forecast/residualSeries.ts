/**
 * The daily series the residual models see: what recurring flows do not explain.
 */
import { toDayNumber } from '../core/dates';
import type { ForecastHistory } from './history';

/**
 * Daily inflow and outflow magnitudes of the entries not in `explained`, zero-filled over
 * the history.
 * @example residualSeries(history, explainedEntryIds(detected, decisions)).outflow
 */
export function residualSeries(
  history: ForecastHistory,
  explained: ReadonlySet<string>,
): { inflow: Float64Array; outflow: Float64Array; days: number } {
  const start = toDayNumber(history.start);
  const days = toDayNumber(history.asOf) - start + 1;
  const inflow = new Float64Array(days);
  const outflow = new Float64Array(days);
  for (const e of history.entries) {
    if (explained.has(e.id)) continue;
    const d = toDayNumber(e.date) - start;
    if (d < 0 || d >= days) continue;
    if (e.amount > 0) inflow[d] = (inflow[d] as number) + e.amount;
    else outflow[d] = (outflow[d] as number) - e.amount;
  }
  return { inflow, outflow, days };
}
