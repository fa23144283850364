/**
 * Projects recurring flows into simulation components: each flow's future schedule within
 * the horizon, its learned amounts and timing spread, and the user's decisions and the
 * plan's pauses and scalings applied on top.
 */
import { fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import { cadencePeriodDays, scheduleDays, type Cadence } from '../recurring/cadence';
import type { DetectedRecurringFlow } from '../recurring/detectRecurringFlows';
import type { RecurringChange } from '../plan/plan';
import type { AmountDistribution, RecurringComponent } from '../simulate/types';

/** The user's decision about a detected flow (the app stores these). */
export interface RecurringDecision {
  readonly key: string;
  readonly state: 'confirmed' | 'dismissed' | 'edited';
  readonly edits?: { readonly amount?: number; readonly cadence?: Cadence; readonly label?: string };
}

/** Suggested flows at or above this confidence are projected without a confirmation. */
export const AUTO_CONFIDENCE = 0.6;

export interface ProjectedRecurring {
  readonly flow: DetectedRecurringFlow;
  readonly status: 'confirmed' | 'edited' | 'suggested';
  readonly label: string;
  readonly cadence: Cadence;
  /** Typical signed amount of the next occurrence (minor units) after edits and plan scaling. */
  readonly amount: number;
  /** Next projected occurrence (it may lie beyond the horizon); null when a pause stops it. */
  readonly nextDate: CalendarDate | null;
}

export interface RecurringProjection {
  readonly components: readonly RecurringComponent[];
  readonly projected: readonly ProjectedRecurring[];
  /** Flows detected but not projected, with the reason. */
  readonly skipped: readonly { readonly key: string; readonly label: string; readonly reason: string }[];
  /** Plan changes that matched no projected flow (flagged, never silently dropped). */
  readonly unmatchedChanges: readonly RecurringChange[];
}

function matches(change: RecurringChange, flow: DetectedRecurringFlow, label: string): boolean {
  const m = change.match.toLowerCase();
  return label.toLowerCase().includes(m) || flow.matchLabel.includes(m) || flow.key.toLowerCase() === m;
}

function scaled(a: AmountDistribution, factor: number): AmountDistribution {
  switch (a.kind) {
    case 'fixed':
      return { kind: 'fixed', value: Math.round(a.value * factor) };
    case 'normal':
      return { kind: 'normal', mean: a.mean * factor, sd: a.sd * factor };
    case 'empirical':
      return { kind: 'empirical', values: a.values.map((v) => Math.round(v * factor)) };
  }
}

/** Why a detected flow is or is not projected. */
export type RecurringSelection = 'projected' | 'dismissed' | 'ended' | 'unconfirmed';

/**
 * Whether a detected flow is projected: not dismissed by the user, not ended, and either
 * confirmed/edited or suggested with confidence ≥ AUTO_CONFIDENCE.
 * @example recurringSelection(flow, undefined) // 'projected' for a confident, ongoing flow
 */
export function recurringSelection(
  flow: DetectedRecurringFlow,
  decision: RecurringDecision | undefined,
): RecurringSelection {
  if (decision?.state === 'dismissed') return 'dismissed';
  if (flow.state === 'ended') return 'ended';
  if (!decision && flow.confidence < AUTO_CONFIDENCE) return 'unconfirmed';
  return 'projected';
}

/**
 * Ids of the history entries that the recurring flows account for, which therefore leave
 * the residual series: the members of projected flows (their future comes from their
 * schedule, also when a plan pauses them) and of ended flows (so a flow that stopped does
 * not echo on in the residual models). Members of dismissed flows and of unconfirmed
 * low-confidence suggestions stay in the residual series: they are neither projected nor
 * gone, and leaving them out of both would drop real money from the forecast.
 * @example residualSeries(history, explainedEntryIds(detected, decisions))
 */
export function explainedEntryIds(
  flows: readonly DetectedRecurringFlow[],
  decisions: readonly RecurringDecision[],
): Set<string> {
  const byKey = new Map(decisions.map((d) => [d.key, d]));
  const explained = new Set<string>();
  for (const flow of flows) {
    const selection = recurringSelection(flow, byKey.get(flow.key));
    if (selection === 'projected' || selection === 'ended') for (const id of flow.memberIds) explained.add(id);
  }
  return explained;
}

/** The nominal day (by `cadence`) that an occurrence seen on `day` belongs to: the nearest one, the earlier on a tie. */
function lastSeenNominal(cadence: Cadence, rule: DetectedRecurringFlow['businessDayRule'], day: number): number {
  const reach = Math.ceil(cadencePeriodDays(cadence)) + 7;
  let best = day;
  let distance = Infinity;
  for (const n of scheduleDays(cadence, day - reach, day + reach, rule)) {
    if (Math.abs(n - day) < distance) {
      best = n;
      distance = Math.abs(n - day);
    }
  }
  return best;
}

/**
 * The component of one occurrence due at offset `day` whose spread reaches back into the
 * history: conditioned on not having happened by the as-of date. With p the chance of an
 * occurrence and W the weight of the offsets that would have landed in the history, it
 * happens with probability p(1 − W)/(1 − pW), on the remaining offsets. Null when none remain.
 */
function dueComponent(
  base: Omit<RecurringComponent, 'key' | 'days' | 'amount'>,
  day: number,
  amount: AmountDistribution,
): Omit<RecurringComponent, 'key'> | null {
  const offsets: number[] = [];
  const weights: number[] = [];
  let total = 0;
  let before = 0;
  base.timing.offsets.forEach((o, i) => {
    const w = Math.max(0, base.timing.weights[i] ?? 0);
    total += w;
    if (day + o < 0) before += w;
    else {
      offsets.push(o);
      weights.push(w);
    }
  });
  if (offsets.length === 0 || total === 0) return null;
  const p = base.probability;
  const gone = before / total;
  return { ...base, days: [day], amount, timing: { offsets, weights }, probability: (p * (1 - gone)) / (1 - p * gone) };
}

/**
 * Builds the recurring components of a forecast.
 *
 * Which flows are projected: not ended, not dismissed, and either confirmed/edited by the
 * user or suggested with confidence ≥ AUTO_CONFIDENCE. Days are offsets from the first
 * forecast day (asOf + 1). The schedule continues after the nominal date of the last
 * occurrence the history shows, so an occurrence paid early (before the as-of date) is not
 * counted twice and one due on the as-of date but not paid yet is not lost; an occurrence
 * whose timing spread reaches back into the history is conditioned on not having happened
 * yet (see dueComponent).
 *
 * @example projectRecurring(flows, [], [], '2026-10-31', 90).components.length
 */
export function projectRecurring(
  flows: readonly DetectedRecurringFlow[],
  decisions: readonly RecurringDecision[],
  changes: readonly RecurringChange[],
  asOf: CalendarDate,
  horizon: number,
): RecurringProjection {
  const byKey = new Map(decisions.map((d) => [d.key, d]));
  const first = toDayNumber(asOf) + 1;
  const last = first + horizon - 1;
  const components: RecurringComponent[] = [];
  const projected: ProjectedRecurring[] = [];
  const skipped: { key: string; label: string; reason: string }[] = [];
  const used = new Set<RecurringChange>();
  for (const flow of flows) {
    const decision = byKey.get(flow.key);
    const label = decision?.edits?.label ?? flow.label;
    const selection = recurringSelection(flow, decision);
    if (selection === 'dismissed') {
      skipped.push({ key: flow.key, label, reason: 'dismissed by you' });
      continue;
    }
    if (selection === 'ended') {
      skipped.push({ key: flow.key, label, reason: `ended: last seen ${flow.lastDate}` });
      continue;
    }
    if (selection === 'unconfirmed') {
      skipped.push({
        key: flow.key,
        label,
        reason: `confidence ${Math.round(flow.confidence * 100)}% is below ${AUTO_CONFIDENCE * 100}%, so it stays with the other flows; confirm it to project it by its schedule`,
      });
      continue;
    }
    const cadence = decision?.edits?.cadence ?? flow.cadence;
    const offsets = flow.timing.offsets.length ? flow.timing.offsets : [0];
    const earliest = Math.min(...offsets);
    const latest = Math.max(...offsets);
    // Nominal dates after the one the last seen occurrence belongs to, from the first one
    // whose spread can still reach the forecast; two years ahead at least, so a yearly flow
    // beyond the horizon still has a next date.
    const seen = lastSeenNominal(cadence, flow.businessDayRule, toDayNumber(flow.lastDate));
    const scheduled = scheduleDays(
      cadence,
      Math.max(seen + 1, first - Math.max(0, latest)),
      Math.max(last, first + 730),
      flow.businessDayRule,
    ).map((d) => d - first);
    const amount: AmountDistribution =
      decision?.edits?.amount !== undefined
        ? { kind: 'fixed', value: decision.edits.amount }
        : flow.recentAmounts.length === 1 || new Set(flow.recentAmounts).size === 1
          ? { kind: 'fixed', value: flow.recentAmounts[0] ?? flow.typicalAmount }
          : { kind: 'empirical', values: flow.recentAmounts };
    const typical = decision?.edits?.amount ?? flow.typicalAmount;
    const timing = { offsets: flow.timing.offsets, weights: flow.timing.weights };
    const base = { kind: 'recurring' as const, label, timing, probability: Math.max(0.5, flow.probability) };
    // Each occurrence gets the product of the factors of the scalings in force on its day
    // and is dropped once a pause is in force; occurrences that share a factor form one
    // component. The unchanged ones keep the flow's own key (and so its random draws).
    const mine = changes.filter((c) => matches(c, flow, label));
    for (const c of mine) used.add(c);
    const fromDay = (c: RecurringChange) => (c.from ? toDayNumber(c.from) - first : Number.NEGATIVE_INFINITY);
    const paused = (d: number) => mine.some((c) => c.action === 'pause' && d >= fromDay(c));
    const factorOn = (d: number) => {
      let factor = 1;
      for (const c of mine) if (c.action === 'scale' && d >= fromDay(c)) factor *= c.factor;
      return factor;
    };
    const byFactor = new Map<number, number[]>();
    const pieces: RecurringComponent[] = [];
    for (const d of scheduled) {
      if (d >= horizon || paused(d)) continue;
      const factor = factorOn(d);
      if (d + earliest < 0) {
        // Due around the as-of date and not seen yet: it can only come from the first
        // forecast day on, so its timing is the flow's spread given that it has not happened
        // by the as-of date (offsets that land in the history removed, weights renormalised),
        // and its chance is that of happening given it has not happened yet.
        const due = dueComponent(base, d, factor === 1 ? amount : scaled(amount, factor));
        if (due) pieces.push({ ...due, key: `${flow.key}#due:${fromDayNumber(first + d)}` });
        continue;
      }
      const list = byFactor.get(factor);
      if (list) list.push(d);
      else byFactor.set(factor, [d]);
    }
    pieces.unshift(
      ...[...byFactor].map(([factor, pieceDays]) => ({
        ...base,
        key: factor === 1 ? flow.key : `${flow.key}#scaled×${factor}`,
        days: pieceDays,
        amount: factor === 1 ? amount : scaled(amount, factor),
      })),
    );
    components.push(...pieces);
    const next = scheduled.find((d) => d >= 0 && !paused(d)) ?? scheduled.find((d) => !paused(d));
    projected.push({
      flow,
      status: decision ? (decision.state === 'edited' ? 'edited' : 'confirmed') : 'suggested',
      label,
      cadence,
      amount: Math.round(typical * (next === undefined ? 1 : factorOn(next))),
      nextDate: next === undefined ? null : fromDayNumber(first + next),
    });
  }
  return { components, projected, skipped, unmatchedChanges: changes.filter((c) => !used.has(c)) };
}
