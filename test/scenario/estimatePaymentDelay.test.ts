import { describe, expect, it } from 'vitest';
import { addDays } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import type { HistoryEntry } from '../../engine/forecast/history';
import { plannedComponents } from '../../engine/forecast/plannedComponents';
import type { PlannedItem } from '../../engine/plan/plan';
import {
  delayDistributionOf,
  delayMoments,
  sampleDelay,
  uniformDelayRange,
} from '../../engine/scenario/delayDistribution';
import { estimatePaymentDelay } from '../../engine/scenario/estimatePaymentDelay';
import { findInvoicePayments, invoiceReferenceOf } from '../../engine/scenario/findInvoicePayments';
import { simulateBalances } from '../../engine/simulate/simulateBalances';

let id = 0;
function entry(date: string, amount: number, description: string, counterparty?: string): HistoryEntry {
  return { id: `t${++id}`, date, amount, description, counterparty };
}

describe('findInvoicePayments', () => {
  it('finds invoice numbers and invoice words in incoming payments only', () => {
    const entries = [
      entry('2026-01-05', 120_000, 'Payment INV-2025-031 commission', 'Saltmarrow Cafe'),
      entry('2026-01-06', 50_000, 'Zahlung Rechnung Nr. 4711', 'Kunde GmbH'),
      entry('2026-01-07', 40_000, 'Pago factura F-0042', 'Cliente SL'),
      entry('2026-01-08', 30_000, 'Invoice payment, thank you', 'Someone'),
      entry('2026-01-09', -30_000, 'Supplier invoice INV-9912', 'Riverclay'),
      entry('2026-01-10', 10_000, 'RE: 12 mugs', 'Friend'),
      entry('2026-01-11', 25_000, 'Card takings market', 'Tillpoint'),
    ];
    const found = findInvoicePayments(entries);
    expect(found.map((p) => [p.reference, p.matchedBy])).toEqual([
      ['INV-2025-031', 'number'],
      ['RECHNUNG NR. 4711', 'number'],
      ['FACTURA F-0042', 'number'],
      [null, 'word'],
    ]);
    expect(invoiceReferenceOf('FV/2025/07/001 zapłata')).toBe('FV/2025/07/001');
    expect(invoiceReferenceOf('inv 12')).toBeNull();
  });
});

describe('estimatePaymentDelay', () => {
  // Common practice, no source: "net 30" means due 30 days after the invoice date.
  // Net 30 invoices with known lateness (days after the due date).
  const late = [0, 5, 10, 10, 20, -2];
  const invoices = late.map((_, i) => ({
    reference: `INV-2025-0${30 + i}`,
    issued: addDays('2025-03-01', 20 * i),
    termsDays: 30,
  }));
  const paid = invoices.map((inv, i) =>
    entry(
      addDays(inv.issued, 30 + (late[i] as number)),
      100_000 + i,
      `Payment ${inv.reference} tableware`,
      'Brackenfold Hotel',
    ),
  );
  // INV-2025-3 is a different invoice: its number is a prefix of INV-2025-030 once compacted.
  const decoy = entry('2025-03-05', 5_000, 'Payment INV-2025-3 deposit', 'Brackenfold Hotel');

  it('measures lateness against the entered invoice dates and terms', () => {
    const est = estimatePaymentDelay([decoy, ...paid], { invoices, fallback: { min: 0, max: 30 } });
    expect(est.method).toBe('invoice dates');
    expect(est.observed.map((o) => o.daysLate)).toEqual(late);
    expect(est.distribution).toEqual(delayDistributionOf(late));
    expect(est.meanDays).toBeCloseTo(43 / 6, 12);
    expect(est.explanation).toMatch(/1 of 6 paid early/);
  });

  it('finds an entered invoice number however the payer wrote it, but not inside a longer number', () => {
    const invs = [0, 1, 2, 3].map((i) => ({
      reference: `4711-${i}`,
      issued: addDays('2025-01-01', 30 * i),
      termsDays: 14,
    }));
    const pays = [
      entry('2025-01-20', 1, 'Zahlung 4711 / 0 danke', 'Kunde'), // no invoice word: still matched by number
      entry('2025-02-10', 1, 'ref 94711-1', 'Kunde'), // a longer number: not this invoice
      entry('2025-02-20', 1, 'ref 4711.1', 'Kunde'),
      entry('2025-03-20', 1, '4711 2', 'Kunde'),
      entry('2025-04-30', 1, 'payment 47112 and 4711-3', 'Kunde'),
    ];
    const est = estimatePaymentDelay(pays, { invoices: invs, fallback: { min: 0, max: 0 } });
    expect(est.observed.map((o) => [o.reference, o.paid, o.daysLate])).toEqual([
      ['4711-0', '2025-01-20', 5],
      ['4711-1', '2025-02-20', 6],
      ['4711-2', '2025-03-20', 4], // issued 2 Mar, due 16 Mar
      ['4711-3', '2025-04-30', 15], // issued 1 Apr, due 15 Apr
    ]);
  });

  it('says when overdue invoices are still open, since they would lengthen the estimate', () => {
    const open = { reference: 'INV-2025-099', issued: '2025-06-01', termsDays: 30 };
    const est = estimatePaymentDelay(paid, {
      invoices: [...invoices, open],
      fallback: { min: 0, max: 30 },
      asOf: '2025-09-30',
    });
    expect(est.explanation).toMatch(/1 overdue invoice is still unpaid \(up to 91 days so far\)/);
  });

  it('learns from monthly spacing against the given due day, across month ends', () => {
    // Due on the 28th; paid on 28 Jan (0), 2 Mar (2 after 28 Feb), 30 Mar (2), 5 May (7 after 28 Apr), 26 May (−2):
    // a late payer settling two months' invoices in March.
    const monthly = [
      entry('2026-01-28', 80_000, 'Rechnung 2026-01', 'Cafe Monthly'),
      entry('2026-03-02', 80_000, 'Rechnung 2026-02', 'Cafe Monthly'),
      entry('2026-03-30', 80_000, 'Rechnung 2026-03', 'Cafe Monthly'),
      entry('2026-05-05', 80_000, 'Rechnung 2026-04', 'Cafe Monthly'),
      entry('2026-05-26', 80_000, 'Rechnung 2026-05', 'Cafe Monthly'),
    ];
    // Payments 21 days apart (5 and 26 May) still read as monthly; 4 days apart do not.
    expect(estimatePaymentDelay(monthly, { dueDay: 28, fallback: { min: 1, max: 3 } }).method).toBe('monthly spacing');
    const split = [...monthly, entry('2026-05-30', 80_000, 'Rechnung 2026-05 Rest', 'Cafe Monthly')];
    expect(estimatePaymentDelay(split, { dueDay: 28, fallback: { min: 1, max: 3 } }).method).toBe('fallback');
    const oncePerMonth = monthly.slice(0, 4);
    const est = estimatePaymentDelay(oncePerMonth, {
      counterparty: 'cafe monthly',
      dueDay: 28,
      fallback: { min: 0, max: 0 },
    });
    expect(est.method).toBe('monthly spacing');
    expect(est.observed.map((o) => [o.due, o.daysLate])).toEqual([
      ['2026-01-28', 0],
      ['2026-02-28', 2],
      ['2026-03-28', 2],
      ['2026-04-28', 7],
    ]);
    // Without the due day, the counterparty's own earliest usual day (the 28th) is used, and the text says so.
    const habitual = estimatePaymentDelay(oncePerMonth, { fallback: { min: 0, max: 0 } });
    expect(habitual.observed.map((o) => o.daysLate)).toEqual([0, 2, 2, 7]);
    expect(habitual.explanation).toMatch(/earliest usual payment day \(day 28/);
  });

  it('falls back to the user’s range when there is too little to learn from', () => {
    const est = estimatePaymentDelay(paid.slice(0, 2), { invoices, fallback: { min: 30, max: 60 } });
    expect(est.method).toBe('fallback');
    expect(est.delayDays).toEqual({ min: 30, max: 60 });
    expect(est.distribution.offsets).toHaveLength(31);
    expect(est.explanation).toMatch(/Only 2 of the entered invoices/);
    expect(() => estimatePaymentDelay([], { fallback: { min: 5, max: 1 } })).toThrow(/fallback/);
  });
});

describe('delay distributions and the plan range', () => {
  it('samples each delay with its observed frequency', () => {
    const dist = delayDistributionOf([0, 0, 0, 4, 4, 9, 15, 15, 15, 15]);
    const rng = createRng(99);
    const n = 20_000;
    const counts = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const d = sampleDelay(dist, rng);
      counts.set(d, (counts.get(d) ?? 0) + 1);
    }
    expect([...counts.keys()].sort((a, b) => a - b)).toEqual([0, 4, 9, 15]);
    dist.offsets.forEach((o, i) => {
      const p = dist.weights[i] as number;
      const se = Math.sqrt((p * (1 - p)) / n);
      expect(Math.abs((counts.get(o) ?? 0) / n - p)).toBeLessThan(4 * se);
    });
  });

  it('matches the uniform range’s mean and spread to the observed delays', () => {
    const dist = delayDistributionOf([3, 8, 12, 14, 20, 25, 31, 40]);
    const { mean, sd } = delayMoments(dist);
    const r = uniformDelayRange(dist);
    const width = r.max - r.min;
    expect(Math.abs((r.min + r.max) / 2 - mean)).toBeLessThanOrEqual(0.5);
    expect(Math.abs(Math.sqrt(((width + 1) ** 2 - 1) / 12) - sd)).toBeLessThan(0.6);
    // Early payments count as on time; a range never starts below 0.
    expect(uniformDelayRange(delayDistributionOf([-10, -5, 0, 1])).min).toBe(0);
  });

  it('the range, used as a plan item’s delayDays, lands payments uniformly on those days', () => {
    const est = estimatePaymentDelay([entry('2026-01-01', 1, 'x')], { fallback: { min: 3, max: 7 } });
    const item: PlannedItem = {
      label: 'Late invoice',
      amount: -100,
      date: '2026-02-10',
      probability: 1,
      delayDays: est.delayDays,
      every: null,
      until: null,
    };
    const components = plannedComponents([item], '2026-01-31', 30);
    const paths = 5000;
    const sim = simulateBalances({ startBalance: 0, horizon: 30, paths, seed: 3, threshold: 0, components });
    const nominal = 9; // 2026-02-10 is day offset 9 after 2026-01-31
    const counts = new Array<number>(5).fill(0);
    for (let p = 0; p < paths; p++) counts[(sim.firstCrossing[p] as number) - nominal - 3]! += 1;
    const se = Math.sqrt((0.2 * 0.8) / paths);
    for (const c of counts) expect(Math.abs(c / paths - 0.2)).toBeLessThan(4 * se);
    expect(counts.reduce((a, b) => a + b, 0)).toBe(paths);
  });
});
