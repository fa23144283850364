/**
 * The rows of the Recurring flows screen: each detected flow with the user's decision
 * applied (the label, cadence and amount the forecast will use), grouped as suggested,
 * confirmed (confirmed or edited) and dismissed.
 */
import { fromDayNumber, toDayNumber } from '../../../../engine/core/dates';
import type { RecurringDecision } from '../../../../engine/forecast/recurringComponents';
import { cadencePeriodDays, describeCadence, scheduleDays, type Cadence } from '../../../../engine/recurring/cadence';
import type { DetectedRecurringFlow } from '../../../../engine/recurring/detectRecurringFlows';

export type RecurringRowState = 'suggested' | 'confirmed' | 'edited' | 'dismissed';

export interface RecurringRow {
  readonly key: string;
  readonly flow: DetectedRecurringFlow;
  readonly decision: RecurringDecision | undefined;
  readonly state: RecurringRowState;
  readonly label: string;
  readonly cadence: Cadence;
  readonly cadenceText: string;
  /** Typical signed amount per occurrence, minor units. */
  readonly amount: number;
  readonly nextDate: string | null;
  /** The detector found the series stopped (not projected). */
  readonly ended: boolean;
}

/** First scheduled day of `cadence` after `asOf` (null when none within a period + 40 days). */
export function nextScheduledDate(
  cadence: Cadence,
  asOf: string,
  rule: DetectedRecurringFlow['businessDayRule'],
): string | null {
  const from = toDayNumber(asOf) + 1;
  const days = scheduleDays(cadence, from, from + Math.ceil(cadencePeriodDays(cadence)) + 40, rule);
  return days.length > 0 ? fromDayNumber(days[0] as number) : null;
}

/**
 * Merges detected flows with decisions (by key). A decision about a flow no longer
 * detected is kept in storage but has no row.
 * @example recurringRows(flows, [{ key: flows[0].key, state: 'confirmed' }], '2026-10-31')[0].state // 'confirmed'
 */
export function recurringRows(
  flows: readonly DetectedRecurringFlow[],
  decisions: readonly RecurringDecision[],
  asOf: string,
): RecurringRow[] {
  const byKey = new Map(decisions.map((d) => [d.key, d]));
  return flows.map((flow) => {
    const decision = byKey.get(flow.key);
    const edits = decision?.state === 'dismissed' ? undefined : decision?.edits;
    const cadence = edits?.cadence ?? flow.cadence;
    const ended = flow.state === 'ended';
    return {
      key: flow.key,
      flow,
      decision,
      state: decision ? decision.state : 'suggested',
      label: edits?.label ?? flow.label,
      cadence,
      cadenceText: edits?.cadence ? describeCadence(cadence) : flow.cadenceText,
      amount: edits?.amount ?? flow.typicalAmount,
      nextDate: ended ? null : edits?.cadence ? nextScheduledDate(cadence, asOf, flow.businessDayRule) : flow.nextDate,
      ended,
    };
  });
}

/** Rows split into the screen's three groups, each in detection order (most confident first). */
export function groupRecurringRows(rows: readonly RecurringRow[]): {
  suggested: RecurringRow[];
  confirmed: RecurringRow[];
  dismissed: RecurringRow[];
} {
  return {
    suggested: rows.filter((r) => r.state === 'suggested'),
    confirmed: rows.filter((r) => r.state === 'confirmed' || r.state === 'edited'),
    dismissed: rows.filter((r) => r.state === 'dismissed'),
  };
}
