import { describe, expect, it } from 'vitest';
import { EngineError } from '../../engine/core/errors';
import { occurrenceDates, plannedComponents } from '../../engine/forecast/plannedComponents';
import { validatePlan, type PlanProblem, type PlannedItem } from '../../engine/plan/plan';
import { simulateBalances } from '../../engine/simulate/simulateBalances';

const item = (over: Record<string, unknown> = {}) => ({
  label: 'New kiln deposit',
  amount: -1000.0,
  date: '2026-02-02',
  probability: 1,
  delayDays: { min: 0, max: 0 },
  every: null,
  ...over,
});

function problems(doc: unknown, currency = 'EUR'): readonly PlanProblem[] {
  const v = validatePlan(doc, currency);
  return v.ok ? [] : v.problems;
}

function planOf(doc: unknown, currency = 'EUR') {
  const v = validatePlan(doc, currency);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

describe('validatePlan', () => {
  it('accepts the minimal form of DESIGN.md section 5 and converts amounts to minor units', () => {
    // Source: /work/shared/DESIGN.md section 5, plan file example.
    const plan = planOf({
      schema: 'ebbline.plan/1',
      items: [item()],
      recurring: [{ match: 'text of the flow', action: 'pause', from: '2026-02-01', factor: 1 }],
    });
    expect(plan.items[0]).toEqual({
      label: 'New kiln deposit',
      amount: -100_000,
      date: '2026-02-02',
      probability: 1,
      delayDays: { min: 0, max: 0 },
      every: null,
      until: null,
    });
    expect(plan.recurring[0]).toEqual({ match: 'text of the flow', action: 'pause', from: '2026-02-01', factor: 1 });
  });

  it('ignores fields the app may add', () => {
    expect(problems({ schema: 'ebbline.plan/1', name: 'Hire', colour: 'teal', items: [item({ note: 'x' })] })).toEqual(
      [],
    );
  });

  it('refuses impossible calendar dates with the path and the value found', () => {
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ date: '2026-02-30' })] })).toEqual([
      { path: '$.items[0].date', message: 'found "2026-02-30", expected a calendar date YYYY-MM-DD' },
    ]);
    // Common practice, no source: 2025 is not a leap year, 2024 is (Gregorian rule).
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ date: '2025-02-29' })] })).toHaveLength(1);
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ date: '2024-02-29' })] })).toEqual([]);
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ date: '2026-2-3' })] })).toHaveLength(1);
    expect(
      problems({ schema: 'ebbline.plan/1', recurring: [{ match: 'rent', action: 'pause', from: '2026-13-01' }] }),
    ).toEqual([{ path: '$.recurring[0].from', message: 'found "2026-13-01", expected a calendar date YYYY-MM-DD' }]);
  });

  it('refuses probabilities outside 0..1', () => {
    for (const p of [-0.1, 1.5, '0.5', null]) {
      const found = problems({ schema: 'ebbline.plan/1', items: [item({ probability: p })] });
      expect(found).toEqual([
        { path: '$.items[0].probability', message: `found ${JSON.stringify(p)}, expected a number from 0 to 1` },
      ]);
    }
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ probability: 0 })] })).toEqual([]);
  });

  it('refuses delays whose minimum exceeds the maximum, negative or fractional delays', () => {
    for (const delayDays of [{ min: 10, max: 5 }, { min: -1, max: 5 }, { min: 0.5, max: 5 }, { min: 0, max: 400 }, 7]) {
      const found = problems({ schema: 'ebbline.plan/1', items: [item({ delayDays })] });
      expect(found).toHaveLength(1);
      expect(found[0]?.path).toBe('$.items[0].delayDays');
      expect(found[0]?.message).toContain(`found ${JSON.stringify(delayDays)}`);
    }
  });

  it('refuses a wrong or missing schema and a document that is not an object', () => {
    expect(problems({ schema: 'ebbline.plan/2', items: [] })).toEqual([
      { path: '$.schema', message: 'found "ebbline.plan/2", expected "ebbline.plan/1"' },
    ]);
    expect(problems({ items: [] })[0]?.path).toBe('$.schema');
    expect(problems([])[0]?.path).toBe('$');
    expect(problems('plan')[0]?.path).toBe('$');
  });

  it('refuses more decimals than the currency has: JPY none, EUR two, KWD three', () => {
    // Source: ISO 4217 minor units, JPY 0, EUR 2, KWD 3 (REFERENCES.md).
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ amount: 1000.5 })] }, 'JPY')).toEqual([
      { path: '$.items[0].amount', message: '1000.5 has more decimals than JPY allows (0)' },
    ]);
    expect(planOf({ schema: 'ebbline.plan/1', items: [item({ amount: 1000 })] }, 'JPY').items[0]?.amount).toBe(1000);
    expect(planOf({ schema: 'ebbline.plan/1', items: [item({ amount: 1000.5 })] }, 'EUR').items[0]?.amount).toBe(
      100_050,
    );
    expect(problems({ schema: 'ebbline.plan/1', items: [item({ amount: 10.005 })] }, 'EUR')).toHaveLength(1);
    expect(planOf({ schema: 'ebbline.plan/1', items: [item({ amount: 0.1 + 0.2 })] }, 'EUR').items[0]?.amount).toBe(30);
    expect(planOf({ schema: 'ebbline.plan/1', items: [item({ amount: -1.234 })] }, 'KWD').items[0]?.amount).toBe(-1234);
    expect(problems({ schema: 'ebbline.plan/1', startBalanceChange: 0.5 }, 'JPY')[0]?.path).toBe(
      '$.startBalanceChange',
    );
  });

  it('collects every problem of a document, each with its path', () => {
    const found = problems({
      schema: 'ebbline.plan/1',
      items: [item({ label: '', amount: 'lots', every: 'fortnightly' }), 'not an item', item({ until: '2026-01-01' })],
      recurring: [{ match: '', action: 'stop', factor: -2 }],
    });
    expect(found.map((p) => p.path)).toEqual([
      '$.items[0].label',
      '$.items[0].amount',
      '$.items[0].every',
      '$.items[1]',
      '$.items[2].until',
      '$.recurring[0].match',
      '$.recurring[0].action',
      '$.recurring[0].factor',
    ]);
  });

  it('throws UNKNOWN_CURRENCY for a currency that is not ISO 4217', () => {
    expect(() => validatePlan({ schema: 'ebbline.plan/1' }, 'EUX')).toThrow(EngineError);
  });
});

describe('planned items in the simulation', () => {
  it('lays monthly series on the same day of month, the 31st on month ends', () => {
    const monthly = planOf({ schema: 'ebbline.plan/1', items: [item({ date: '2026-01-31', every: 'month' })] })
      .items[0];
    expect(occurrenceDates(monthly as PlannedItem, '2026-04-30')).toEqual([
      '2026-01-31',
      '2026-02-28',
      '2026-03-31',
      '2026-04-30',
    ]);
    const weekly = planOf({
      schema: 'ebbline.plan/1',
      items: [item({ date: '2026-01-01', every: 'week', until: '2026-01-20' })],
    }).items[0];
    expect(occurrenceDates(weekly as PlannedItem, '2026-12-31')).toEqual(['2026-01-01', '2026-01-08', '2026-01-15']);
  });

  it('spreads a delay uniformly over min..max whole days and happens on the given share of paths', () => {
    // An invoice due on the 2nd forecast day, paid 3 to 7 days late, on 60% of paths.
    const plan = planOf({
      schema: 'ebbline.plan/1',
      items: [
        item({
          label: 'Invoice 17',
          amount: 2400,
          date: '2026-03-02',
          probability: 0.6,
          delayDays: { min: 3, max: 7 },
        }),
      ],
    });
    const components = plannedComponents(plan.items, '2026-02-28', 20);
    const paths = 20_000;
    const sim = simulateBalances({ startBalance: 0, horizon: 20, paths, seed: 11, threshold: 0, components });
    const counts = new Array<number>(20).fill(0);
    let never = 0;
    for (let p = 0; p < paths; p++) {
      let day = -1;
      for (let d = 0; d < 20; d++) {
        if (sim.balances[d * paths + p] === 240_000) {
          day = d;
          break;
        }
      }
      if (day < 0) never++;
      else counts[day]!++;
    }
    // Monte Carlo error of a share: √(p(1 − p)/N) (Koehler, Brown and Haneuse 2009); 4 standard errors allowed.
    const se = (p: number) => Math.sqrt((p * (1 - p)) / paths);
    expect(Math.abs(never / paths - 0.4)).toBeLessThan(4 * se(0.4));
    // Due on day offset 1 (2026-03-02), so payments land on offsets 4..8, each with 0.6 / 5.
    counts.forEach((c, d) => {
      if (d >= 4 && d <= 8) expect(Math.abs(c / paths - 0.12)).toBeLessThan(4 * se(0.12));
      else expect(c).toBe(0);
    });
  });

  it('keeps an item dated before the forecast when its delay can still bring it into the horizon', () => {
    const plan = planOf({
      schema: 'ebbline.plan/1',
      items: [
        item({ label: 'Late invoice', amount: 500, date: '2026-02-20', delayDays: { min: 0, max: 30 } }),
        item({ label: 'Long gone', amount: 500, date: '2026-01-01', delayDays: { min: 0, max: 5 } }),
      ],
    });
    const [late, gone] = plannedComponents(plan.items, '2026-02-28', 30);
    expect(late?.days).toEqual([-9]); // 2026-02-20 is 9 days before the first forecast day, 2026-03-01
    expect(gone?.days).toEqual([]);
  });
});
