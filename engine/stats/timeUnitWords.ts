/**
 * Plain words for lags and cycles, shared by the sentences of the diagnostics.
 */

/** The spacing of the observations, used only to word the sentences. */
export type TimeUnit = 'day' | 'week' | 'month' | 'quarter';

const ADJECTIVES: Record<TimeUnit, string> = { day: 'daily', week: 'weekly', month: 'monthly', quarter: 'quarterly' };

/** Cycles with a name, by unit: lag → what it repeats every. */
const NAMED_CYCLES: Record<TimeUnit, Readonly<Record<number, string>>> = {
  day: {
    7: 'week',
    14: 'two weeks',
    28: 'four weeks',
    30: 'month',
    31: 'month',
    91: 'quarter',
    364: 'year',
    365: 'year',
  },
  week: { 2: 'two weeks', 4: 'four weeks', 13: 'quarter', 52: 'year' },
  month: { 3: 'quarter', 6: 'half-year', 12: 'year' },
  quarter: { 2: 'half-year', 4: 'year' },
};

/**
 * "1 day", "7 days", "12 months".
 *
 * @example countOf(7, 'day') // '7 days'
 */
export function countOf(count: number, unit: TimeUnit): string {
  return `${count} ${unit}${count === 1 ? '' : 's'}`;
}

/**
 * The adjective of a unit: "daily", "weekly", "monthly", "quarterly".
 *
 * @example unitAdjective('day') // 'daily'
 */
export function unitAdjective(unit: TimeUnit): string {
  return ADJECTIVES[unit];
}

/**
 * The name of a cycle of `lag` observations when it has one: "week" for 7 days, "year" for
 * 12 months; null otherwise.
 *
 * @example namedCycle(7, 'day') // 'week'
 * @example namedCycle(9, 'day') // null
 */
export function namedCycle(lag: number, unit: TimeUnit): string | null {
  return NAMED_CYCLES[unit][lag] ?? null;
}

/**
 * What a cycle of `lag` observations repeats every, in words: its name when it has one,
 * otherwise a count such as "9 days".
 *
 * @example cycleWords(7, 'day') // 'week'
 * @example cycleWords(9, 'day') // '9 days'
 */
export function cycleWords(lag: number, unit: TimeUnit): string {
  return namedCycle(lag, unit) ?? countOf(lag, unit);
}
