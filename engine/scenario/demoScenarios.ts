/**
 * The ready-made scenarios of the invented demo workspace "Tessellate Ceramics"
 * (resources/demo/generate.ts), as plan documents (`ebbline.plan/1`, amounts in major
 * units, exactly what the CLI's `--plan` file and the app's scenarios hold).
 *
 * Scale, from the generator: the business current account closes at about 16,600 EUR on
 * 2026-10-31; each month it pays rent (925), the owner's draw (2,050), electricity, pitch
 * fee, phone, supplies and a tax-reserve transfer, about 4,500 EUR in all with the
 * quarterly VAT; commissions are invoiced on net-30 terms (350–3,200 EUR, paid from a few
 * days early to about 55 days late). The balance grows over a normal quarter, so the
 * story is told against a cushion rather than against zero: the owner wants to keep
 * 12,000 EUR, a little under three months of those outgoings, in the account.
 *
 * The story: a large commission (6,000 EUR, a hotel's dinner service) is due in
 * mid-November. Paying late on its own moves the balance for a month but barely the
 * chance of dipping below the cushion; a new kiln bought on credit (3,600 deposit, 24
 * instalments of 450) raises it; both together raise it most. That is what the demo
 * history gives (test/scenario/demoScenarios.test.ts checks the order and size of the
 * effects), not a promise about any real business. Every name is invented.
 */
import { addDays, addMonths, formatYmd, isWeekend, parseIsoDate, toDayNumber, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { PLAN_SCHEMA } from '../plan/plan';
import { formatAmount, formatDate } from '../report/plainFormat';

/** Last statement day of the demo workspace. */
export const DEMO_AS_OF: CalendarDate = '2026-10-31';
/** The demo owner's cushion, in major units (EUR), used as the comparison's threshold. */
export const DEMO_CUSHION = 12000;
/** The large commission: amount (EUR) and invoice. */
export const DEMO_COMMISSION = {
  label: 'Brackenfold Hotel dinner service commission INV-2026-014',
  amount: 6000,
  /** Days before the as-of date that the invoice was issued; terms net 30. */
  issuedDaysBeforeAsOf: 15,
  termsDays: 30,
  /** Usual lateness of the studio's commission clients (days after the due date). */
  usualDelay: { min: 0, max: 20 },
  /** The late case: 30–60 days after the due date. */
  lateDelay: { min: 30, max: 60 },
} as const;
/** The new kiln: deposit and monthly instalments (EUR). */
export const DEMO_KILN = { deposit: 3600, instalment: 450, instalments: 24 } as const;

/** A plan document as it is written to a file (major units). */
export interface PlanItemDocument {
  readonly label: string;
  readonly amount: number;
  readonly date: CalendarDate;
  readonly probability: number;
  readonly delayDays: { readonly min: number; readonly max: number };
  readonly every: null | 'month';
  readonly until?: CalendarDate;
}
export interface PlanDocument {
  readonly schema: typeof PLAN_SCHEMA;
  readonly name: string;
  readonly items: readonly PlanItemDocument[];
  readonly recurring: readonly never[];
}

export interface DemoScenarioSet {
  readonly asOf: CalendarDate;
  /** Threshold for the comparison in major units (the CLI's `--threshold`). */
  readonly threshold: number;
  /** The base: the commission paid on the usual terms. */
  readonly base: PlanDocument;
  /** Compared with the base, in this order. */
  readonly scenarios: readonly { readonly name: string; readonly plan: PlanDocument }[];
  /** One plain paragraph for the demo's scenarios screen. */
  readonly story: string;
}

function nextBusinessDay(date: CalendarDate): CalendarDate {
  let d = date;
  while (isWeekend(toDayNumber(d))) d = addDays(d, 1);
  return d;
}

function checkAsOf(asOf: CalendarDate): void {
  if (!parseIsoDate(asOf)) throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${asOf}"`);
}

/**
 * Due date of the commission: issue date + 30 days, on the next business day.
 * @throws EngineError INVALID_DATE for a malformed as-of date.
 * @example commissionDueDate('2026-10-31') // '2026-11-16' (issued 16 Oct; due Sunday 15 Nov, moved to Monday)
 */
export function commissionDueDate(asOf: CalendarDate = DEMO_AS_OF): CalendarDate {
  checkAsOf(asOf);
  return nextBusinessDay(addDays(asOf, -DEMO_COMMISSION.issuedDaysBeforeAsOf + DEMO_COMMISSION.termsDays));
}

function commissionItem(asOf: CalendarDate, delay: { min: number; max: number }): PlanItemDocument {
  return {
    label: DEMO_COMMISSION.label,
    amount: DEMO_COMMISSION.amount,
    date: commissionDueDate(asOf),
    probability: 1,
    delayDays: { min: delay.min, max: delay.max },
    every: null,
  };
}

function kilnItems(asOf: CalendarDate): PlanItemDocument[] {
  const depositDay = nextBusinessDay(addDays(asOf, 16));
  // Instalments on the 15th, from the month after the deposit.
  const d = parseIsoDate(depositDay) as { year: number; month: number };
  const first = addMonths(formatYmd(d.year, d.month, 15), 1);
  return [
    {
      label: 'New kiln deposit',
      amount: -DEMO_KILN.deposit,
      date: depositDay,
      probability: 1,
      delayDays: { min: 0, max: 0 },
      every: null,
    },
    {
      label: 'New kiln loan instalment',
      amount: -DEMO_KILN.instalment,
      date: first,
      probability: 1,
      delayDays: { min: 0, max: 0 },
      every: 'month',
      until: addMonths(first, DEMO_KILN.instalments - 1),
    },
  ];
}

function plan(name: string, items: PlanItemDocument[]): PlanDocument {
  return { schema: PLAN_SCHEMA, name, items, recurring: [] };
}

/**
 * The base of the demo comparison: the large commission paid on the usual terms.
 * @throws EngineError INVALID_DATE for a malformed as-of date.
 * @example demoBasePlan().items[0].date // '2026-11-16'
 */
export function demoBasePlan(asOf: CalendarDate = DEMO_AS_OF): PlanDocument {
  checkAsOf(asOf);
  return plan('Commission on usual terms', [commissionItem(asOf, DEMO_COMMISSION.usualDelay)]);
}

/**
 * "Late commission payment": the same commission paying 30–60 days after its due date.
 * @example validatePlan(lateCommissionPlan(), 'EUR').ok // true
 */
export function lateCommissionPlan(asOf: CalendarDate = DEMO_AS_OF): PlanDocument {
  checkAsOf(asOf);
  return plan('Late commission payment', [commissionItem(asOf, DEMO_COMMISSION.lateDelay)]);
}

/**
 * "New kiln bought on credit": the commission on usual terms, a deposit about two weeks
 * after the as-of date and 24 monthly instalments from the 15th of the next month.
 * @example kilnOnCreditPlan().items.length // 3
 */
export function kilnOnCreditPlan(asOf: CalendarDate = DEMO_AS_OF): PlanDocument {
  checkAsOf(asOf);
  return plan('New kiln bought on credit', [commissionItem(asOf, DEMO_COMMISSION.usualDelay), ...kilnItems(asOf)]);
}

/**
 * Both at once: the kiln on credit and the commission paying late.
 * @example kilnAndLateCommissionPlan().name // 'Kiln and late commission'
 */
export function kilnAndLateCommissionPlan(asOf: CalendarDate = DEMO_AS_OF): PlanDocument {
  checkAsOf(asOf);
  return plan('Kiln and late commission', [commissionItem(asOf, DEMO_COMMISSION.lateDelay), ...kilnItems(asOf)]);
}

/**
 * The demo comparison: base, the two ready-made scenarios and the two together, against
 * the owner's cushion.
 * @example demoScenarioSet().scenarios.map((s) => s.name)
 *   // ['Late commission payment', 'New kiln bought on credit', 'Kiln and late commission']
 */
export function demoScenarioSet(asOf: CalendarDate = DEMO_AS_OF): DemoScenarioSet {
  const scenarios = [lateCommissionPlan(asOf), kilnOnCreditPlan(asOf), kilnAndLateCommissionPlan(asOf)];
  return {
    asOf,
    threshold: DEMO_CUSHION,
    base: demoBasePlan(asOf),
    scenarios: scenarios.map((p) => ({ name: p.name, plan: p })),
    story:
      `Tessellate Ceramics keeps a cushion of ${formatAmount(DEMO_CUSHION * 100, 'EUR')} in the business account, ` +
      `and a commission of ${formatAmount(DEMO_COMMISSION.amount * 100, 'EUR')} is due on ${formatDate(commissionDueDate(asOf))}. ` +
      'The comparison estimates how much a late payment, a new kiln bought on credit, and both together change ' +
      'the chance of dipping below the cushion over the next quarter.',
  };
}
