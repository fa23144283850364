import { describe, expect, it } from 'vitest';
import type { DetectedRecurringFlow } from '../../engine/recurring/detectRecurringFlows';
import { cadenceFromForm, cadenceToForm, sameCadence } from '../../renderer/src/lib/recurring/cadenceForm';
import { groupRecurringRows, nextScheduledDate, recurringRows } from '../../renderer/src/lib/recurring/recurringRows';

const rent: DetectedRecurringFlow = {
  key: 'out:marram lettings:monthDay',
  label: 'Marram Lettings',
  matchLabel: 'marram lettings',
  direction: 'outflow',
  cadence: { kind: 'monthDay', everyMonths: 1, day: 1, phase: 0 },
  cadenceText: 'monthly on the 1st',
  businessDayRule: 'following',
  recentAmounts: [-121000],
  typicalAmount: -121000,
  amountVariation: 0,
  timing: { offsets: [0], weights: [1] },
  probability: 1,
  occurrences: 36,
  firstDate: '2023-11-01',
  lastDate: '2026-10-01',
  nextDate: '2026-11-02',
  confidence: 0.96,
  state: 'suggested',
  memberIds: [],
};
const vat: DetectedRecurringFlow = {
  ...rent,
  key: 'out:vat:monthDay',
  label: 'Office of Indirect Taxes',
  confidence: 0.6,
};

describe('recurringRows', () => {
  it('applies decisions: confirmed, edited (label, amount, cadence and its next date), dismissed', () => {
    const rows = recurringRows(
      [rent, vat],
      [
        {
          key: rent.key,
          state: 'edited',
          edits: {
            label: 'Studio rent',
            amount: -125000,
            cadence: { kind: 'monthDay', everyMonths: 1, day: 15, phase: 0 },
          },
        },
        { key: vat.key, state: 'dismissed' },
      ],
      '2026-10-31',
    );
    expect(rows[0]).toMatchObject({
      state: 'edited',
      label: 'Studio rent',
      amount: -125000,
      cadenceText: 'monthly on the 15th',
      nextDate: '2026-11-16', // the 15th is a Sunday; the flow moves to the following business day
    });
    expect(rows[1]).toMatchObject({ state: 'dismissed', label: 'Office of Indirect Taxes', nextDate: '2026-11-02' });
    const groups = groupRecurringRows(rows);
    expect(groups.confirmed.map((r) => r.key)).toEqual([rent.key]);
    expect(groups.dismissed.map((r) => r.key)).toEqual([vat.key]);
    expect(groups.suggested).toEqual([]);
  });

  it('shows a flow without decision as suggested, and an ended one without next date', () => {
    const rows = recurringRows([{ ...rent, state: 'ended' }, vat], [], '2026-10-31');
    expect(rows.map((r) => r.state)).toEqual(['suggested', 'suggested']);
    expect(rows[0]).toMatchObject({ ended: true, nextDate: null });
  });

  it('finds the next scheduled date after the as-of date', () => {
    expect(nextScheduledDate({ kind: 'lastBusinessDay', everyMonths: 1, phase: 0 }, '2026-10-31', 'none')).toBe(
      '2026-11-30',
    );
    expect(nextScheduledDate({ kind: 'weekly', everyWeeks: 1, weekday: 6, phase: 0 }, '2026-10-31', 'none')).toBe(
      '2026-11-07',
    );
  });
});

describe('cadence form', () => {
  it('round-trips every cadence kind, keeping the phase when the period stays', () => {
    const cadences = [
      { kind: 'weekly', everyWeeks: 2, weekday: 6, phase: 1 },
      { kind: 'monthDay', everyMonths: 3, day: 15, phase: 2 },
      { kind: 'monthWeekday', everyMonths: 1, nth: -1, weekday: 5, phase: 0 },
      { kind: 'lastBusinessDay', everyMonths: 1, phase: 0 },
    ] as const;
    for (const c of cadences) {
      const back = cadenceFromForm(cadenceToForm(c), c, '2026-10-31');
      expect(typeof back === 'object' && sameCadence(back, c)).toBe(true);
    }
  });

  it('takes the phase from the last occurrence when the period changes', () => {
    // 2026-10 is month index 2026·12 + 9 = 24321; 24321 mod 3 = 0.
    expect(
      cadenceFromForm({ kind: 'monthDay', every: 3, weekday: 1, day: 15, nth: 1 }, rent.cadence, '2026-10-15'),
    ).toEqual({
      kind: 'monthDay',
      everyMonths: 3,
      day: 15,
      phase: 0,
    });
    const weekly = cadenceFromForm({ kind: 'weekly', every: 2, weekday: 6, day: 1, nth: 1 }, undefined, '2026-10-31');
    expect(typeof weekly === 'object' && weekly.kind === 'weekly' && weekly.phase >= 0 && weekly.phase < 2).toBe(true);
  });

  it('names the wrong field', () => {
    expect(
      cadenceFromForm({ kind: 'monthDay', every: 1, weekday: 1, day: 32, nth: 1 }, undefined, '2026-10-31'),
    ).toMatch(/^Day:/);
    expect(cadenceFromForm({ kind: 'weekly', every: 0, weekday: 1, day: 1, nth: 1 }, undefined, '2026-10-31')).toMatch(
      /^Every:/,
    );
    expect(
      cadenceFromForm({ kind: 'monthWeekday', every: 1, weekday: 1, day: 1, nth: 7 }, undefined, '2026-10-31'),
    ).toMatch(/^Which:/);
  });
});
