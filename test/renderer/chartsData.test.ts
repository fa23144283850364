import { afterEach, describe, expect, it } from 'vitest';
import type { DailyOutlook } from '../../engine/forecast/runForecast';
import { addDays } from '../../engine/core/dates';
import { dayTime, formatDay, localDate } from '../../renderer/src/lib/charts/calendar';
import { correlogramDatasets, correlogramSummary } from '../../renderer/src/lib/charts/correlogramConfig';
import {
  BAND_OPACITY,
  FAN_ORDER,
  fanChartConfig,
  fanDatasets,
  fanRange,
  fanYRange,
  niceStep,
  type FanChartInput,
} from '../../renderer/src/lib/charts/fanChartConfig';
import { moneyText } from '../../renderer/src/lib/charts/moneyText';
import type { ChartPalette } from '../../renderer/src/lib/charts/palette';
import { percentText } from '../../renderer/src/lib/charts/percentText';
import { probabilityAxisMax, probabilityDatasets } from '../../renderer/src/lib/charts/probabilityChartConfig';

/** Fixed colours: the builders must take every colour from the palette they are given. */
const palette: ChartPalette = {
  band: (alpha) => `band/${alpha}`,
  median: () => 'median',
  threshold: () => 'threshold',
  inflow: () => 'inflow',
  outflow: () => 'outflow',
  text: () => 'text',
  muted: () => 'muted',
  grid: () => 'grid',
  surface: () => 'surface',
};

/** Invented outlooks: the balance's quantiles around 30,000.00, widening by day. */
function daily(days: number, start = '2026-10-31'): DailyOutlook[] {
  const spread = [-2, -1.3, -0.7, 0, 0.7, 1.3, 2];
  return Array.from({ length: days }, (_, d) => ({
    date: addDays(start, d + 1),
    mean: 3_000_000,
    quantiles: spread.map((z) => 3_000_000 + z * 10_000 * (d + 1)),
    pBelow: 0,
    pCrossed: 0,
  }));
}

function input(overrides: Partial<FanChartInput> = {}): FanChartInput {
  return {
    asOf: '2026-10-31',
    currency: 'EUR',
    startBalance: 3_000_000,
    threshold: 2_500_000,
    daily: daily(30),
    recent: [
      { date: '2026-10-30', balance: 2_950_000 },
      { date: '2026-10-31', balance: 3_000_000 },
    ],
    palette,
    ...overrides,
  };
}

describe('fan chart datasets', () => {
  it('come in filler order: each band upper edge first, its lower edge filled up to it by absolute index', () => {
    const sets = fanDatasets(input());
    expect(sets.map((s) => s.id)).toEqual([...FAN_ORDER]);
    expect(FAN_ORDER).toEqual(['p95', 'p5', 'p75', 'p25', 'median', 'actual', 'threshold']);
    const byId = Object.fromEntries(sets.map((s, i) => [s.id, { ...s, index: i }]));
    expect(byId.p95?.fill).toBe(false);
    expect(byId.p5?.fill).toBe(byId.p95?.index);
    expect(byId.p75?.fill).toBe(false);
    expect(byId.p25?.fill).toBe(byId.p75?.index);
    for (const id of ['median', 'actual', 'threshold'] as const) expect(byId[id]?.fill).toBe(false);
    // The narrow band comes after the wide one, so it is drawn on top.
    expect(byId.p25!.index).toBeGreaterThan(byId.p5!.index);
  });

  it('tells the bands apart by opacity of one hue', () => {
    const sets = fanDatasets(input());
    const colour = (id: string) => sets.find((s) => s.id === id)?.backgroundColor;
    expect(colour('p5')).toBe(`band/${BAND_OPACITY.wide}`);
    expect(colour('p25')).toBe(`band/${BAND_OPACITY.narrow}`);
    expect(BAND_OPACITY.narrow).toBeGreaterThan(BAND_OPACITY.wide);
  });

  it('start every quantile line at the as-of balance and place days at local midnight', () => {
    const sets = fanDatasets(input());
    for (const id of ['p95', 'p5', 'p75', 'p25', 'median']) {
      const data = sets.find((s) => s.id === id)!.data;
      expect(data[0]).toEqual({ x: dayTime('2026-10-31'), y: 3_000_000 });
      expect(data).toHaveLength(31);
      expect(data[1]?.x).toBe(localDate('2026-11-01').getTime());
    }
    const p5 = sets.find((s) => s.id === 'p5')!.data;
    const p95 = sets.find((s) => s.id === 'p95')!.data;
    expect(p5[30]!.y).toBeLessThan(p95[30]!.y);
  });

  it('draw the threshold as a dashed vermillion line across the whole x range', () => {
    const threshold = fanDatasets(input()).find((s) => s.id === 'threshold')!;
    const { min, max } = fanRange(input());
    expect(threshold.data).toEqual([
      { x: min, y: 2_500_000 },
      { x: max, y: 2_500_000 },
    ]);
    expect(min).toBe(dayTime('2026-10-30'));
    expect(max).toBe(dayTime('2026-11-30'));
    expect(threshold.borderColor).toBe('threshold');
    expect(threshold.borderDash?.length).toBeGreaterThan(0);
  });

  it('keep a far-away threshold off the axis range, which then ends on round numbers', () => {
    expect(fanYRange(input()).threshold).toBe('inside');
    const far = fanYRange(input({ threshold: 0 }));
    expect(far.threshold).toBe('below');
    expect(far.min).not.toBeNull();
    const step = niceStep((3_600_000 - 2_400_000) / 5);
    expect(far.min! % step).toBe(0);
    expect(far.max! % step).toBe(0);
    expect(far.min!).toBeLessThanOrEqual(2_400_000);
    expect(far.max!).toBeGreaterThanOrEqual(3_600_000);
    expect(fanYRange(input({ threshold: 10_000_000 })).threshold).toBe('above');
    const config = fanChartConfig(input({ threshold: 0 }));
    expect(config.options?.scales?.y?.min).toBe(far.min);
    expect(config.options?.animation).toBe(false);
  });

  it('niceStep rounds up to 1, 2, 2.5 or 5 times a power of ten', () => {
    expect(niceStep(1234)).toBe(2000);
    expect(niceStep(2100)).toBe(2500);
    expect(niceStep(0.3)).toBe(0.5);
    expect(niceStep(10)).toBe(10);
    expect(niceStep(0)).toBe(1);
  });
});

describe('shortfall chart datasets', () => {
  it('plot pCrossed solid and pBelow dashed in percent, from 0 on the as-of date', () => {
    const d = daily(3).map((x, i) => ({ ...x, pCrossed: [0.01, 0.02, 0.05][i]!, pBelow: [0.01, 0.005, 0.03][i]! }));
    const [crossed, below] = probabilityDatasets({
      asOf: '2026-10-31',
      currency: 'EUR',
      threshold: 0,
      daily: d,
      palette,
    });
    expect(crossed!.data.map((p) => p.y)).toEqual([0, 1, 2, 5]);
    expect(below!.data.map((p) => p.y)).toEqual([0, 1, 0.5, 3]);
    expect(crossed!.borderDash).toBeUndefined();
    expect(below!.borderDash?.length).toBeGreaterThan(0);
  });

  it('scale the axis to the chances shown, at least to 10%', () => {
    expect(probabilityAxisMax(daily(3))).toBe(10);
    expect(probabilityAxisMax(daily(3).map((x) => ({ ...x, pCrossed: 0.32 })))).toBe(40);
    expect(probabilityAxisMax(daily(3).map((x) => ({ ...x, pCrossed: 1 })))).toBe(100);
  });
});

describe('correlogram datasets', () => {
  const values = Float64Array.from([0.3, -0.02, 0.07, -0.08]);

  it('draw bars, the ±1.96/√n band as dashed lines and, for the ACF only, Bartlett bands dotted', () => {
    const acf = correlogramDatasets({
      values,
      whiteNoiseBand: 0.0592,
      bartlettBands: Float64Array.from([0.0592, 0.0643, 0.0644, 0.0647]),
      kind: 'acf',
      palette,
    });
    expect(acf.map((d) => d.type)).toEqual(['bar', 'line', 'line', 'line', 'line']);
    expect(acf[1]!.data).toEqual([0.0592, 0.0592, 0.0592, 0.0592]);
    expect(acf[2]!.data).toEqual([-0.0592, -0.0592, -0.0592, -0.0592]);
    expect(acf[3]!.data).toEqual([0.0592, 0.0643, 0.0644, 0.0647]);
    expect((acf[1] as { borderDash: number[] }).borderDash).not.toEqual(
      (acf[3] as { borderDash: number[] }).borderDash,
    );
    // Bars outside the white-noise band at full strength, the others lighter.
    expect(acf[0]!.backgroundColor).toEqual(['band/0.95', 'band/0.4', 'band/0.95', 'band/0.95']);
    const pacf = correlogramDatasets({ values, whiteNoiseBand: 0.0592, kind: 'pacf', palette });
    expect(pacf).toHaveLength(3);
  });

  it('summarise which lags leave the band', () => {
    expect(correlogramSummary({ values, whiteNoiseBand: 0.0592, kind: 'acf' })).toBe(
      'Autocorrelation for lags 1 to 4: lags 1, 3, 4 outside the white-noise band of ±0.059.',
    );
    expect(correlogramSummary({ values: [0.01], whiteNoiseBand: 0.1, kind: 'pacf' })).toContain('no lag outside');
  });
});

describe('calendar dates on the axis and in words', () => {
  const original = process.env.TZ;
  afterEach(() => {
    process.env.TZ = original;
  });

  it('never shift a day, in time zones on either side of Greenwich and across DST changes', () => {
    for (const tz of ['America/Los_Angeles', 'Pacific/Kiritimati', 'Europe/Berlin', 'UTC']) {
      process.env.TZ = tz;
      expect(formatDay('2026-03-29')).toBe('29 Mar 2026'); // DST starts in Europe
      expect(formatDay('2026-11-01', 'd MMM')).toBe('1 Nov'); // DST ends in the US
      expect(localDate('2024-02-29').getDate()).toBe(29);
      expect(localDate('2026-01-01').getHours()).toBe(0);
      // Consecutive calendar days are consecutive local midnights (23 or 25 hours apart on DST days).
      const gap = (dayTime('2026-03-30') - dayTime('2026-03-29')) / 3_600_000;
      expect([23, 24, 25]).toContain(gap);
    }
  });

  it('refuse text that is not YYYY-MM-DD', () => {
    expect(() => localDate('29/03/2026')).toThrow(RangeError);
  });
});

describe('money and percent text', () => {
  it('write minor units with the currency exponent, exactly', () => {
    expect(moneyText(-123456, 'EUR')).toBe('-1,234.56 EUR');
    expect(moneyText(1234, 'JPY', { code: false })).toBe('1,234');
    expect(moneyText(1234, 'KWD', { code: false })).toBe('1.234');
    expect(moneyText(10000000.5, 'EUR', { code: false })).toBe('100,000.01');
    expect(moneyText(1234567, 'EUR', { code: false, whole: true })).toBe('12,346');
    expect(moneyText(-0.4, 'EUR', { code: false })).toBe('0.00');
    expect(moneyText(500, 'EUR', { code: false, signed: true })).toBe('+5.00');
  });

  it('write chances calmly: one decimal under 10%, never a bare 0.0% for a tiny chance', () => {
    expect(percentText(0.0423)).toBe('4.2%');
    expect(percentText(0.456)).toBe('46%');
    expect(percentText(0.0004)).toBe('< 0.1%');
    expect(percentText(0)).toBe('0%');
    expect(percentText(0.9996)).toBe('> 99.9%');
    expect(percentText(0.09951)).toBe('10%');
  });
});
