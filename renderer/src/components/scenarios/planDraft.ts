/**
 * A scenario as the editor holds it: every field as the text the person typed, so nothing
 * typed is lost when it is not (yet) valid, and the way to and from the stored plan
 * document (`ebbline.plan/1`, engine/plan/plan.ts, amounts in major units: exactly what the
 * CLI's `--plan` reads).
 *
 * The document always reflects the draft: a field that can be read is written as the
 * schema wants it (an amount typed as "1.250,00" becomes 1250), a field that cannot is
 * written as the typed text, so the stored scenario keeps it and `validatePlan` names it.
 * Validation is `validatePlan` itself, plus a few checks of the editor's own units
 * (chance in percent, delay in whole days) whose messages speak those units.
 */
import { validatePlan, PLAN_SCHEMA, type Plan, type PlanProblem } from '../../../../engine/plan/plan';
import { minorUnitExponent } from '../../../../engine/core/currency';
import { amountInputText, parseAmountInput } from '../../lib/format/money';

/** How an item repeats, as the editor's select holds it ('' = once). */
export type EveryChoice = '' | 'week' | 'fortnight' | 'month' | 'quarter' | 'year';

export const EVERY_CHOICES: readonly { readonly value: EveryChoice; readonly label: string }[] = [
  { value: '', label: 'Once' },
  { value: 'week', label: 'Every week' },
  { value: 'fortnight', label: 'Every fortnight' },
  { value: 'month', label: 'Every month' },
  { value: 'quarter', label: 'Every quarter' },
  { value: 'year', label: 'Every year' },
];

export interface ItemDraft {
  /** Stable key for the editor's rows (not stored). */
  readonly key: string;
  readonly label: string;
  /** Signed amount as typed, in major units of the scope's currency. */
  readonly amount: string;
  readonly date: string;
  /** Chance that it happens, in percent. */
  readonly probability: string;
  readonly delayMin: string;
  readonly delayMax: string;
  /** An EveryChoice, or a value found in an imported file that the select does not offer. */
  readonly every: string;
  readonly until: string;
}

export interface ChangeDraft {
  readonly key: string;
  /** Text matched against a recurring flow's label, payee or key. */
  readonly match: string;
  /** 'pause' | 'scale', or what an imported file held. */
  readonly action: string;
  readonly from: string;
  readonly factor: string;
}

export interface PlanDraft {
  readonly name: string;
  readonly items: readonly ItemDraft[];
  readonly recurring: readonly ChangeDraft[];
  readonly startBalanceChange: string;
  /** Top-level fields of an imported document that the editor does not show, kept as they were. */
  readonly extra: Readonly<Record<string, unknown>>;
}

/** Where a problem belongs in the editor. */
export type ProblemPlace =
  | {
      readonly section: 'items';
      readonly index: number;
      readonly field: keyof Omit<ItemDraft, 'key'> | 'delay' | 'row';
    }
  | { readonly section: 'recurring'; readonly index: number; readonly field: keyof Omit<ChangeDraft, 'key'> | 'row' }
  | { readonly section: 'plan'; readonly field: 'name' | 'startBalanceChange' | 'general' };

export interface FieldProblem extends PlanProblem {
  readonly place: ProblemPlace;
}

export interface DraftValidation {
  /** The document to store and export (major units). */
  readonly document: Record<string, unknown>;
  /** The validated plan (minor units) for the forecast, or null while there are problems. */
  readonly plan: Plan | null;
  readonly problems: readonly FieldProblem[];
}

let keyCounter = 0;
/** A fresh row key. */
export function rowKey(prefix: 'i' | 'c'): string {
  keyCounter += 1;
  return `${prefix}${keyCounter.toString(36)}`;
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/**
 * A decimal text with its point moved `places` digits (right for positive), done on the
 * digits rather than by multiplying, so nothing is rounded: a plan file's chance of
 * 0.3333333333 is shown as 33.33333333 percent and read back as exactly 0.3333333333, the
 * number the CLI reads from the same file ("0.07" → "7", not 7.000000000000001).
 * Accepts what `String(number)` writes (also "1e-7") and typed decimals ("+.5", "7.").
 * @example movePoint('0.075', 2) // '7.5'
 * @example movePoint('7.5', -2) // '0.075'
 */
function movePoint(text: string, places: number): string {
  const m = /^([+-]?)(\d*)(?:\.(\d*))?(?:e([+-]?\d+))?$/i.exec(text.trim());
  if (!m) throw new Error(`not a decimal: "${text}"`);
  const [, sign = '', whole = '', fraction = '', exponent = '0'] = m;
  const digits = whole + fraction;
  const point = whole.length + Number(exponent) + places;
  const padded =
    point <= 0
      ? `0.${'0'.repeat(-point)}${digits}`
      : point >= digits.length
        ? digits + '0'.repeat(point - digits.length)
        : `${digits.slice(0, point)}.${digits.slice(point)}`;
  const [int = '', frac = ''] = padded.split('.');
  const cleanInt = int.replace(/^0+(?=\d)/, '') || '0';
  const cleanFrac = frac.replace(/0+$/, '');
  const body = cleanFrac ? `${cleanInt}.${cleanFrac}` : cleanInt;
  return sign === '-' && /[1-9]/.test(body) ? `-${body}` : body;
}

/** A stored amount (major units) as the text the editor shows, without losing anything. */
function amountText(value: unknown, currency: string): string {
  if (typeof value === 'string') return value;
  if (typeof value !== 'number' || !Number.isFinite(value))
    return value === undefined || value === null ? '' : String(value);
  const exponent = minorUnitExponent(currency);
  if (exponent === undefined) return String(value);
  const scaled = value * 10 ** exponent;
  const minor = Math.round(scaled);
  // More decimals than the currency has: show them, validatePlan will say so.
  if (Math.abs(scaled - minor) > 1e-6 * Math.max(1, Math.abs(scaled)) || !Number.isSafeInteger(minor)) {
    return String(value);
  }
  return amountInputText(minor === 0 ? 0 : minor, currency);
}

function textOf(value: unknown, fallback = ''): string {
  if (value === undefined || value === null) return fallback;
  return typeof value === 'string' ? value : String(value);
}

/** A new planned item: money out today-ish, certain, on time, once. */
export function emptyItem(date = ''): ItemDraft {
  return {
    key: rowKey('i'),
    label: '',
    amount: '',
    date,
    probability: '100',
    delayMin: '0',
    delayMax: '0',
    every: '',
    until: '',
  };
}

/** A new change of a recurring flow. */
export function emptyChange(match = '', from = ''): ChangeDraft {
  return { key: rowKey('c'), match, action: 'pause', from, factor: '1' };
}

/** The draft of an empty plan called `name`. */
export function emptyDraft(name: string): PlanDraft {
  return { name, items: [], recurring: [], startBalanceChange: '', extra: {} };
}

const KNOWN_TOP = new Set(['schema', 'name', 'items', 'recurring', 'startBalanceChange']);

/**
 * The editor's draft of a stored or imported document. Tolerant: whatever the document
 * holds is shown (a string where a number belongs stays that string), so a damaged field
 * can be seen and fixed rather than silently replaced.
 * @example draftFromDocument({ schema: 'ebbline.plan/1', items: [{ label: 'Deposit', amount: -1000, date: '2026-02-02' }] }, 'EUR').items[0].amount // '-1000.00'
 */
export function draftFromDocument(doc: unknown, currency: string, fallbackName = ''): PlanDraft {
  const d = isRecord(doc) ? doc : {};
  const items = (Array.isArray(d.items) ? d.items : []).map((raw): ItemDraft => {
    const r = isRecord(raw) ? raw : {};
    const delay = isRecord(r.delayDays) ? r.delayDays : {};
    const probability =
      typeof r.probability === 'number' && Number.isFinite(r.probability)
        ? movePoint(String(r.probability), 2)
        : textOf(r.probability, '100');
    return {
      key: rowKey('i'),
      label: textOf(r.label),
      amount: amountText(r.amount, currency),
      date: textOf(r.date),
      probability,
      delayMin: textOf(delay.min, '0'),
      delayMax: textOf(delay.max, '0'),
      every: r.every === null || r.every === undefined ? '' : textOf(r.every),
      until: textOf(r.until),
    };
  });
  const recurring = (Array.isArray(d.recurring) ? d.recurring : []).map((raw): ChangeDraft => {
    const r = isRecord(raw) ? raw : {};
    return {
      key: rowKey('c'),
      match: textOf(r.match),
      action: textOf(r.action, 'pause'),
      from: textOf(r.from),
      factor: textOf(r.factor, '1'),
    };
  });
  const extra: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(d)) if (!KNOWN_TOP.has(k)) extra[k] = v;
  const sbc = d.startBalanceChange;
  return {
    name: typeof d.name === 'string' ? d.name : fallbackName,
    items,
    recurring,
    startBalanceChange: sbc === 0 || sbc === undefined ? '' : amountText(sbc, currency),
    extra,
  };
}

/** A typed decimal ("7.5", "7,5", "7.5%") in plain form ("7.5"), or null. */
function decimalTextOf(text: string): string | null {
  const t = text.trim().replace(/\s+/g, '').replace(',', '.').replace(/%$/, '');
  return /^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(t) && Number.isFinite(Number(t)) ? t : null;
}

/** A typed decimal ("7.5", "7,5") as a number, or null. */
function decimalOf(text: string): number | null {
  const t = decimalTextOf(text);
  return t === null ? null : Number(t);
}

/** A typed whole number of days, or null. */
function wholeOf(text: string): number | null {
  const t = text.trim();
  return /^\d{1,4}$/.test(t) ? Number(t) : null;
}

/** Where a validatePlan path belongs in the editor. */
export function placeOf(path: string): ProblemPlace {
  const m = /^\$\.(items|recurring)\[(\d+)\](?:\.(\w+))?/.exec(path);
  if (m) {
    const index = Number(m[2]);
    const field = m[3];
    if (m[1] === 'items') {
      const f = field === 'delayDays' ? 'delay' : field;
      const known = ['label', 'amount', 'date', 'probability', 'delay', 'every', 'until'];
      return { section: 'items', index, field: (f && known.includes(f) ? f : 'row') as 'row' };
    }
    const known = ['match', 'action', 'from', 'factor'];
    return { section: 'recurring', index, field: (field && known.includes(field) ? field : 'row') as 'row' };
  }
  if (path === '$.name') return { section: 'plan', field: 'name' };
  if (path === '$.startBalanceChange') return { section: 'plan', field: 'startBalanceChange' };
  return { section: 'plan', field: 'general' };
}

/** The same place (for matching problems to inputs). */
export function samePlace(a: ProblemPlace, b: ProblemPlace): boolean {
  if (a.section !== b.section || a.field !== b.field) return false;
  return !('index' in a) || !('index' in b) || a.index === b.index;
}

/**
 * The document of a draft, the validated plan when there is nothing to fix, and every
 * problem placed at its field.
 *
 * @param currency ISO 4217 code the amounts are in (the scope's currency).
 * @example validateDraft({ ...emptyDraft('Hire'), items: [{ ...emptyItem('2026-02-01'), label: 'Salary', amount: '-2,400.00', every: 'month' }] }, 'EUR').plan?.items[0].amount // -240000
 */
export function validateDraft(draft: PlanDraft, currency: string): DraftValidation {
  const own: PlanProblem[] = [];
  const problem = (path: string, message: string) => own.push({ path, message });
  const known = minorUnitExponent(currency) !== undefined;
  const exponent = minorUnitExponent(currency) ?? 2;

  const amountValue = (path: string, text: string, optional: boolean): unknown => {
    if (optional && text.trim() === '') return 0;
    if (!known) return text;
    const minor = parseAmountInput(text, currency);
    if (typeof minor === 'string') {
      problem(path, text.trim() === '' ? 'is empty; type an amount such as -1250.00 (minus for money out)' : minor);
      return text;
    }
    return minor === 0 ? 0 : minor / 10 ** exponent;
  };

  const items = draft.items.map((item, i) => {
    const p = `$.items[${i}]`;
    let probability: unknown = item.probability;
    const pctText = decimalTextOf(item.probability);
    const pct = Number(pctText);
    if (pctText === null)
      problem(`${p}.probability`, `"${item.probability.trim()}" is not a chance; type a percentage from 0 to 100`);
    else if (pct < 0 || pct > 100) problem(`${p}.probability`, `${pct}% is outside 0–100%`);
    // Percent to share on the digits: the number a plan file holds comes back unchanged.
    else probability = Number(movePoint(pctText, -2));
    const min = wholeOf(item.delayMin);
    const max = wholeOf(item.delayMax);
    let delayDays: unknown = { min: item.delayMin, max: item.delayMax };
    if (min === null || max === null)
      problem(`${p}.delayDays`, 'type whole days (0 or more) for the earliest and latest delay');
    else if (max < min)
      problem(`${p}.delayDays`, `the latest delay (${max} days) is before the earliest (${min} days)`);
    else if (max > 365) problem(`${p}.delayDays`, `${max} days is more than the 365 days a delay may have`);
    else delayDays = { min, max };
    const every = item.every === '' ? null : item.every;
    const doc: Record<string, unknown> = {
      label: item.label,
      amount: amountValue(`${p}.amount`, item.amount, false),
      date: item.date.trim(),
      probability,
      delayDays,
      every,
    };
    if (item.until.trim() !== '' || every !== null) doc.until = item.until.trim() === '' ? null : item.until.trim();
    return doc;
  });

  const recurring = draft.recurring.map((change, i) => {
    const p = `$.recurring[${i}]`;
    let factor: unknown = 1;
    if (change.action === 'scale') {
      const f = decimalOf(change.factor);
      if (f === null) {
        problem(`${p}.factor`, `"${change.factor.trim()}" is not a factor; type e.g. 1.1 for 10% more, 0.5 for half`);
        factor = change.factor;
      } else factor = f;
    }
    return {
      match: change.match,
      action: change.action,
      from: change.from.trim() === '' ? null : change.from.trim(),
      factor,
    };
  });

  const document: Record<string, unknown> = {
    ...draft.extra,
    schema: PLAN_SCHEMA,
    name: draft.name,
    items,
    recurring,
    startBalanceChange: amountValue('$.startBalanceChange', draft.startBalanceChange, true),
  };

  let validation: ReturnType<typeof validatePlan> | null = null;
  if (known) validation = validatePlan(document, currency);
  else problem('$', `the currency "${currency}" is not an ISO 4217 code, so amounts cannot be read`);

  const ownPlaces = own.map((o) => placeOf(o.path));
  const fromEngine = validation && !validation.ok ? validation.problems : [];
  const problems: FieldProblem[] = [
    ...own.map((o, k) => ({ ...o, place: ownPlaces[k] as ProblemPlace })),
    // The editor's own message wins where both speak of the same field.
    ...fromEngine
      .map((e) => ({ ...e, place: placeOf(e.path) }))
      .filter((e) => !ownPlaces.some((o) => samePlace(o, e.place))),
  ];
  const plan = problems.length === 0 && validation?.ok ? validation.plan : null;
  return { document, plan, problems };
}

/** The problems of one field (for the message under an input). */
export function problemsAt(problems: readonly FieldProblem[], place: ProblemPlace): FieldProblem[] {
  return problems.filter((p) => samePlace(p.place, place));
}

/** One problem in words for a list ("Item 2, amount: …"). */
export function describeProblem(p: FieldProblem, draft: PlanDraft): string {
  const place = p.place;
  const field: Record<string, string> = {
    label: 'label',
    amount: 'amount',
    date: 'date',
    probability: 'chance',
    delay: 'payment delay',
    every: 'repeat',
    until: 'repeat until',
    match: 'flow',
    action: 'change',
    from: 'from',
    factor: 'factor',
    row: '',
    name: 'name',
    startBalanceChange: 'start balance change',
    general: '',
  };
  if (place.section === 'items') {
    const label = draft.items[place.index]?.label.trim();
    const what = label ? `“${label}”` : `Item ${place.index + 1}`;
    return `${what}${field[place.field] ? `, ${field[place.field]}` : ''}: ${p.message}`;
  }
  if (place.section === 'recurring') {
    const match = draft.recurring[place.index]?.match.trim();
    const what = match ? `Change of “${match}”` : `Change ${place.index + 1}`;
    return `${what}${field[place.field] ? `, ${field[place.field]}` : ''}: ${p.message}`;
  }
  const name = field[place.field] ?? '';
  return name ? `${name.charAt(0).toUpperCase()}${name.slice(1)}: ${p.message}` : p.message;
}
