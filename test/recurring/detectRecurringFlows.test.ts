import { describe, expect, it } from 'vitest';
import { detectRecurringFlows, type RecurringInput } from '../../engine/recurring/detectRecurringFlows';
import { describeCadence, scheduleDays } from '../../engine/recurring/cadence';
import { adjustBusinessDay, lastBusinessDayOfMonth } from '../../engine/recurring/businessDays';
import { normaliseLabel } from '../../engine/recurring/normaliseLabel';
import { addDays, daysFromCivil, fromDayNumber, isoWeekday, toDayNumber } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';

const d = toDayNumber;

describe('business-day rules', () => {
  it('follows the 2006 ISDA Definitions section 4.12 examples', () => {
    // Source: 2006 ISDA Definitions section 4.12, via REFERENCES.md: Saturday 31 May 2025 →
    // Monday 2 June (Following), Friday 30 May (Modified Following).
    expect(fromDayNumber(adjustBusinessDay(d('2025-05-31'), 'following'))).toBe('2025-06-02');
    expect(fromDayNumber(adjustBusinessDay(d('2025-05-31'), 'modifiedFollowing'))).toBe('2025-05-30');
    expect(fromDayNumber(adjustBusinessDay(d('2025-05-31'), 'preceding'))).toBe('2025-05-30');
    expect(fromDayNumber(adjustBusinessDay(d('2025-05-30'), 'following'))).toBe('2025-05-30');
  });

  it('finds the last business day of a month', () => {
    expect(fromDayNumber(lastBusinessDayOfMonth(2025, 5))).toBe('2025-05-30'); // 31st is a Saturday
    expect(fromDayNumber(lastBusinessDayOfMonth(2024, 2))).toBe('2024-02-29'); // leap day, a Thursday
  });
});

describe('schedules', () => {
  it('clamps the 31st to short months, leap years included', () => {
    const days = scheduleDays(
      { kind: 'monthDay', everyMonths: 1, day: 31, phase: 0 },
      d('2024-01-01'),
      d('2024-04-30'),
      'none',
    );
    expect(days.map(fromDayNumber)).toEqual(['2024-01-31', '2024-02-29', '2024-03-31', '2024-04-30']);
  });

  it('places the nth and last weekday', () => {
    const second = scheduleDays(
      { kind: 'monthWeekday', everyMonths: 1, nth: 2, weekday: 2, phase: 0 },
      d('2025-01-01'),
      d('2025-03-31'),
      'none',
    );
    expect(second.map(fromDayNumber)).toEqual(['2025-01-14', '2025-02-11', '2025-03-11']);
    const last = scheduleDays(
      { kind: 'monthWeekday', everyMonths: 1, nth: -1, weekday: 5, phase: 0 },
      d('2025-01-01'),
      d('2025-02-28'),
      'none',
    );
    expect(last.map(fromDayNumber)).toEqual(['2025-01-31', '2025-02-28']);
  });

  it('describes a clamped 31st as the month end', () => {
    expect(describeCadence({ kind: 'monthDay', everyMonths: 1, day: 31, phase: 0 })).toBe(
      'monthly on the last day of the month',
    );
    expect(describeCadence({ kind: 'monthDay', everyMonths: 1, day: 30, phase: 0 })).toBe('monthly on the 30th');
  });

  it('keeps the quarter phase', () => {
    const phase = (2025 * 12 + 0) % 3; // January
    const q = scheduleDays(
      { kind: 'monthDay', everyMonths: 3, day: 10, phase },
      d('2025-01-01'),
      d('2025-12-31'),
      'none',
    );
    expect(q.map(fromDayNumber)).toEqual(['2025-01-10', '2025-04-10', '2025-07-10', '2025-10-10']);
  });
});

describe('normaliseLabel', () => {
  it('drops references, numbers and trade noise but keeps the payee', () => {
    expect(normaliseLabel('SEPA DD Kilnworks Power Co. ref 2025-03 / 4471')).toBe('kilnworks power co');
    expect(normaliseLabel('Kilnworks Power Co ref 2025-04/4502')).toBe('kilnworks power co');
    expect(normaliseLabel('Zoë Café Ümlaut')).toBe('zoe cafe umlaut');
  });
});

/** A history with known schedules, plus noise that must not be taken for a schedule. */
function history(): { entries: RecurringInput[]; asOf: string } {
  const rng = createRng(2024);
  const entries: RecurringInput[] = [];
  let n = 0;
  const add = (date: string, amount: number, description: string, counterparty?: string) =>
    entries.push({ id: `t${n++}`, date, amount, description, counterparty });
  for (let m = 0; m < 24; m++) {
    const year = 2024 + Math.floor(m / 12);
    const month = (m % 12) + 1;
    // Rent on the 1st, moved to the next business day.
    add(
      fromDayNumber(adjustBusinessDay(daysFromCivil(year, month, 1), 'following')),
      -95_000,
      `Rent ${month}/${year}`,
      'Quayside Lettings',
    );
    // Electricity around the 5th with a seasonal amount.
    add(
      fromDayNumber(daysFromCivil(year, month, 5) + rng.nextInt(3)),
      -(14_000 + Math.round(6_000 * Math.cos((month / 12) * 2 * Math.PI))),
      `Kilnworks Power ref ${year}-${month}`,
      'Kilnworks Power',
    );
    // Owner's draw on the last business day.
    add(fromDayNumber(lastBusinessDayOfMonth(year, month)), -250_000, "Owner's draw", 'Household');
    // VAT in January, April, July, October on the 10th.
    if (month % 3 === 1)
      add(
        `${year}-${String(month).padStart(2, '0')}-10`,
        -(300_000 + rng.nextInt(50_000)),
        `VAT Q ${year}`,
        'Tax Office North',
      );
    // A subscription that ended after 9 months.
    if (m < 9) add(`${year}-${String(month).padStart(2, '0')}-15`, -1_299, 'Glazebook subscription');
  }
  // Saturday market takings: weekly but far too noisy to be a fixed payment.
  for (let day = d('2024-01-06'); day <= d('2025-12-27'); day += 7) {
    add(fromDayNumber(day), 5_000 + rng.nextInt(60_000), 'Market stall takings', 'Card terminal');
  }
  // Irregular one-offs.
  for (let i = 0; i < 30; i++)
    add(
      addDays('2024-01-01', rng.nextInt(700)),
      -(1_000 + rng.nextInt(20_000)),
      `Supplies order ${i}`,
      `Clayhouse ${['North', 'South', 'East'][i % 3]}`,
    );
  return { entries, asOf: '2025-12-31' };
}

describe('detectRecurringFlows', () => {
  const { entries, asOf } = history();
  const flows = detectRecurringFlows(entries, { asOf });
  const byLabel = (label: string) => flows.find((f) => f.matchLabel === label);

  it('finds monthly rent with its business-day rule and next date', () => {
    const rent = byLabel('quayside lettings');
    expect(rent?.cadence).toMatchObject({ kind: 'monthDay', everyMonths: 1, day: 1 });
    expect(rent?.businessDayRule).toBe('following');
    expect(rent?.cadenceText).toBe('monthly on the 1st');
    expect(rent?.occurrences).toBe(24);
    expect(rent?.probability).toBe(1);
    expect(rent?.nextDate).toBe('2026-01-01'); // a Thursday
    expect(rent?.recentAmounts).toEqual([-95_000, -95_000, -95_000]);
    expect(rent?.state).toBe('suggested');
  });

  it('finds the last-business-day draw and the quarterly VAT', () => {
    expect(byLabel('household')?.cadence.kind).toBe('lastBusinessDay');
    expect(byLabel('household')?.nextDate).toBe('2026-01-30');
    const vat = byLabel('tax office north');
    expect(vat?.cadence).toMatchObject({ kind: 'monthDay', everyMonths: 3, day: 10 });
    expect(vat?.nextDate).toBe('2026-01-10');
  });

  it('learns the timing spread and a varying amount of the electricity debit', () => {
    const power = byLabel('kilnworks power');
    expect(power?.cadence).toMatchObject({ kind: 'monthDay', everyMonths: 1 });
    expect(power?.timing.offsets.length).toBeGreaterThan(1);
    expect(power!.timing.weights.reduce((a, b) => a + b, 0)).toBe(24);
    expect(power!.amountVariation).toBeGreaterThan(0.1);
    expect(new Set(power!.recentAmounts).size).toBeGreaterThan(3);
  });

  it('reports a series that stopped as ended, with no next date', () => {
    const sub = flows.find((f) => f.matchLabel === 'glazebook subscription');
    expect(sub?.state).toBe('ended');
    expect(sub?.nextDate).toBeNull();
  });

  it('leaves noisy weekly takings and irregular orders to the residual flows', () => {
    expect(byLabel('card terminal')).toBeUndefined();
    expect(flows.some((f) => f.matchLabel.startsWith('clayhouse'))).toBe(false);
  });

  it('tolerates a missed occurrence and reports the share that happened', () => {
    const skipped = entries.filter((e) => !(e.counterparty === 'Quayside Lettings' && e.date.startsWith('2025-03')));
    const rent = detectRecurringFlows(skipped, { asOf }).find((f) => f.matchLabel === 'quayside lettings');
    expect(rent?.occurrences).toBe(23);
    expect(rent?.probability).toBeCloseTo(23 / 24, 10);
  });

  it('finds a fortnightly flow on its weekday', () => {
    const fortnightly: RecurringInput[] = [];
    for (let i = 0; i < 20; i++)
      fortnightly.push({
        id: `f${i}`,
        date: fromDayNumber(d('2025-01-03') + 14 * i),
        amount: 180_000,
        description: 'Wages Pottery Guild',
      });
    const [flow] = detectRecurringFlows(fortnightly, { asOf: fromDayNumber(d('2025-01-03') + 14 * 19 + 3) });
    expect(flow?.cadence).toMatchObject({ kind: 'weekly', everyWeeks: 2, weekday: isoWeekday(d('2025-01-03')) });
    expect(flow?.cadenceText).toBe('every 2 weeks on Friday');
  });
});
