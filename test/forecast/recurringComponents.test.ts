import { describe, expect, it } from 'vitest';
import { addDays, daysBetween } from '../../engine/core/dates';
import { projectRecurring } from '../../engine/forecast/recurringComponents';
import { detectRecurringFlows } from '../../engine/recurring/detectRecurringFlows';
import { buildHistory, type DailyFlow } from './histories';

// A salary due on the 25th, paid a day early, on the day or a day late by a fixed rotation
// of the months: the timing spread is learned from the history.
const ROTATION = [0, -1, 0, 1, 0];
const shiftOfMonth = (yearMonth: string) =>
  ROTATION[(Number(yearMonth.slice(0, 4)) * 12 + Number(yearMonth.slice(5, 7))) % ROTATION.length];
const salary: DailyFlow = (date) => {
  for (const shift of [-1, 0, 1]) {
    const nominal = addDays(date, -shift);
    if (nominal.endsWith('-25') && shiftOfMonth(nominal) === shift) return 250_000;
  }
  return 0;
};

function flowAsOf(asOf: string) {
  const days = daysBetween('2025-01-01', asOf) + 1;
  const h = buildHistory({ days, flows: [{ description: 'Salary', counterparty: 'Employer BV', flow: salary }] });
  const flows = detectRecurringFlows(h.entries, { asOf: h.asOf });
  expect(flows).toHaveLength(1);
  return { h, flow: flows[0]! };
}

describe('projectRecurring around the as-of date', () => {
  it('learns the timing spread of the salary', () => {
    const { flow } = flowAsOf('2025-12-31');
    expect(flow.timing.offsets).toEqual([-1, 0, 1]);
  });

  it('does not count an occurrence twice when it was paid early, before the as-of date', () => {
    // A month whose salary came a day early: forecast from its 24th, the day it was paid.
    const early = ['2025-06', '2025-07', '2025-08', '2025-09', '2025-10', '2025-11'].find(
      (m) => shiftOfMonth(m) === -1,
    )!;
    const asOf = `${early}-24`;
    const { h, flow } = flowAsOf(asOf);
    expect(flow.lastDate).toBe(asOf);
    const p = projectRecurring([flow], [], [], h.asOf, 40);
    const days = p.components.flatMap((c) => c.days);
    // The next salary is next month's, about 31 days on, not tomorrow's.
    expect(Math.min(...days)).toBeGreaterThan(25);
    expect(p.projected[0]?.nextDate?.slice(8)).toBe('25');
    expect(p.projected[0]?.nextDate?.slice(0, 7)).not.toBe(early);
  });

  it('keeps an occurrence due tomorrow that could have come today, on the offsets still possible', () => {
    const onTime = ['2025-06', '2025-07', '2025-08', '2025-09', '2025-10', '2025-11'].find(
      (m) => shiftOfMonth(m) !== -1,
    )!;
    const asOf = `${onTime}-24`;
    const { h, flow } = flowAsOf(asOf);
    const p = projectRecurring([flow], [], [], h.asOf, 40);
    const due = p.components.find((c) => c.key.includes('#due:'));
    expect(due?.days).toEqual([0]);
    expect(due?.timing.offsets).toEqual([0, 1]);
    // Certain to happen (it always has), so certain to happen on day 0 or 1 now.
    expect(due?.probability).toBeCloseTo(1, 12);
    expect(p.projected[0]?.nextDate).toBe(addDays(asOf, 1));
    // And the month after follows the flow's own spread.
    const rest = p.components.find((c) => c.key === flow.key);
    expect(rest?.timing.offsets).toEqual([-1, 0, 1]);
  });
});
