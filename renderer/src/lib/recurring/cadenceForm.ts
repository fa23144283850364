/**
 * The small form that edits a recurring flow's cadence: plain fields a person fills in,
 * turned into the engine's `Cadence` (engine/recurring/cadence.ts) and back.
 */
import { isoWeekday, toDayNumber } from '../../../../engine/core/dates';
import { monthIndexOf, weekIndexOf, type Cadence } from '../../../../engine/recurring/cadence';

export type CadenceKind = Cadence['kind'];

/** What the form holds. `every` counts weeks for `weekly`, months otherwise. */
export interface CadenceForm {
  kind: CadenceKind;
  every: number;
  /** 1 = Monday … 7 = Sunday (weekly, monthWeekday). */
  weekday: number;
  /** Day of month 1–31 (monthDay). */
  day: number;
  /** 1–5, or −1 for the last (monthWeekday). */
  nth: number;
}

export const CADENCE_KINDS: readonly { readonly kind: CadenceKind; readonly label: string }[] = [
  { kind: 'weekly', label: 'Every few weeks on a weekday' },
  { kind: 'monthDay', label: 'On a day of the month' },
  { kind: 'monthWeekday', label: 'On the nth weekday of the month' },
  { kind: 'lastBusinessDay', label: 'On the last business day of the month' },
];

export const WEEKDAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

/**
 * The form of a cadence.
 * @example cadenceToForm({ kind: 'monthDay', everyMonths: 3, day: 15, phase: 1 }) // { kind: 'monthDay', every: 3, weekday: 1, day: 15, nth: 1 }
 */
export function cadenceToForm(c: Cadence): CadenceForm {
  switch (c.kind) {
    case 'weekly':
      return { kind: c.kind, every: c.everyWeeks, weekday: c.weekday, day: 1, nth: 1 };
    case 'monthDay':
      return { kind: c.kind, every: c.everyMonths, weekday: 1, day: c.day, nth: 1 };
    case 'monthWeekday':
      return { kind: c.kind, every: c.everyMonths, weekday: c.weekday, day: 1, nth: c.nth };
    case 'lastBusinessDay':
      return { kind: c.kind, every: c.everyMonths, weekday: 1, day: 1, nth: 1 };
  }
}

function whole(n: number, lo: number, hi: number): boolean {
  return Number.isInteger(n) && n >= lo && n <= hi;
}

/**
 * The cadence a form describes. The phase (which weeks or months) is kept from `previous`
 * when the period is unchanged, otherwise taken from `anchorDate` (the flow's last
 * occurrence), so the edited schedule stays in step with the history.
 *
 * @returns the cadence, or a message naming the field that is wrong.
 * @example cadenceFromForm({ kind: 'monthDay', every: 1, weekday: 1, day: 31, nth: 1 }, undefined, '2026-10-31')
 * // { kind: 'monthDay', everyMonths: 1, day: 31, phase: 0 }
 */
export function cadenceFromForm(
  form: CadenceForm,
  previous: Cadence | undefined,
  anchorDate: string,
): Cadence | string {
  const anchor = toDayNumber(anchorDate);
  if (form.kind === 'weekly') {
    if (!whole(form.every, 1, 52)) return 'Every: enter a whole number of weeks from 1 to 52.';
    if (!whole(form.weekday, 1, 7)) return 'Weekday: choose a day of the week.';
    const phase =
      previous?.kind === 'weekly' && previous.everyWeeks === form.every
        ? previous.phase
        : weekIndexOf(anchor + (form.weekday - isoWeekday(anchor))) % form.every;
    return {
      kind: 'weekly',
      everyWeeks: form.every,
      weekday: form.weekday,
      phase: ((phase % form.every) + form.every) % form.every,
    };
  }
  if (!whole(form.every, 1, 24)) return 'Every: enter a whole number of months from 1 to 24.';
  const phase =
    previous && previous.kind !== 'weekly' && previous.everyMonths === form.every
      ? previous.phase
      : monthIndexOf(anchor) % form.every;
  switch (form.kind) {
    case 'monthDay':
      if (!whole(form.day, 1, 31)) return 'Day: enter a day of the month from 1 to 31.';
      return { kind: 'monthDay', everyMonths: form.every, day: form.day, phase };
    case 'monthWeekday':
      if (!(whole(form.nth, 1, 5) || form.nth === -1)) return 'Which: choose first to fifth, or last.';
      if (!whole(form.weekday, 1, 7)) return 'Weekday: choose a day of the week.';
      return { kind: 'monthWeekday', everyMonths: form.every, nth: form.nth, weekday: form.weekday, phase };
    case 'lastBusinessDay':
      return { kind: 'lastBusinessDay', everyMonths: form.every, phase };
  }
}

/** True when two cadences describe the same schedule. */
export function sameCadence(a: Cadence, b: Cadence): boolean {
  const fields = ['kind', 'everyWeeks', 'everyMonths', 'weekday', 'day', 'nth', 'phase'] as const;
  const get = (c: Cadence, f: (typeof fields)[number]) => (c as unknown as Record<string, unknown>)[f];
  return fields.every((f) => get(a, f) === get(b, f));
}
