/**
 * The naive runway: (balance − threshold) ÷ average weekly burn. It ignores when flows
 * happen, seasonality and uncertainty; it is shown only to compare with the simulated
 * first-crossing range, and labelled so.
 */

export interface NaiveRunway {
  /** Weeks until the balance would reach the threshold at a constant burn; null when not burning. */
  readonly weeks: number | null;
  /** `burning`: weeks is set; `not-burning`: the net flow was zero or positive; `below`: already below the threshold. */
  readonly status: 'burning' | 'not-burning' | 'below';
}

/** How the naive runway is labelled wherever it is shown. */
export const NAIVE_RUNWAY_LABEL =
  'Naive runway: balance above the threshold divided by the average weekly burn of the last 13 weeks; ignores timing, seasonality and uncertainty';

/**
 * @param balance balance on the as-of date (minor units).
 * @param burnPerWeek mean net outflow per week (minor units, positive = burning).
 * @example naiveRunway(1000000, 0, 50000) // { weeks: 20, status: 'burning' }
 */
export function naiveRunway(balance: number, threshold: number, burnPerWeek: number): NaiveRunway {
  if (balance < threshold) return { weeks: 0, status: 'below' };
  if (!(burnPerWeek > 0)) return { weeks: null, status: 'not-burning' };
  return { weeks: (balance - threshold) / burnPerWeek, status: 'burning' };
}
