/**
 * The balance fan chart: the simulated balance's P5–P95 and P25–P75 bands (one hue, two
 * opacities), the median, the last weeks of the actual balance, the threshold and the
 * as-of marker. Amounts are plotted in minor units, exactly as the engine gives them, and
 * only the tick and tooltip text is written in major units.
 *
 * Dataset order matters to the filler: each band is two datasets, the upper edge first
 * (not filled) and the lower edge right after it, filled up to the upper edge by its
 * absolute index, so the fill covers exactly the band. The narrow band is drawn after the
 * wide one, so it lies on top and reads darker.
 */
import type { ChartConfiguration, ChartDataset, TooltipItem } from 'chart.js';
import type { DailyOutlook } from '../../../../engine/forecast/runForecast';
import { timeAxis, moneyAxis, tooltipLook, Y_AXIS_WIDTH } from './axes';
import { dayTime, formatDay, formatDayTime } from './calendar';
import { moneyText } from './moneyText';
import type { ChartPalette } from './palette';
import './pluginOptions';

/** Index of each quantile in `DailyOutlook.quantiles` (QUANTILE_LEVELS). */
export const Q = { p5: 0, p10: 1, p25: 2, p50: 3, p75: 4, p90: 5, p95: 6 } as const;

/** Opacity of the wide (P5–P95) and narrow (P25–P75) bands: one hue, told apart by opacity. */
export const BAND_OPACITY = { wide: 0.16, narrow: 0.3 } as const;

export interface BalancePoint {
  readonly date: string;
  /** End-of-day balance, minor units. */
  readonly balance: number;
}

export interface FanChartInput {
  readonly asOf: string;
  readonly currency: string;
  /** Balance at the end of the as-of day (minor units): where every band starts. */
  readonly startBalance: number;
  readonly threshold: number;
  readonly daily: readonly DailyOutlook[];
  /** Actual end-of-day balances before and on the as-of date, oldest first. */
  readonly recent: readonly BalancePoint[];
  readonly palette: ChartPalette;
  /** A value that changes with every new forecast, for the rendered signal. */
  readonly stamp?: string | null;
  readonly onRendered?: ((stamp: string) => void) | null;
}

export type FanPoint = { x: number; y: number };
export type FanDataset = ChartDataset<'line', FanPoint[]> & { id: FanDatasetId };
export type FanDatasetId = 'p95' | 'p5' | 'p75' | 'p25' | 'median' | 'actual' | 'threshold';

/** Dataset ids in drawing order (see the module comment). */
export const FAN_ORDER: readonly FanDatasetId[] = ['p95', 'p5', 'p75', 'p25', 'median', 'actual', 'threshold'];

const LABELS: Record<FanDatasetId, string> = {
  p95: 'P95 (high end)',
  p5: 'P5 (low end)',
  p75: 'P75',
  p25: 'P25',
  median: 'Median (P50)',
  actual: 'Actual balance',
  threshold: 'Threshold',
};

function quantileSeries(input: FanChartInput, q: number): FanPoint[] {
  const points: FanPoint[] = [{ x: dayTime(input.asOf), y: input.startBalance }];
  for (const d of input.daily) points.push({ x: dayTime(d.date), y: d.quantiles[q] as number });
  return points;
}

/** The x range: from the first actual balance shown (or the as-of date) to the last forecast day. */
export function fanRange(input: Pick<FanChartInput, 'asOf' | 'daily' | 'recent'>): { min: number; max: number } {
  const first = input.recent[0]?.date ?? input.asOf;
  const last = input.daily[input.daily.length - 1]?.date ?? input.asOf;
  return { min: dayTime(first), max: dayTime(last) };
}

/** How far outside the fan the threshold may lie and still be drawn, in spans of the fan's own range. */
export const THRESHOLD_REACH = 0.6;

export interface FanYRange {
  /** Explicit axis limits when the threshold lies far outside the fan; null lets the axis fit every dataset. */
  readonly min: number | null;
  readonly max: number | null;
  /** Where the threshold is relative to what the chart shows. */
  readonly threshold: 'inside' | 'below' | 'above';
}

/**
 * The y range of the fan chart. A threshold close to the fan is drawn and the axis
 * stretches to it; one far away (e.g. 0 under a balance of 30,000) would squeeze the fan
 * into a thin strip, so the axis then fits the fan and the actual balance alone and the
 * legend says that the threshold is below (or above) the chart.
 */
export function fanYRange(input: Pick<FanChartInput, 'daily' | 'recent' | 'startBalance' | 'threshold'>): FanYRange {
  let lo = input.startBalance;
  let hi = input.startBalance;
  for (const d of input.daily) {
    lo = Math.min(lo, d.quantiles[Q.p5] as number);
    hi = Math.max(hi, d.quantiles[Q.p95] as number);
  }
  for (const p of input.recent) {
    lo = Math.min(lo, p.balance);
    hi = Math.max(hi, p.balance);
  }
  const span = Math.max(hi - lo, Math.abs(hi) * 0.05, 1);
  const t = input.threshold;
  if (t >= lo - THRESHOLD_REACH * span && t <= hi + THRESHOLD_REACH * span) {
    return { min: null, max: null, threshold: 'inside' };
  }
  // Limits on round numbers, so the axis ends on a labelled tick (24,941 reads as a glitch).
  const step = niceStep(span / 5);
  return {
    min: Math.floor((lo - 0.02 * span) / step) * step,
    max: Math.ceil((hi + 0.02 * span) / step) * step,
    threshold: t < lo ? 'below' : 'above',
  };
}

/**
 * The round step (1, 2, 2.5 or 5 times a power of ten) nearest above `rough`.
 * @example niceStep(1234) // 2000
 */
export function niceStep(rough: number): number {
  if (!(rough > 0) || !Number.isFinite(rough)) return 1;
  const power = 10 ** Math.floor(Math.log10(rough));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * power >= rough) return m * power;
  return 10 * power;
}

/** The datasets of the fan chart, in FAN_ORDER. */
export function fanDatasets(input: FanChartInput): FanDataset[] {
  const { palette } = input;
  const { min, max } = fanRange(input);
  const index = (id: FanDatasetId) => FAN_ORDER.indexOf(id);
  const edge = (id: FanDatasetId, q: number, fill: FanDatasetId | false, alpha: number): FanDataset => ({
    id,
    label: LABELS[id],
    data: quantileSeries(input, q),
    borderWidth: 0,
    borderColor: palette.band(alpha),
    backgroundColor: palette.band(alpha),
    pointRadius: 0,
    pointHoverRadius: 0,
    fill: fill === false ? false : index(fill),
    tension: 0,
  });
  return [
    edge('p95', Q.p95, false, BAND_OPACITY.wide),
    edge('p5', Q.p5, 'p95', BAND_OPACITY.wide),
    edge('p75', Q.p75, false, BAND_OPACITY.narrow),
    edge('p25', Q.p25, 'p75', BAND_OPACITY.narrow),
    {
      id: 'median',
      label: LABELS.median,
      data: quantileSeries(input, Q.p50),
      borderColor: palette.median(),
      backgroundColor: palette.median(),
      borderWidth: 2,
      pointRadius: 0,
      pointHoverRadius: 3,
      fill: false,
      tension: 0,
    },
    {
      id: 'actual',
      label: LABELS.actual,
      data: input.recent.map((p) => ({ x: dayTime(p.date), y: p.balance })),
      borderColor: palette.text(),
      backgroundColor: palette.text(),
      borderWidth: 2,
      pointRadius: 0,
      pointHoverRadius: 3,
      fill: false,
      tension: 0,
    },
    {
      id: 'threshold',
      label: LABELS.threshold,
      data: [
        { x: min, y: input.threshold },
        { x: max, y: input.threshold },
      ],
      borderColor: palette.threshold(),
      backgroundColor: palette.threshold(),
      borderWidth: 2,
      borderDash: [7, 5],
      pointRadius: 0,
      pointHoverRadius: 0,
      fill: false,
    },
  ];
}

/** Chart.js configuration of the fan chart. */
export function fanChartConfig(input: FanChartInput): ChartConfiguration<'line', FanPoint[]> {
  const { palette, currency } = input;
  const { min, max } = fanRange(input);
  const y = fanYRange(input);
  return {
    type: 'line',
    data: { datasets: fanDatasets(input) },
    options: {
      animation: false,
      parsing: false,
      normalized: true,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: timeAxis(palette, min, max),
        y: {
          ...moneyAxis(palette, currency, currency),
          ...(y.min === null ? {} : { min: y.min }),
          ...(y.max === null ? {} : { max: y.max }),
          // Room above and below, so a threshold at the fan's edge is not drawn on the axis line.
          grace: '4%',
          afterFit: (scale) => {
            scale.width = Y_AXIS_WIDTH;
          },
        },
      },
      plugins: {
        tooltip: {
          ...tooltipLook(palette),
          itemSort: (a: TooltipItem<'line'>, b: TooltipItem<'line'>) => (b.parsed.y ?? 0) - (a.parsed.y ?? 0),
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => (items[0] ? formatDayTime(items[0].parsed.x ?? 0) : ''),
            label: (item: TooltipItem<'line'>) => `${item.dataset.label}: ${moneyText(item.parsed.y ?? 0, currency)}`,
          },
        },
        asOfMarker: {
          x: dayTime(input.asOf),
          label: `As of ${formatDay(input.asOf, 'd MMM')}`,
          color: palette.muted(),
        },
        renderedSignal: { stamp: input.stamp ?? null, onRendered: input.onRendered ?? null },
      },
    },
  };
}

/**
 * What the fan chart shows, in one sentence for screen readers (the canvas's aria-label).
 * @example 'Balance outlook for 90 days after 31 Oct 2026, in EUR. Median on 29 Jan 2027: EUR 28,900.00; 9 in 10 simulated paths end between EUR 12,000.00 and EUR 41,000.00. Threshold EUR 0.00.'
 */
export function fanChartSummary(
  input: Pick<FanChartInput, 'asOf' | 'currency' | 'daily' | 'threshold' | 'recent' | 'startBalance'>,
): string {
  const last = input.daily[input.daily.length - 1];
  if (!last) return 'No outlook yet.';
  const m = (v: number) => moneyText(v, input.currency);
  const where = fanYRange(input).threshold;
  return (
    `Balance outlook for ${input.daily.length} days after ${formatDay(input.asOf)}, in ${input.currency}. ` +
    `Median on ${formatDay(last.date)}: ${m(last.quantiles[Q.p50] as number)}; ` +
    `9 in 10 simulated paths end between ${m(last.quantiles[Q.p5] as number)} and ${m(last.quantiles[Q.p95] as number)}. ` +
    `Threshold ${m(input.threshold)}${where === 'inside' ? '' : `, ${where} the chart`}.`
  );
}
