// The scenario editor's draft: typed text to an `ebbline.plan/1` document and back, live
// validation through validatePlan with every problem placed at its field, and nothing
// typed lost when a field is not valid.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { validatePlan } from '../../engine/plan/plan';
import { demoScenarioSet } from '../../engine/scenario/demoScenarios';
import {
  describeProblem,
  draftFromDocument,
  emptyChange,
  emptyDraft,
  emptyItem,
  placeOf,
  problemsAt,
  validateDraft,
  type PlanDraft,
} from '../../renderer/src/components/scenarios/planDraft';

function withItem(patch: Partial<ReturnType<typeof emptyItem>>): PlanDraft {
  return {
    ...emptyDraft('Test'),
    items: [{ ...emptyItem('2026-12-01'), label: 'Kiln deposit', amount: '-1000', ...patch }],
  };
}

describe('validateDraft', () => {
  it('turns typed text into the plan document and the validated plan (minor units)', () => {
    const draft: PlanDraft = {
      ...emptyDraft('Hire'),
      items: [
        {
          ...emptyItem('2026-12-01'),
          label: 'Salary',
          amount: '-2.400,50',
          probability: '75',
          delayMin: '0',
          delayMax: '3',
          every: 'month',
          until: '2027-06-01',
        },
      ],
      recurring: [{ ...emptyChange('Studio rent', '2027-01-01'), action: 'scale', factor: '1,1' }],
      startBalanceChange: '5000',
    };
    const v = validateDraft(draft, 'EUR');
    expect(v.problems).toEqual([]);
    expect(v.document).toEqual({
      schema: 'ebbline.plan/1',
      name: 'Hire',
      items: [
        {
          label: 'Salary',
          amount: -2400.5,
          date: '2026-12-01',
          probability: 0.75,
          delayDays: { min: 0, max: 3 },
          every: 'month',
          until: '2027-06-01',
        },
      ],
      recurring: [{ match: 'Studio rent', action: 'scale', from: '2027-01-01', factor: 1.1 }],
      startBalanceChange: 5000,
    });
    expect(v.plan?.items[0]).toMatchObject({ amount: -240050, probability: 0.75, every: 'month' });
    expect(v.plan?.startBalanceChange).toBe(500000);
    // The document is exactly what the CLI's --plan validates.
    expect(validatePlan(v.document, 'EUR')).toEqual({ ok: true, plan: v.plan });
  });

  it('keeps a one-off minimal: no until field', () => {
    const v = validateDraft(withItem({}), 'EUR');
    expect(v.document.items).toEqual([
      {
        label: 'Kiln deposit',
        amount: -1000,
        date: '2026-12-01',
        probability: 1,
        delayDays: { min: 0, max: 0 },
        every: null,
      },
    ]);
  });

  it('places each problem at its field and keeps what was typed in the document', () => {
    const v = validateDraft(
      withItem({ amount: '12abc', date: '2026-13-01', probability: '150', delayMin: '5', delayMax: '2', label: '' }),
      'EUR',
    );
    expect(v.plan).toBeNull();
    const at = (field: 'amount' | 'date' | 'probability' | 'delay' | 'label') =>
      problemsAt(v.problems, { section: 'items', index: 0, field }).map((p) => p.message);
    expect(at('amount')).toHaveLength(1);
    expect(at('date')[0]).toContain('2026-13-01');
    expect(at('probability')).toEqual(['150% is outside 0–100%']);
    expect(at('delay')).toEqual(['the latest delay (2 days) is before the earliest (5 days)']);
    expect(at('label')).toEqual(['expected a non-empty text']);
    const item = (v.document.items as Record<string, unknown>[])[0]!;
    expect(item.amount).toBe('12abc');
    expect(item.date).toBe('2026-13-01');
    expect(item.probability).toBe('150');
    expect(item.delayDays).toEqual({ min: '5', max: '2' });
  });

  it('speaks the editor’s units: one message per field, not also validatePlan’s 0..1', () => {
    const v = validateDraft(withItem({ probability: 'often' }), 'EUR');
    expect(v.problems.map((p) => p.path)).toEqual(['$.items[0].probability']);
    expect(v.problems[0]!.message).toContain('percentage');
  });

  it('flags decimals the currency does not have', () => {
    expect(validateDraft(withItem({ amount: '10.5' }), 'JPY').problems[0]!.message).toContain('decimals');
    expect(validateDraft(withItem({ amount: '10.125' }), 'KWD').plan?.items[0]!.amount).toBe(10125);
  });

  it('checks recurring changes: empty match, unknown factor', () => {
    const draft: PlanDraft = {
      ...emptyDraft('x'),
      recurring: [
        { ...emptyChange('', ''), action: 'pause' },
        { ...emptyChange('Rent', 'soon'), action: 'scale', factor: 'x2' },
      ],
    };
    const v = validateDraft(draft, 'EUR');
    expect(v.problems.map((p) => p.path).sort()).toEqual([
      '$.recurring[0].match',
      '$.recurring[1].factor',
      '$.recurring[1].from',
    ]);
    expect(
      describeProblem(
        v.problems.find((p) => p.path === '$.recurring[1].factor')!,
        draft,
      ),
    ).toMatch(/^Change of “Rent”, factor: /);
  });
});

describe('draftFromDocument', () => {
  it('reads a CLI plan file and writes it back unchanged', () => {
    const doc = {
      schema: 'ebbline.plan/1',
      name: 'Kiln',
      items: [
        {
          label: 'New kiln deposit',
          amount: -1000,
          date: '2026-02-02',
          probability: 1,
          delayDays: { min: 0, max: 0 },
          every: null,
        },
      ],
      recurring: [{ match: 'electricity', action: 'scale', from: '2026-02-01', factor: 1.25 }],
      startBalanceChange: 0,
    };
    const draft = draftFromDocument(doc, 'EUR');
    expect(draft.items[0]).toMatchObject({ amount: '-1000.00', probability: '100', delayMin: '0', every: '' });
    expect(draft.recurring[0]).toMatchObject({ match: 'electricity', action: 'scale', factor: '1.25' });
    expect(validateDraft(draft, 'EUR').document).toEqual(doc);
  });

  it('round-trips every demo scenario', () => {
    const set = demoScenarioSet();
    for (const plan of [set.base, ...set.scenarios.map((s) => s.plan)]) {
      const v = validateDraft(draftFromDocument(plan, 'EUR'), 'EUR');
      expect(v.problems).toEqual([]);
      expect(v.plan).toEqual((validatePlan(plan, 'EUR') as { plan: unknown }).plan);
    }
  });

  it('keeps a plan file’s chance exactly, so the app forecasts the number the CLI reads', () => {
    const planWith = (probability: number) => ({
      schema: 'ebbline.plan/1',
      items: [{ label: 'Invoice 88', amount: 1850, date: '2026-11-20', probability }],
    });
    const chanceOf = (doc: unknown) => validateDraft(draftFromDocument(doc, 'EUR'), 'EUR').plan?.items[0]?.probability;
    // Chances with more than six decimals were once rounded to six (1/3 became 0.333333).
    expect(draftFromDocument(planWith(1 / 3), 'EUR').items[0]!.probability).toBe('33.33333333333333');
    expect(chanceOf(planWith(1 / 3))).toBe(1 / 3);
    expect(chanceOf(planWith(0.999999999))).toBe(0.999999999);
    expect(chanceOf(planWith(1e-7))).toBe(1e-7);
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (p) => {
        const cli = validatePlan(planWith(p), 'EUR');
        expect(cli.ok).toBe(true);
        expect(chanceOf(planWith(p))).toBe(cli.ok ? cli.plan.items[0]!.probability : NaN);
      }),
      { seed: 6, numRuns: 500 },
    );
  });

  it('reads a typed percentage on its digits, every decimal kept (7 is 0.07, 12.3456789 is 0.123456789)', () => {
    const chance = (typed: string) =>
      validateDraft(withItem({ probability: typed }), 'EUR').plan?.items[0]?.probability;
    expect(chance('7')).toBe(0.07);
    expect(chance('7,5 %')).toBe(0.075);
    expect(chance('.5')).toBe(0.005);
    expect(chance('12.3456789')).toBe(0.123456789);
    expect(chance('100')).toBe(1);
  });

  it('shows damaged fields as they are instead of replacing them', () => {
    const draft = draftFromDocument(
      {
        schema: 'ebbline.plan/1',
        items: [{ label: 'x', amount: '12 EUR', date: 20260101, probability: 2, every: 'daily', delayDays: 'late' }],
      },
      'EUR',
    );
    expect(draft.items[0]).toMatchObject({ amount: '12 EUR', date: '20260101', probability: '200', every: 'daily' });
    const v = validateDraft(draft, 'EUR');
    const paths = v.problems.map((p) => p.path);
    expect(paths).toContain('$.items[0].every');
    expect(paths).toContain('$.items[0].amount');
    expect(paths).toContain('$.items[0].date');
    expect((v.document.items as { every: unknown }[])[0]!.every).toBe('daily');
  });

  it('keeps more decimals than the currency has, so validation can name them', () => {
    expect(draftFromDocument({ items: [{ amount: 1.234 }] }, 'EUR').items[0]!.amount).toBe('1.234');
  });

  it('keeps fields the editor does not show', () => {
    const v = validateDraft(draftFromDocument({ schema: 'ebbline.plan/1', note: 'from the bookkeeper' }, 'EUR'), 'EUR');
    expect(v.document.note).toBe('from the bookkeeper');
  });
});

describe('placeOf', () => {
  it('maps validatePlan paths to the editor', () => {
    expect(placeOf('$.items[3].delayDays')).toEqual({ section: 'items', index: 3, field: 'delay' });
    expect(placeOf('$.items[0]')).toEqual({ section: 'items', index: 0, field: 'row' });
    expect(placeOf('$.recurring[1].from')).toEqual({ section: 'recurring', index: 1, field: 'from' });
    expect(placeOf('$.startBalanceChange')).toEqual({ section: 'plan', field: 'startBalanceChange' });
    expect(placeOf('$.schema')).toEqual({ section: 'plan', field: 'general' });
  });
});
