/**
 * Finds recurring flows (rent, salaries, subscriptions, quarterly taxes) in an account's
 * history. Entries are grouped by direction and normalised label; for each group every
 * plausible cadence is laid over the dates as a nominal schedule (with each business-day
 * rule), occurrences are matched to scheduled days within a tolerance, and the cadence that
 * explains the most occurrences with the fewest misses wins. What the schedule does not
 * explain stays with the residual flows.
 */
import {
  civilFromDays,
  fromDayNumber,
  isoWeekday,
  toDayNumber,
  type CalendarDate,
  type DayNumber,
} from '../core/dates';
import { type BusinessDayRule } from './businessDays';
import { cadencePeriodDays, describeCadence, monthIndexOf, scheduleDays, weekIndexOf, type Cadence } from './cadence';
import { normaliseLabel } from './normaliseLabel';

/** What the detector needs of a transaction. */
export interface RecurringInput {
  readonly id: string;
  readonly date: CalendarDate;
  /** Signed minor units. */
  readonly amount: number;
  readonly description: string;
  readonly counterparty?: string;
}

export type RecurringState = 'suggested' | 'ended';

/** A recurring flow found in the history (plain data). */
export interface DetectedRecurringFlow {
  /** Stable key: direction, normalised label and cadence kind. */
  readonly key: string;
  readonly label: string;
  readonly matchLabel: string;
  readonly direction: 'inflow' | 'outflow';
  readonly cadence: Cadence;
  readonly cadenceText: string;
  readonly businessDayRule: BusinessDayRule;
  /** Recent signed amounts (minor units), oldest first, used for projection. */
  readonly recentAmounts: readonly number[];
  readonly typicalAmount: number;
  /** Coefficient of variation of the matched amounts. */
  readonly amountVariation: number;
  /** Observed day offsets from the nominal schedule and how often each occurred. */
  readonly timing: { readonly offsets: readonly number[]; readonly weights: readonly number[] };
  /** Share of scheduled occurrences that happened. */
  readonly probability: number;
  readonly occurrences: number;
  readonly firstDate: CalendarDate;
  readonly lastDate: CalendarDate;
  /** First scheduled day after the as-of date (null when ended). */
  readonly nextDate: CalendarDate | null;
  /** 0..1: schedule fit × amount steadiness × length of history. */
  readonly confidence: number;
  readonly state: RecurringState;
  /** Ids of the transactions this flow explains. */
  readonly memberIds: readonly string[];
}

export interface DetectOptions {
  /** The last day of the history; ended series and next dates are judged from it. */
  readonly asOf: CalendarDate;
  /** Minimum confidence to report (default 0.5). */
  readonly minConfidence?: number;
}

interface Candidate {
  cadence: Cadence;
  rule: BusinessDayRule;
  tolerance: number;
}

interface Match {
  candidate: Candidate;
  matched: { index: number; nominal: DayNumber }[];
  expected: number;
  score: number;
}

const RULES: readonly BusinessDayRule[] = ['none', 'following', 'preceding'];

function mode(values: readonly number[]): number {
  const counts = new Map<number, number>();
  let best = values[0] ?? 0;
  let bestCount = 0;
  for (const v of values) {
    const c = (counts.get(v) ?? 0) + 1;
    counts.set(v, c);
    if (c > bestCount || (c === bestCount && v < best)) {
      best = v;
      bestCount = c;
    }
  }
  return best;
}

function candidatesFor(days: readonly DayNumber[]): Candidate[] {
  const out: Candidate[] = [];
  const first = days[0] as DayNumber;
  const weekday = mode(days.map(isoWeekday));
  for (const everyWeeks of [1, 2, 4]) {
    const phase = ((weekIndexOf(first) % everyWeeks) + everyWeeks) % everyWeeks;
    for (const rule of RULES) {
      out.push({ cadence: { kind: 'weekly', everyWeeks, weekday, phase }, rule, tolerance: everyWeeks === 1 ? 1 : 2 });
    }
  }
  const civil = days.map(civilFromDays);
  const dayOfMonth = mode(civil.map((c) => c.day));
  const nth = mode(civil.map((c) => Math.ceil(c.day / 7)));
  const monthWeekday = mode(days.map(isoWeekday));
  for (const everyMonths of [1, 3, 12]) {
    const phase = ((monthIndexOf(first) % everyMonths) + everyMonths) % everyMonths;
    const tolerance = everyMonths === 1 ? 4 : 7;
    // Ties go to the earlier candidate: "last business day" before the equivalent
    // "31st, moved to the preceding business day".
    out.push({ cadence: { kind: 'lastBusinessDay', everyMonths, phase }, rule: 'none', tolerance });
    for (const rule of RULES) {
      out.push({ cadence: { kind: 'monthDay', everyMonths, day: dayOfMonth, phase }, rule, tolerance });
      out.push({ cadence: { kind: 'monthDay', everyMonths, day: 31, phase }, rule, tolerance });
    }
    if (nth <= 4) {
      out.push({
        cadence: { kind: 'monthWeekday', everyMonths, nth, weekday: monthWeekday, phase },
        rule: 'none',
        tolerance: 3,
      });
    }
  }
  return out;
}

/** Greedy matching of each scheduled day to the nearest unmatched occurrence within tolerance. */
function matchSchedule(days: readonly DayNumber[], c: Candidate): Match {
  const first = days[0] as DayNumber;
  const last = days[days.length - 1] as DayNumber;
  const schedule = scheduleDays(c.cadence, first - c.tolerance, last + c.tolerance, c.rule);
  const used = new Uint8Array(days.length);
  const matched: { index: number; nominal: DayNumber }[] = [];
  let offsetSum = 0;
  let j = 0;
  for (const nominal of schedule) {
    while (j < days.length && (days[j] as number) < nominal - c.tolerance) j++;
    let best = -1;
    let bestDistance = Infinity;
    for (let k = j; k < days.length && (days[k] as number) <= nominal + c.tolerance; k++) {
      const distance = Math.abs((days[k] as number) - nominal);
      if (!used[k] && distance < bestDistance) {
        best = k;
        bestDistance = distance;
      }
    }
    if (best >= 0) {
      used[best] = 1;
      matched.push({ index: best, nominal });
      offsetSum += bestDistance;
    }
  }
  const expected = Math.max(1, schedule.length);
  const coverage = matched.length / expected;
  const precision = matched.length / days.length;
  const meanOffset = matched.length ? offsetSum / matched.length : c.tolerance;
  const tightness = 1 - (0.5 * meanOffset) / (c.tolerance + 1);
  // A finer cadence that explains the same days must not win over a coarser one by
  // accident, and a coarser one must not win by skipping occurrences: coverage and
  // precision together decide.
  return { candidate: c, matched, expected, score: coverage * precision * tightness };
}

function variation(values: readonly number[]): number {
  const n = values.length;
  if (n < 2) return 0;
  let mean = 0;
  for (const v of values) mean += v / n;
  let ss = 0;
  for (const v of values) ss += (v - mean) ** 2;
  return Math.sqrt(ss / (n - 1)) / Math.max(1, Math.abs(mean));
}

function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

function displayLabel(entry: RecurringInput): string {
  const text = (entry.counterparty?.trim() || entry.description.trim()).replace(/\s+/g, ' ');
  return text.length > 48 ? text.slice(0, 47) + '…' : text;
}

/** Steadiness an amount series must show for a cadence to count as a recurring payment. */
function maxVariation(c: Cadence): number {
  return c.kind === 'weekly' ? 0.25 : 0.5;
}

/**
 * Detects recurring flows.
 *
 * A group needs at least three matched occurrences (two for yearly cadences), at least 60%
 * of its scheduled occurrences present and at least 70% of its entries on the schedule.
 * Weekly flows must have steady amounts (variation ≤ 0.25; noisy weekly takings such as
 * market sales are seasonality, left to the residual model); monthly and longer ones
 * ≤ 0.5. A series whose last occurrence is more than 1.5 periods (plus tolerance) before
 * `asOf` has ended and is not projected.
 *
 * @example detectRecurringFlows(entries, { asOf: '2026-10-31' })[0].cadenceText // 'monthly on the 1st'
 * Complexity: O(groups · candidates · occurrences).
 */
export function detectRecurringFlows(
  entries: readonly RecurringInput[],
  options: DetectOptions,
): DetectedRecurringFlow[] {
  const asOf = toDayNumber(options.asOf);
  const minConfidence = options.minConfidence ?? 0.5;
  const groups = new Map<string, RecurringInput[]>();
  for (const e of entries) {
    if (e.amount === 0) continue;
    const label = normaliseLabel(e.counterparty ? `${e.counterparty}` : e.description) || normaliseLabel(e.description);
    if (!label) continue;
    const key = `${e.amount > 0 ? 'in' : 'out'}:${label}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = []));
    g.push(e);
  }
  const found: DetectedRecurringFlow[] = [];
  for (const [groupKey, group] of [...groups.entries()].sort(([a], [b]) => (a < b ? -1 : 1))) {
    if (group.length < 2) continue;
    const sorted = [...group].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.id < b.id ? -1 : 1));
    const days = sorted.map((e) => toDayNumber(e.date));
    let best: Match | undefined;
    for (const candidate of candidatesFor(days)) {
      const m = matchSchedule(days, candidate);
      if (!best || m.score > best.score + 1e-12) best = m;
    }
    if (!best) continue;
    const { candidate, matched, expected } = best;
    const yearly = candidate.cadence.kind !== 'weekly' && candidate.cadence.everyMonths === 12;
    if (matched.length < (yearly ? 2 : 3)) continue;
    const coverage = matched.length / expected;
    const precision = matched.length / days.length;
    if (coverage < 0.6 || precision < 0.7) continue;
    const amounts = matched.map((m) => (sorted[m.index] as RecurringInput).amount);
    const amountVariation = variation(amounts);
    if (amountVariation > maxVariation(candidate.cadence)) continue;
    const period = cadencePeriodDays(candidate.cadence);
    const lastMatched = days[(matched[matched.length - 1] as { index: number }).index] as number;
    const ended = asOf - lastMatched > 1.5 * period + candidate.tolerance;
    const offsets = new Map<number, number>();
    for (const m of matched.slice(-24)) {
      const o = (days[m.index] as number) - m.nominal;
      offsets.set(o, (offsets.get(o) ?? 0) + 1);
    }
    const offsetList = [...offsets.keys()].sort((a, b) => a - b);
    const history = Math.min(1, matched.length / (yearly ? 3 : 6));
    const steadiness = 1 / (1 + 2 * amountVariation);
    const confidence = Math.min(1, best.score * steadiness * (0.5 + 0.5 * history));
    if (confidence < minConfidence) continue;
    const next = ended ? [] : scheduleDays(candidate.cadence, asOf + 1, asOf + Math.ceil(period) + 40, candidate.rule);
    const recent = amounts.slice(-12);
    const lastThree = recent.slice(-3);
    const steadyLately = lastThree.length === 3 && lastThree.every((a) => a === lastThree[0]);
    const latest = sorted[(matched[matched.length - 1] as { index: number }).index] as RecurringInput;
    found.push({
      key: `${groupKey}:${candidate.cadence.kind}`,
      label: displayLabel(latest),
      matchLabel: groupKey.slice(groupKey.indexOf(':') + 1),
      direction: (amounts[0] as number) > 0 ? 'inflow' : 'outflow',
      cadence: candidate.cadence,
      cadenceText: describeCadence(candidate.cadence),
      businessDayRule: candidate.rule,
      recentAmounts: steadyLately ? lastThree : recent,
      typicalAmount: median(recent),
      amountVariation,
      timing: { offsets: offsetList, weights: offsetList.map((o) => offsets.get(o) as number) },
      probability: Math.min(1, matched.length / expected),
      occurrences: matched.length,
      firstDate: fromDayNumber(days[(matched[0] as { index: number }).index] as number),
      lastDate: fromDayNumber(lastMatched),
      nextDate: next.length ? fromDayNumber(next[0] as number) : null,
      confidence,
      state: ended ? 'ended' : 'suggested',
      memberIds: matched.map((m) => (sorted[m.index] as RecurringInput).id),
    });
  }
  return found.sort((a, b) => b.confidence - a.confidence || (a.key < b.key ? -1 : 1));
}
