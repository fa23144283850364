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
  /** Typical signed amount per occurrence (minor units) after edits and plan scaling. */
  readonly amount: number;
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
    if (decision?.state === 'dismissed') {
      skipped.push({ key: flow.key, label, reason: 'dismissed by you' });
      continue;
    }
    if (flow.state === 'ended') {
      skipped.push({ key: flow.key, label, reason: `ended: last seen ${flow.lastDate}` });
      continue;
    }
    if (!decision && flow.confidence < AUTO_CONFIDENCE) {
      skipped.push({
        key: flow.key,
        label,
        reason: `confidence ${Math.round(flow.confidence * 100)}% is below ${AUTO_CONFIDENCE * 100}%; confirm it to include it`,
      });
      continue;
    }
    const cadence = decision?.edits?.cadence ?? flow.cadence;
    let days = scheduleDays(cadence, first, last, flow.businessDayRule).map((d) => d - first);
    let amount: AmountDistribution =
      decision?.edits?.amount !== undefined
        ? { kind: 'fixed', value: decision.edits.amount }
        : flow.recentAmounts.length === 1 || new Set(flow.recentAmounts).size === 1
          ? { kind: 'fixed', value: flow.recentAmounts[0] ?? flow.typicalAmount }
          : { kind: 'empirical', values: flow.recentAmounts };
    let typical = decision?.edits?.amount ?? flow.typicalAmount;
    const timing = { offsets: flow.timing.offsets, weights: flow.timing.weights };
    const base = { kind: 'recurring' as const, label, timing, probability: Math.max(0.5, flow.probability) };
    let pieces: RecurringComponent[] = [];
    for (const change of changes) {
      if (!matches(change, flow, label)) continue;
      used.add(change);
      const from = change.from ? toDayNumber(change.from) - first : 0;
      if (change.action === 'pause') {
        days = days.filter((d) => d < from);
      } else {
        const after = days.filter((d) => d >= from);
        days = days.filter((d) => d < from);
        if (after.length)
          pieces.push({ ...base, key: `${flow.key}#scaled`, days: after, amount: scaled(amount, change.factor) });
        typical = Math.round(typical * change.factor);
        if (from <= 0) amount = scaled(amount, change.factor);
      }
    }
    pieces = [{ ...base, key: flow.key, days, amount }, ...pieces].filter((p) => p.days.length > 0);
    components.push(...pieces);
    const next = pieces.flatMap((p) => p.days).sort((a, b) => a - b)[0];
    projected.push({
      flow,
      status: decision ? (decision.state === 'edited' ? 'edited' : 'confirmed') : 'suggested',
      label,
      cadence,
      amount: typical,
      nextDate: next === undefined ? flow.nextDate : fromDayNumber(first + next),
    });
  }
  return { components, projected, skipped, unmatchedChanges: changes.filter((c) => !used.has(c)) };
}
