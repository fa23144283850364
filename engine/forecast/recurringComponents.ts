/**
 * Projects recurring flows into simulation components: each flow's future schedule within
 * the horizon, its learned amounts and timing spread, and the user's decisions and the
 * plan's pauses and scalings applied on top.
 */
import { fromDayNumber, toDayNumber, type CalendarDate } from '../core/dates';
import { scheduleDays, type Cadence } from '../recurring/cadence';
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

/**
 * Builds the recurring components of a forecast.
 *
 * Which flows are projected: not ended, not dismissed, and either confirmed/edited by the
 * user or suggested with confidence ≥ AUTO_CONFIDENCE. Days are offsets from the first
 * forecast day (asOf + 1).
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
    // Two years ahead at least, so a yearly flow beyond the horizon still has a next date.
    const scheduled = scheduleDays(cadence, first, Math.max(last, first + 730), flow.businessDayRule).map(
      (d) => d - first,
    );
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
    for (const d of scheduled) {
      if (d >= horizon || paused(d)) continue;
      const factor = factorOn(d);
      const list = byFactor.get(factor);
      if (list) list.push(d);
      else byFactor.set(factor, [d]);
    }
    const pieces: RecurringComponent[] = [...byFactor].map(([factor, pieceDays]) => ({
      ...base,
      key: factor === 1 ? flow.key : `${flow.key}#scaled×${factor}`,
      days: pieceDays,
      amount: factor === 1 ? amount : scaled(amount, factor),
    }));
    components.push(...pieces);
    const next = scheduled.find((d) => !paused(d));
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
