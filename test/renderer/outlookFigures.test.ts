import { describe, expect, it } from 'vitest';
import type { DailyOutlook, ForecastResult } from '../../engine/forecast/runForecast';
import type { ForecastHistory } from '../../engine/forecast/history';
import { addDays } from '../../engine/core/dates';
import {
  driverText,
  firstCrossingRange,
  firstCrossingSentence,
  modelSummary,
  notableDrivers,
  recentBalances,
  shortfallHeadline,
  weeklyRows,
} from '../../renderer/src/components/outlook/outlookFigures';

/** Intl writes a no-break space between the currency code and the amount. */
const plain = (text: string | null) => text?.replace(/\u00a0/g, ' ') ?? null;

/** Invented daily outlooks: quantile k on day d is 1000·k + d, pCrossed from `crossed(d)`. */
function outlooks(days: number, crossed: (d: number) => number = () => 0, start = '2026-10-31'): DailyOutlook[] {
  return Object.freeze(
    Array.from({ length: days }, (_, d) =>
      Object.freeze({
        date: addDays(start, d + 1),
        mean: 0,
        quantiles: Object.freeze([0, 1, 2, 3, 4, 5, 6].map((k) => 1000 * k + d)),
        pBelow: crossed(d) / 2,
        pCrossed: crossed(d),
      }),
    ),
  ) as DailyOutlook[];
}

describe('weeklyRows', () => {
  it('takes the 7th, 14th, … day and the last day of a horizon that is not whole weeks', () => {
    const rows = weeklyRows(outlooks(90));
    expect(rows).toHaveLength(13);
    expect(rows.map((r) => r.date).slice(0, 2)).toEqual(['2026-11-07', '2026-11-14']);
    expect(rows[11]?.date).toBe(addDays('2026-10-31', 84));
    expect(rows[12]?.date).toBe(addDays('2026-10-31', 90));
  });

  it('reads the chart’s P5, P25, P50, P75 and P95 of that very day (quantile indices 0, 2, 3, 4, 6) and both chances', () => {
    const row = weeklyRows(outlooks(14, (d) => d / 100))[1];
    expect(row).toEqual({
      date: '2026-11-14',
      p5: 13,
      p25: 2013,
      p50: 3013,
      p75: 4013,
      p95: 6013,
      pBelow: 0.065,
      pCrossed: 0.13,
    });
  });

  it('has no extra row for whole weeks and none at all for an empty outlook', () => {
    expect(weeklyRows(outlooks(28)).map((r) => r.date)).toEqual([
      '2026-11-07',
      '2026-11-14',
      '2026-11-21',
      '2026-11-28',
    ]);
    expect(weeklyRows(outlooks(3)).map((r) => r.date)).toEqual(['2026-11-03']);
    expect(weeklyRows([])).toEqual([]);
  });
});

describe('firstCrossingRange and its sentence', () => {
  // pCrossed rises by 0.002 a day from day 10 to day 59: 10% of all paths cross in total.
  const ramp = (d: number) => (d < 10 ? 0 : Math.min(0.1, 0.002 * (d - 9)));

  it('gives the 10/50/90% dates among the paths that do go below, not among all paths', () => {
    const range = firstCrossingRange(outlooks(90, ramp), 5000);
    // Share of crossing paths by day d: 0.002·(d − 9) / 0.1, so 10% on day 14, 50% on day 34, 90% on day 54.
    expect(range).toEqual({
      from: addDays('2026-10-31', 15),
      median: addDays('2026-10-31', 35),
      to: addDays('2026-10-31', 55),
    });
  });

  it('says nothing when the chance is under 1% or too few paths cross', () => {
    expect(
      firstCrossingRange(
        outlooks(90, (d) => ramp(d) / 20),
        5000,
      ),
    ).toBeNull(); // 0.5%
    expect(firstCrossingRange(outlooks(90, ramp), 200)).toBeNull(); // 20 paths
    expect(firstCrossingRange(outlooks(90), 5000)).toBeNull();
    expect(firstCrossingRange([], 5000)).toBeNull();
    expect(firstCrossingSentence(null, '2026-10-31')).toBeNull();
  });

  it('words the range with the year only where it is needed', () => {
    expect(firstCrossingSentence({ from: '2026-11-15', median: '2026-12-05', to: '2026-12-25' }, '2026-10-31')).toBe(
      'If it happens, most likely between 15 Nov and 25 Dec.',
    );
    expect(firstCrossingSentence({ from: '2026-12-12', median: '2027-01-02', to: '2027-03-03' }, '2026-10-31')).toBe(
      'If it happens, most likely between 12 Dec 2026 and 3 Mar 2027.',
    );
    expect(firstCrossingSentence({ from: '2027-01-12', median: '2027-01-12', to: '2027-01-12' }, '2026-10-31')).toBe(
      'If it happens, most likely on 12 Jan 2027.',
    );
  });
});

describe('shortfallHeadline', () => {
  it('states a bound by the rule of three, not 0%, when no path goes below', () => {
    const h = shortfallHeadline(0, 0, 5000, 90, 0, 'EUR');
    expect(h.figure).toBe('< 0.1%');
    expect(h.error).toBeNull();
    expect(plain(h.caption)).toBe('None of the 5,000 simulated paths went below 0.00 EUR within the next 90 days.');
    expect(shortfallHeadline(0, 0, 1000, 30, 0, 'EUR').figure).toBe('< 0.3%');
  });

  it('gives the estimate with its Monte Carlo standard error in percentage points', () => {
    // Source: Koehler, Brown and Haneuse (2009): p = 0.05, N = 10,000 → SE 0.00218.
    const se = Math.sqrt((0.05 * 0.95) / 10000);
    const h = shortfallHeadline(0.05, se, 10000, 90, 2500000, 'EUR');
    expect(h.figure).toBe('5.0%');
    expect(h.error).toBe('± 0.2 percentage points');
    expect(plain(h.caption)).toContain('Estimated chance that the balance goes below 25,000.00 EUR at least once');
    expect(shortfallHeadline(0.456, 0.007, 5000, 90, 0, 'JPY').figure).toBe('46%');
  });
});

describe('recentBalances', () => {
  const history: ForecastHistory = Object.freeze({
    currency: 'EUR',
    start: '2026-01-01',
    asOf: '2026-01-10',
    endBalance: 10000,
    relative: false,
    entries: Object.freeze([
      { id: 'a', date: '2026-01-02', amount: 500, description: 'x' },
      { id: 'b', date: '2026-01-08', amount: -300, description: 'y' },
      { id: 'c', date: '2026-01-08', amount: -200, description: 'z' },
      { id: 'd', date: '2026-01-10', amount: 1000, description: 'w' },
    ]),
  }) as ForecastHistory;

  it('rebuilds end-of-day balances backwards from the as-of balance', () => {
    expect(recentBalances(history, 4)).toEqual([
      { date: '2026-01-07', balance: 9500 },
      { date: '2026-01-08', balance: 9000 },
      { date: '2026-01-09', balance: 9000 },
      { date: '2026-01-10', balance: 10000 },
    ]);
  });

  it('stops at the first day of the history', () => {
    const all = recentBalances(history, 60);
    expect(all).toHaveLength(10);
    expect(all[0]).toEqual({ date: '2026-01-01', balance: 9000 });
    expect(recentBalances(history, 0)).toEqual([]);
  });
});

describe('modelSummary and driverText', () => {
  const report = (direction: 'inflow' | 'outflow', method: string, model: string) => ({
    direction,
    method,
    model,
    treatment: 'continuous' as const,
    trainingDays: 1096,
    meanPerDay: 0,
    backtest: {
      horizon: 28,
      step: 28,
      period: 7,
      origins: [984, 1012, 1040, 1068],
      candidates: [
        {
          name: method,
          model,
          originsScored: 4,
          failures: [],
          mase: 0.5409,
          pinball: { p10: 1, p50: 2, p90: 3, mean: 13543.5 },
          coverage80: 0.9464,
          coverage90: 0.9643,
          winkler80: null,
          winkler90: null,
          maseByOrigin: [],
        },
      ],
      winner: method,
      ranking: [method],
      notes: [],
    },
    residualCheck: 'The day-to-day leftovers look like random noise.',
    residualsLookRandom: true,
    components: { weekly: true, monthly: true, yearly: false },
    notes: [],
  });

  it('names the method per direction with its backtest scores, in one paragraph', () => {
    const result = {
      currency: 'EUR',
      paths: 5000,
      seed: 1,
      recurring: [{}, {}],
      model: {
        inflow: report('inflow', 'Decomposition + ETS', 'ETS(A,N,N) on the seasonally adjusted series'),
        outflow: report('outflow', 'Croston (SBA)', 'Croston SBA (α = 0.10)'),
      },
    } as unknown as ForecastResult;
    const text = plain(modelSummary(result)) as string;
    expect(text).toContain('2 recurring flows are projected on their own schedules');
    expect(text).toContain(
      'Other money in is projected with Decomposition + ETS (ETS(A,N,N) on the seasonally adjusted series), chosen from 1 method by a backtest',
    );
    expect(text).toContain('MASE 0.54, pinball loss 135.44 EUR a day, 95% of actual days inside the 80% range');
    expect(text).toContain('Other money out is projected with Croston SBA (α = 0.10)');
    expect(text).not.toContain('Croston (SBA) (');
    expect(text).toContain('The day-to-day leftovers look like random noise.');
    expect(text).not.toMatch(/\n/);
  });

  it('names only drivers of at least a twentieth of the largest one', () => {
    const drivers = [
      { key: 'a', amount: -425300 },
      { key: 'b', amount: -95262 },
      { key: 'c', amount: -601 },
      { key: 'd', amount: -10 },
    ];
    expect(notableDrivers(drivers)).toEqual({ shown: drivers.slice(0, 2), hidden: 2 });
    expect(notableDrivers([])).toEqual({ shown: [], hidden: 0 });
  });

  it('words a driver as the difference on the paths that go below', () => {
    expect(plain(driverText(-80000, 'EUR'))).toBe('800.00 EUR less on the paths that go below');
    expect(plain(driverText(1234, 'JPY'))).toBe('1,234 JPY more on the paths that go below');
  });
});
