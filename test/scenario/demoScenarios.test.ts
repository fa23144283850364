// The demo's ready-made scenarios on the demo's own business statements: the plans are
// valid `ebbline.plan/1` documents and the comparison tells the story the demo promises
// to show (invented data; the checks are of order and size, not copied figures).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { addDays, daysBetween } from '../../engine/core/dates';
import { historyFromLedger } from '../../engine/forecast/history';
import { occurrenceDates } from '../../engine/forecast/plannedComponents';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { compareScenarios, type ScenarioComparison } from '../../engine/scenario/compareScenarios';
import {
  DEMO_AS_OF,
  DEMO_COMMISSION,
  DEMO_CUSHION,
  DEMO_KILN,
  commissionDueDate,
  demoScenarioSet,
} from '../../engine/scenario/demoScenarios';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario, type ScenarioRun } from '../../engine/scenario/forecastScenario';

const DEMO = join(import.meta.dirname, '../../resources/demo/statements');
const set = demoScenarioSet();

function valid(doc: unknown): Plan {
  const v = validatePlan(doc, 'EUR');
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

let base: ScenarioRun;
let runs: ScenarioRun[];
let comparison: ScenarioComparison;

beforeAll(() => {
  const files = readdirSync(DEMO)
    .filter((n) => /^business-\d{4}-\d{2}\.xml$/.test(n))
    .sort()
    .map((n) => ({ file: n, result: importStatement(readFileSync(join(DEMO, n)), { fileName: n }) as ImportResult }));
  const history = historyFromLedger(buildLedger(files));
  expect(history.asOf).toBe(DEMO_AS_OF);
  const basis = prepareForecastBasis(history, { horizon: 91 });
  const config = { paths: 2000, seed: 7, threshold: DEMO_CUSHION * 100 };
  base = forecastScenario(basis, { ...config, plan: valid(set.base) });
  runs = set.scenarios.map((s) => forecastScenario(basis, { ...config, plan: valid(s.plan) }));
  comparison = compareScenarios(
    base.result,
    set.scenarios.map((s, i) => ({ name: s.name, result: runs[i]!.result })),
    { baseName: set.base.name },
  );
});

describe('demo scenarios', () => {
  it('are valid plan documents with the promised items', () => {
    expect(set.scenarios.map((s) => s.name)).toEqual([
      'Late commission payment',
      'New kiln bought on credit',
      'Kiln and late commission',
    ]);
    const kiln = valid(set.scenarios[1]!.plan);
    expect(kiln.items.map((i) => i.amount)).toEqual([
      DEMO_COMMISSION.amount * 100,
      -DEMO_KILN.deposit * 100,
      -DEMO_KILN.instalment * 100,
    ]);
    expect(kiln.items[2]!.every).toBe('month');
    expect(valid(set.scenarios[0]!.plan).items[0]!.delayDays).toEqual({ min: 30, max: 60 });
    // Net 30 from an invoice issued 15 days before the as-of date, moved off the weekend.
    expect(commissionDueDate()).toBe('2026-11-16');
  });

  it('a late commission lowers the balance by exactly its amount while it is outstanding', () => {
    // Between the last usual and the first late payment day every path of the base has the
    // commission and no path of the scenario has it; all else shares its random draws.
    const due = commissionDueDate();
    const day = daysBetween(DEMO_AS_OF, addDays(due, 25)) - 1;
    const late = runs[0]!;
    const n = base.sim.paths;
    for (let p = 0; p < n; p += 97) {
      expect(late.sim.balances[day * n + p]! - base.sim.balances[day * n + p]!).toBeCloseTo(
        -DEMO_COMMISSION.amount * 100,
        6,
      );
    }
  });

  it('tells the story: late alone barely moves the risk, the kiln raises it, both raise it most', () => {
    const p = [base, ...runs].map((r) => r.result.shortfall.probability);
    const [pBase, pLate, pKiln, pBoth] = p as [number, number, number, number];
    expect(pBase).toBeLessThan(0.05);
    expect(pLate).toBeGreaterThanOrEqual(pBase);
    expect(pLate - pBase).toBeLessThan(0.05);
    expect(pKiln - pBase).toBeGreaterThan(0.05);
    expect(pBoth - pKiln).toBeGreaterThan(0.15);
    // The kiln costs the deposit and every instalment due within the horizon, on every path.
    const last = base.result.horizonDays - 1;
    const kiln = valid(set.scenarios[1]!.plan);
    const instalmentsDue = occurrenceDates(kiln.items[2]!, base.result.daily[last]!.date).length;
    expect(instalmentsDue).toBe(2); // 15 Dec and 15 Jan
    const cost = (DEMO_KILN.deposit + instalmentsDue * DEMO_KILN.instalment) * 100;
    expect(runs[1]!.result.daily[last]!.quantiles[3]! - base.result.daily[last]!.quantiles[3]!).toBeCloseTo(-cost, 0);
    const words = comparison.differences.map((d) => d.sentences[0]);
    expect(words[2]).toMatch(
      /^With "Kiln and late commission" the estimated chance of going below 12,000\.00 EUR by 30 Jan 2027 rises from/,
    );
    expect(comparison.caution.length).toBeGreaterThan(0);
  });
});
