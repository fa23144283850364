/**
 * The plan document (`ebbline.plan/1`): planned items and changes to recurring flows that a
 * scenario applies on top of the base forecast. One schema for the CLI's `--plan` file and
 * the app's scenarios, so both give the same numbers for the same seed. Amounts are major
 * units in the file and minor units once validated.
 */
import { isCalendarDate, type CalendarDate } from '../core/dates';
import { exponentOf } from '../core/money';

export const PLAN_SCHEMA = 'ebbline.plan/1';

/** How a planned item repeats. */
export type PlanEvery = null | 'week' | 'fortnight' | 'month' | 'quarter' | 'year';
const EVERY_VALUES: readonly PlanEvery[] = [null, 'week', 'fortnight', 'month', 'quarter', 'year'];

export interface PlannedItem {
  readonly label: string;
  /** Signed minor units (+ in, − out). */
  readonly amount: number;
  readonly date: CalendarDate;
  /** Share of paths on which it happens, 0..1. */
  readonly probability: number;
  /** Whole days of delay, drawn uniformly from min..max (late payments). */
  readonly delayDays: { readonly min: number; readonly max: number };
  readonly every: PlanEvery;
  /** Last date of a repeating item (inclusive); null = through the horizon. */
  readonly until: CalendarDate | null;
}

export interface RecurringChange {
  /** Text matched (case-insensitively) against a recurring flow's label, payee or key. */
  readonly match: string;
  readonly action: 'pause' | 'scale';
  readonly from: CalendarDate | null;
  /** Multiplier for `scale` (1 = unchanged). */
  readonly factor: number;
}

export interface Plan {
  readonly schema: typeof PLAN_SCHEMA;
  readonly name: string | null;
  readonly items: readonly PlannedItem[];
  readonly recurring: readonly RecurringChange[];
  /** Added to the starting balance (minor units), e.g. a loan paid out today. */
  readonly startBalanceChange: number;
}

/** A field of the plan that failed validation: the JSON path and what was expected. */
export interface PlanProblem {
  readonly path: string;
  readonly message: string;
}

export type PlanValidation =
  { readonly ok: true; readonly plan: Plan } | { readonly ok: false; readonly problems: readonly PlanProblem[] };

/** An empty plan (the base forecast). */
export const EMPTY_PLAN: Plan = { schema: PLAN_SCHEMA, name: null, items: [], recurring: [], startBalanceChange: 0 };

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

const MAX_ITEMS = 1000;

/**
 * Validates a parsed plan document and converts amounts to minor units of `currency`.
 * Every problem is collected (not only the first), each naming the JSON path.
 *
 * @example validatePlan({ schema: 'ebbline.plan/1', items: [] }, 'EUR').ok // true
 * @throws EngineError UNKNOWN_CURRENCY when `currency` is not an ISO 4217 code.
 */
export function validatePlan(doc: unknown, currency: string): PlanValidation {
  const exponent = exponentOf(currency);
  const problems: PlanProblem[] = [];
  const problem = (path: string, message: string) => problems.push({ path, message });
  if (!isRecord(doc))
    return { ok: false, problems: [{ path: '$', message: 'expected a JSON object with "schema": "ebbline.plan/1"' }] };
  if (doc.schema !== PLAN_SCHEMA) problem('$.schema', `found ${JSON.stringify(doc.schema)}, expected "${PLAN_SCHEMA}"`);
  const name =
    doc.name === undefined || doc.name === null
      ? null
      : typeof doc.name === 'string'
        ? doc.name
        : (problem('$.name', 'expected text'), null);

  const amountOf = (path: string, v: unknown): number => {
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      problem(path, `found ${JSON.stringify(v)}, expected a number in major units (e.g. -1000.00)`);
      return 0;
    }
    const scaled = v * 10 ** exponent;
    const rounded = Math.round(scaled);
    if (Math.abs(scaled - rounded) > 1e-6 * Math.max(1, Math.abs(scaled))) {
      problem(path, `${v} has more decimals than ${currency} allows (${exponent})`);
    }
    if (!Number.isSafeInteger(rounded)) problem(path, `${v} is too large`);
    return rounded === 0 ? 0 : rounded;
  };
  const dateOf = (path: string, v: unknown, optional: boolean): CalendarDate | null => {
    if ((v === undefined || v === null) && optional) return null;
    if (typeof v !== 'string' || !isCalendarDate(v)) {
      problem(path, `found ${JSON.stringify(v)}, expected a calendar date YYYY-MM-DD`);
      return null;
    }
    return v;
  };

  const items: PlannedItem[] = [];
  const rawItems = doc.items ?? [];
  if (!Array.isArray(rawItems)) problem('$.items', 'expected an array');
  else if (rawItems.length > MAX_ITEMS)
    problem('$.items', `has ${rawItems.length} items, at most ${MAX_ITEMS} are allowed`);
  else
    rawItems.forEach((raw, i) => {
      const p = `$.items[${i}]`;
      if (!isRecord(raw)) return problem(p, 'expected an object');
      const label =
        typeof raw.label === 'string' && raw.label.trim()
          ? raw.label.trim()
          : (problem(`${p}.label`, 'expected a non-empty text'), '');
      const amount = amountOf(`${p}.amount`, raw.amount);
      const date = dateOf(`${p}.date`, raw.date, false);
      let probability = 1;
      if (raw.probability !== undefined) {
        if (typeof raw.probability !== 'number' || !(raw.probability >= 0 && raw.probability <= 1)) {
          problem(`${p}.probability`, `found ${JSON.stringify(raw.probability)}, expected a number from 0 to 1`);
        } else probability = raw.probability;
      }
      let delay = { min: 0, max: 0 };
      if (raw.delayDays !== undefined && raw.delayDays !== null) {
        const d = raw.delayDays;
        if (
          !isRecord(d) ||
          !Number.isInteger(d.min) ||
          !Number.isInteger(d.max) ||
          (d.min as number) < 0 ||
          (d.max as number) < (d.min as number) ||
          (d.max as number) > 365
        ) {
          problem(
            `${p}.delayDays`,
            `found ${JSON.stringify(d)}, expected { "min": whole days ≥ 0, "max": whole days ≥ min, at most 365 }`,
          );
        } else delay = { min: d.min as number, max: d.max as number };
      }
      const every = raw.every === undefined ? null : (raw.every as PlanEvery);
      if (!EVERY_VALUES.includes(every))
        problem(
          `${p}.every`,
          `found ${JSON.stringify(raw.every)}, expected null, "week", "fortnight", "month", "quarter" or "year"`,
        );
      const until = dateOf(`${p}.until`, raw.until, true);
      if (until && date && until < date) problem(`${p}.until`, `${until} is before the item's date ${date}`);
      if (date)
        items.push({
          label,
          amount,
          date,
          probability,
          delayDays: delay,
          every: EVERY_VALUES.includes(every) ? every : null,
          until,
        });
    });

  const recurring: RecurringChange[] = [];
  const rawRecurring = doc.recurring ?? [];
  if (!Array.isArray(rawRecurring)) problem('$.recurring', 'expected an array');
  else
    rawRecurring.forEach((raw, i) => {
      const p = `$.recurring[${i}]`;
      if (!isRecord(raw)) return problem(p, 'expected an object');
      const match =
        typeof raw.match === 'string' && raw.match.trim()
          ? raw.match.trim()
          : (problem(`${p}.match`, 'expected the text of a flow label or payee'), '');
      const action = raw.action;
      if (action !== 'pause' && action !== 'scale')
        problem(`${p}.action`, `found ${JSON.stringify(action)}, expected "pause" or "scale"`);
      const from = dateOf(`${p}.from`, raw.from, true);
      let factor = 1;
      if (raw.factor !== undefined) {
        if (typeof raw.factor !== 'number' || !Number.isFinite(raw.factor) || raw.factor < 0 || raw.factor > 100) {
          problem(`${p}.factor`, `found ${JSON.stringify(raw.factor)}, expected a number from 0 to 100`);
        } else factor = raw.factor;
      }
      if (action === 'pause' || action === 'scale') recurring.push({ match, action, from, factor });
    });

  const startBalanceChange =
    doc.startBalanceChange === undefined ? 0 : amountOf('$.startBalanceChange', doc.startBalanceChange);
  if (problems.length) return { ok: false, problems };
  return { ok: true, plan: { schema: PLAN_SCHEMA, name, items, recurring, startBalanceChange } };
}
