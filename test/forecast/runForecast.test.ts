import { describe, expect, it } from 'vitest';
import { EngineError } from '../../engine/core/errors';
import { addDays } from '../../engine/core/dates';
import { forecastToJson } from '../../engine/forecast/forecastJson';
import { residualSeries, runForecast, type ForecastResult } from '../../engine/forecast/runForecast';
import { explainedEntryIds } from '../../engine/forecast/recurringComponents';
import { detectRecurringFlows } from '../../engine/recurring/detectRecurringFlows';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { buildHistory, countNumbers, everyDay, monthly, nonFiniteNumbers, sometimes } from './histories';

function plan(doc: unknown): Plan {
  const v = validatePlan(doc, 'EUR');
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.plan;
}

function errorCode(run: () => unknown): string | undefined {
  try {
    run();
  } catch (e) {
    return e instanceof EngineError ? e.code : `not an EngineError: ${String(e)}`;
  }
  return undefined;
}

/** Every quantile and the mean of `b` minus those of `a`, day by day. */
function shifts(a: ForecastResult, b: ForecastResult): number[][] {
  return a.daily.map((d, i) => {
    const other = b.daily[i] as ForecastResult['daily'][number];
    return [other.mean - d.mean, ...other.quantiles.map((q, k) => q - (d.quantiles[k] as number))];
  });
}

// 150 days: a rent that never varies (certain: same amount, always on the 1st), daily card
// takings, clay orders on some days. Short enough that no backtest runs (faster tests).
const studio = buildHistory({
  days: 150,
  seed: 5,
  flows: [
    { description: 'Studio rent', counterparty: 'Landlord Ltd', flow: monthly(1, -90_000) },
    { description: 'Card takings', flow: everyDay(1, 8_000, 3_000) },
    { description: 'Clay order', counterparty: 'Supplies', flow: sometimes(-1, 0.15, 2_000, 12_000) },
  ],
});

describe('runForecast with a plan', () => {
  const horizon = 60;
  const base = runForecast(studio, { horizon, paths: 400, seed: 9 });

  it('shifts every quantile and the mean by a certain one-off from its date on, and leaves earlier days alone', () => {
    const day = 20;
    const date = base.daily[day]!.date;
    const withItem = runForecast(studio, {
      horizon,
      paths: 400,
      seed: 9,
      plan: plan({ schema: 'ebbline.plan/1', items: [{ label: 'Kiln deposit', amount: -1000, date, probability: 1 }] }),
    });
    shifts(base, withItem).forEach((row, d) => {
      for (const s of row) expect(s).toBeCloseTo(d >= day ? -100_000 : 0, 6);
    });
  });

  it('pausing the rent from a date shifts the quantiles by the rent schedule it removes', () => {
    const paused = runForecast(studio, {
      horizon,
      paths: 400,
      seed: 9,
      plan: plan({
        schema: 'ebbline.plan/1',
        recurring: [{ match: 'landlord', action: 'pause', from: base.daily[25]!.date }],
      }),
    });
    // The rent is due on the 1st; the forecast starts on the day after the as-of date.
    let removed = 0;
    shifts(base, paused).forEach((row, d) => {
      const date = base.daily[d]!.date;
      if (d >= 25 && date.endsWith('-01')) removed += 90_000;
      for (const s of row) expect(s).toBeCloseTo(removed, 6);
    });
    expect(removed).toBeGreaterThan(0);
    expect(paused.recurring.find((r) => r.label === 'Landlord Ltd')?.nextDate).toBe(base.recurring[0]?.nextDate);
  });

  it('scaling the rent twice applies both factors where both are in force, and a pause stops scaled ones too', () => {
    const scaled = runForecast(studio, {
      horizon,
      paths: 400,
      seed: 9,
      plan: plan({
        schema: 'ebbline.plan/1',
        recurring: [
          { match: 'landlord', action: 'scale', from: base.daily[10]!.date, factor: 1.5 },
          { match: 'landlord', action: 'scale', from: base.daily[40]!.date, factor: 2 },
        ],
      }),
    });
    let extra = 0;
    shifts(base, scaled).forEach((row, d) => {
      const date = base.daily[d]!.date;
      if (date.endsWith('-01')) extra += d >= 40 ? -90_000 * 2 : d >= 10 ? -45_000 : 0;
      for (const s of row) expect(s).toBeCloseTo(extra, 6);
    });
    const scaledThenPaused = runForecast(studio, {
      horizon,
      paths: 400,
      seed: 9,
      plan: plan({
        schema: 'ebbline.plan/1',
        recurring: [
          { match: 'landlord', action: 'scale', from: base.daily[0]!.date, factor: 1.5 },
          { match: 'landlord', action: 'pause', from: base.daily[0]!.date },
        ],
      }),
    });
    const rentDays = base.daily.filter((d) => d.date.endsWith('-01')).length;
    const last = shifts(base, scaledThenPaused)[horizon - 1] as number[];
    for (const s of last) expect(s).toBeCloseTo(rentDays * 90_000, 6);
  });

  it('reports a plan change that matches no flow as a note, in the result and in the JSON', () => {
    const r = runForecast(studio, {
      horizon: 30,
      paths: 200,
      plan: plan({ schema: 'ebbline.plan/1', recurring: [{ match: 'gym membership', action: 'pause' }] }),
    });
    expect(r.notes.some((n) => n.includes('"pause gym membership" matches no recurring flow'))).toBe(true);
    const notes = (forecastToJson(r).model as { notes: string[] }).notes;
    expect(notes.some((n) => n.includes('gym membership'))).toBe(true);
  });

  it('gives byte-identical JSON for the same inputs and seed, and different paths for another seed', () => {
    const a = JSON.stringify(forecastToJson(runForecast(studio, { horizon: 30, paths: 300, seed: 4 })));
    const b = JSON.stringify(forecastToJson(runForecast(studio, { horizon: 30, paths: 300, seed: 4 })));
    const c = JSON.stringify(forecastToJson(runForecast(studio, { horizon: 30, paths: 300, seed: 5 })));
    expect(b).toBe(a);
    expect(c).not.toBe(a);
  });
});

describe('runForecast on edge-case histories', () => {
  it('refuses a history shorter than 28 days with NOT_ENOUGH_DATA', () => {
    const short = buildHistory({ days: 27, flows: [{ description: 'Card takings', flow: everyDay(1, 8_000, 3_000) }] });
    expect(errorCode(() => runForecast(short, { paths: 100 }))).toBe('NOT_ENOUGH_DATA');
    const enough = buildHistory({
      days: 28,
      flows: [{ description: 'Card takings', flow: everyDay(1, 8_000, 3_000) }],
    });
    expect(runForecast(enough, { paths: 100, horizon: 7 }).daily).toHaveLength(7);
  });

  it('refuses settings outside the documented bounds', () => {
    expect(errorCode(() => runForecast(studio, { horizon: 0 }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => runForecast(studio, { horizon: 731 }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => runForecast(studio, { paths: 99 }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => runForecast(studio, { paths: 100_001 }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => runForecast(studio, { seed: -1 }))).toBe('INVALID_ARGUMENT');
  });

  it('projects nothing for residual flows that are all zero and says so, with no NaN in the JSON', () => {
    // Only a salary and a rent: the recurring flows explain every entry.
    const onlyRecurring = buildHistory({
      days: 200,
      flows: [
        { description: 'Salary', counterparty: 'Employer BV', flow: monthly(25, 310_000) },
        { description: 'Rent', counterparty: 'Landlord Ltd', flow: monthly(1, -120_000) },
      ],
    });
    const r = runForecast(onlyRecurring, { horizon: 40, paths: 200 });
    expect(r.model.inflow.treatment).toBe('none');
    expect(r.model.outflow.treatment).toBe('none');
    expect(r.notes.some((n) => n.includes('No inflows remain besides the recurring flows'))).toBe(true);
    // Everything left is certain: every quantile is the same number.
    for (const d of r.daily) expect(new Set(d.quantiles).size).toBe(1);
    const json = forecastToJson(r);
    expect(countNumbers(json)).toBeGreaterThan(40 * 10); // ten numbers a day besides the date
    expect(nonFiniteNumbers(json)).toEqual([]);
  });

  it('handles a constant residual series (same outflow every day) with an exact fit, no NaN, and a flat decline', () => {
    const constant = buildHistory({
      days: 200,
      endBalance: 100_000,
      flows: [{ description: 'Parking meter', flow: () => -1_500 }],
    });
    const r = runForecast(constant, { horizon: 30, paths: 200 });
    expect(r.model.outflow.treatment).toBe('continuous');
    expect(r.model.inflow.treatment).toBe('none');
    const json = forecastToJson(r);
    expect(nonFiniteNumbers(json)).toEqual([]);
    // A constant series has nothing uncertain left: the balance falls by 15.00 a day on every path.
    r.daily.forEach((d, i) => {
      for (const q of d.quantiles) expect(q).toBeCloseTo(100_000 - 1_500 * (i + 1), 3);
    });
    // First crossing below 0 on day 67 lies beyond 30 days; with threshold 80,000 it is day 14.
    const t = runForecast(constant, { horizon: 30, paths: 200, threshold: 80_000 });
    expect(t.shortfall.probability).toBe(1);
    expect(t.shortfall.firstCrossing.p50).toBe(addDays(constant.asOf, 14));
    expect(nonFiniteNumbers(forecastToJson(t))).toEqual([]);
  });

  it('gives an intermittent series the intermittent treatment (weekday chances and sizes from history)', () => {
    const invoices = buildHistory({
      days: 260,
      seed: 3,
      flows: [
        { description: 'Card takings', flow: everyDay(1, 6_000, 2_000) },
        { description: 'Glaze supplier', flow: sometimes(-1, 0.06, 20_000, 90_000) },
      ],
    });
    const r = runForecast(invoices, { horizon: 30, paths: 200 });
    expect(r.model.outflow.treatment).toBe('intermittent');
    expect(r.model.outflow.method).toBe('Croston (SBA)');
    expect(r.model.outflow.backtest).not.toBeNull();
    expect(r.model.inflow.treatment).toBe('continuous');
  });

  it('does not project a recurring flow that ended, and keeps its past entries out of the residual series', () => {
    const h = buildHistory({
      days: 200,
      flows: [
        { description: 'Card takings', flow: everyDay(1, 8_000, 3_000) },
        { description: 'Kiln software', counterparty: 'Glazeware', flow: monthly(12, -2_900, '2025-04-30') },
        { description: 'Studio rent', counterparty: 'Landlord Ltd', flow: monthly(1, -90_000) },
      ],
    });
    const r = runForecast(h, { horizon: 60, paths: 200 });
    expect(r.recurring.map((f) => f.label)).toEqual(['Landlord Ltd']);
    const ended = r.recurringSkipped.find((s) => s.label === 'Glazeware');
    expect(ended?.reason).toMatch(/^ended: last seen 2025-04-12/);
    const flow = r.detected.find((f) => f.label === 'Glazeware');
    const residual = residualSeries(h, explainedEntryIds(r.detected, []));
    let glazewareLeft = 0;
    for (const id of flow?.memberIds ?? []) {
      const e = h.entries.find((x) => x.id === id)!;
      const day = Math.round((Date.parse(e.date) - Date.parse(h.start)) / 86_400_000);
      glazewareLeft += residual.outflow[day]!;
    }
    expect(flow?.memberIds.length).toBeGreaterThanOrEqual(3);
    expect(glazewareLeft).toBe(0);
  });

  it('keeps unconfirmed low-confidence suggestions in the residual series instead of dropping their money', () => {
    const h = buildHistory({ days: 150, flows: [{ description: 'Card takings', flow: everyDay(1, 8_000, 3_000) }] });
    const detected = detectRecurringFlows(h.entries, { asOf: h.asOf });
    // A made-up weak suggestion over two real entries: not projected, so not explained either.
    const weak = {
      ...(detected[0] ?? {}),
      key: 'in:weak:monthDay',
      state: 'suggested',
      confidence: 0.55,
      memberIds: [h.entries[0]!.id, h.entries[1]!.id],
    } as (typeof detected)[number];
    expect(explainedEntryIds([weak], []).size).toBe(0);
    expect(explainedEntryIds([weak], [{ key: weak.key, state: 'confirmed' }]).size).toBe(2);
    expect(explainedEntryIds([{ ...weak, state: 'ended' }], []).size).toBe(2);
    expect(explainedEntryIds([{ ...weak, confidence: 0.9 }], [{ key: weak.key, state: 'dismissed' }]).size).toBe(0);
  });
});

describe('forecastToJson', () => {
  const r = runForecast(studio, { horizon: 21, paths: 300, seed: 2, threshold: 400_000 });
  const json = JSON.parse(JSON.stringify(forecastToJson(r)));

  it('has exactly the keys of DESIGN.md section 5, in order', () => {
    // Source: /work/shared/DESIGN.md section 5, "JSON output of forecast".
    expect(Object.keys(json)).toEqual([
      'schema',
      'asOf',
      'currency',
      'horizonDays',
      'paths',
      'seed',
      'threshold',
      'startBalance',
      'daily',
      'shortfall',
      'recurring',
      'model',
      'caution',
    ]);
    expect(json.schema).toBe('ebbline.forecast/1');
    expect(json.daily).toHaveLength(21);
    for (const row of json.daily) {
      expect(Object.keys(row)).toEqual([
        'date',
        'mean',
        'p05',
        'p10',
        'p25',
        'p50',
        'p75',
        'p90',
        'p95',
        'pBelow',
        'pCrossed',
      ]);
    }
    expect(Object.keys(json.shortfall)).toEqual(['probability', 'firstCrossing', 'drivers']);
    expect(Object.keys(json.shortfall.firstCrossing)).toEqual(['p10', 'p50', 'p90']);
    for (const d of json.shortfall.drivers) expect(Object.keys(d)).toEqual(['label', 'amount']);
    expect(json.recurring.length).toBeGreaterThan(0);
    for (const f of json.recurring)
      expect(Object.keys(f)).toEqual(['label', 'cadence', 'amount', 'next', 'confidence']);
    expect(Object.keys(json.model)).toEqual(expect.arrayContaining(['inflow', 'outflow', 'backtest']));
    expect(json.caution).toBe(r.caution);
  });

  it('writes amounts in major units rounded to cents and probabilities consistent with the result', () => {
    expect(json.startBalance).toBe(5000);
    expect(json.threshold).toBe(4000);
    expect(json.recurring[0].amount).toBe(-900);
    json.daily.forEach((row: Record<string, number>, i: number) => {
      for (const k of ['mean', 'p05', 'p50', 'p95']) expect(Math.round(row[k]! * 100)).toBeCloseTo(row[k]! * 100, 6);
      expect(row.pCrossed).toBeCloseTo(r.daily[i]!.pCrossed, 6);
      if (i > 0) expect(row.pCrossed).toBeGreaterThanOrEqual(json.daily[i - 1].pCrossed);
      expect(row.p05).toBeLessThanOrEqual(row.p50!);
      expect(row.p50).toBeLessThanOrEqual(row.p95!);
    });
    expect(json.shortfall.probability).toBe(json.daily[20].pCrossed);
    expect(nonFiniteNumbers(json)).toEqual([]);
  });
});
